/**
 * F4: the survey format caps what one member could use to stall the server, each with a message
 * that names the field and the limit, and real ships still fit.
 */
import { describe, expect, it } from 'vitest';
import { SurveySchema, isValidEdit, type Survey } from '@shared/schemas/survey';
import { SURVEY_LIMITS, TEXT_LIMITS } from '@shared/schemas/limits';
import { formatZodIssues } from '@shared/api/format-issues';
import { generateVessel } from '../../scripts/bench-engine';
import { demoSurvey } from '../../seeds/demo-survey';

const issuesOf = (doc: unknown) => {
  const r = SurveySchema.safeParse(doc);
  return r.success ? [] : formatZodIssues(r.error);
};

const ring = (n: number) =>
  Array.from({ length: n }, (_, k) => ({ x: 50 + 5 * Math.cos((2 * Math.PI * k) / n), y: 0, z: 6 + 5 * Math.sin((2 * Math.PI * k) / n) }));

describe('survey caps', () => {
  it('a 4,000-boundary vessel (the engine bench) and the demo casualty fit', () => {
    const vessel = generateVessel();
    expect(vessel.boundaries.length).toBe(4000);
    expect(issuesOf(vessel)).toEqual([]);
    expect(issuesOf(demoSurvey())).toEqual([]);
  });

  it('refuses the 90,000-vertex polygon, naming the field and the limit', () => {
    const s = demoSurvey();
    s.boundaries[0] = { ...s.boundaries[0], geometry: { kind: 'polygon', vertices: ring(90_000) } };
    const issues = issuesOf(s);
    expect(issues).toContainEqual({ path: 'boundaries.0.geometry.vertices', message: 'At most 1,000 vertices per polygon allowed.' });
  });

  it('takes a polygon at the cap', () => {
    const s = demoSurvey();
    s.boundaries[0] = { ...s.boundaries[0], geometry: { kind: 'polygon', vertices: ring(SURVEY_LIMITS.polygonVertices) } };
    expect(issuesOf(s)).toEqual([]);
  });

  it('caps facets, section points and entities', () => {
    const s = demoSurvey();
    const facet = { vertices: [{ x: 1, y: 0, z: 1 }, { x: 2, y: 0, z: 1 }, { x: 1, y: 0, z: 2 }] };
    s.boundaries[0] = { ...s.boundaries[0], geometry: { kind: 'faceted', facets: Array(SURVEY_LIMITS.facets + 1).fill(facet) } };
    const c = s.compartments[0];
    s.compartments[0] = { ...c, geometry: { kind: 'prism', xAftM: 0, xForeM: 10, section: ring(SURVEY_LIMITS.sectionPoints + 1).map((p) => ({ y: p.x, z: p.z })) } };
    const issues = issuesOf(s);
    expect(issues).toContainEqual({ path: 'boundaries.0.geometry.facets', message: 'At most 2,000 facets in one boundary allowed.' });
    expect(issues).toContainEqual({ path: 'compartments.0.geometry.section', message: 'At most 1,000 points in one section allowed.' });

    const many = demoSurvey();
    many.boundaries = Array.from({ length: SURVEY_LIMITS.boundaries + 1 }, (_, i) => ({ ...many.boundaries[0], id: crypto.randomUUID(), name: `B${i}` }));
    expect(issuesOf(many)).toContainEqual({ path: 'boundaries', message: 'At most 10,000 boundaries allowed.' });
  });

  it('caps the assumed/estimated marks on one entity', () => {
    const s = demoSurvey();
    const marks = Object.fromEntries(Array.from({ length: SURVEY_LIMITS.marks + 1 }, (_, i) => [`shores.${i}.section`, 'assumed' as const]));
    s.boundaries[0] = { ...s.boundaries[0], marks };
    expect(issuesOf(s)).toContainEqual({ path: 'boundaries.0.marks', message: 'At most 5,000 marks allowed.' });
    delete marks[`shores.${SURVEY_LIMITS.marks}.section`];
    expect(issuesOf(s)).toEqual([]);
  });

  it('caps the geometry of the whole survey, so many polygons at the cap cannot add up', () => {
    const s = demoSurvey();
    const count = Math.ceil(SURVEY_LIMITS.geometryPoints / SURVEY_LIMITS.polygonVertices) + 1;
    s.boundaries = Array.from({ length: count }, (_, i) => ({ ...s.boundaries[0], id: crypto.randomUUID(), name: `B${i}`, geometry: { kind: 'polygon' as const, vertices: ring(SURVEY_LIMITS.polygonVertices) } }));
    expect(issuesOf(s).some((i) => i.path === 'boundaries' && /at most 100,000 allowed/.test(i.message))).toBe(true);
  });

  it('caps every text field and refuses NUL characters', () => {
    const s = demoSurvey();
    const title = issuesOf({ ...s, title: 'T'.repeat(1_000_000) });
    expect(title).toContainEqual({ path: 'title', message: 'Use at most 200 characters.' });
    expect(issuesOf({ ...s, casualtyDescription: 'x'.repeat(TEXT_LIMITS.narrative + 1) })[0].path).toBe('casualtyDescription');
    expect(issuesOf({ ...s, vessel: { ...s.vessel, name: 'Brine\u0000' } })).toContainEqual({ path: 'vessel.name', message: 'must not contain the NUL character (U+0000)' });
    const b = { ...s.boundaries[0], notes: 'n'.repeat(TEXT_LIMITS.notes + 1) };
    expect(issuesOf({ ...s, boundaries: [b, ...s.boundaries.slice(1)] })).toContainEqual({ path: 'boundaries.0.notes', message: 'Use at most 10,000 characters.' });
  });

  it('isValidEdit agrees: an edit past a cap is not valid', () => {
    const prev: Survey = SurveySchema.parse(demoSurvey());
    const tooMany: Survey = { ...prev, boundaries: [...prev.boundaries, { ...prev.boundaries[0], id: crypto.randomUUID(), geometry: { kind: 'polygon', vertices: ring(1001) } }] };
    expect(isValidEdit(prev, tooMany)).toBe(false);
    expect(isValidEdit(prev, { ...prev, title: 'x'.repeat(201) })).toBe(false);
    expect(isValidEdit(prev, { ...prev, title: 'Renamed' })).toBe(true);
  });
});
