import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { computeSurvey, ENGINE_VERSION } from '@shared/engine';
import { formatIssueLines } from '@shared/api/format-issues';
import { surveyJsonSchemaText } from '@shared/schemas/json-schema';
import { SurveySchema } from '@shared/schemas/survey';
import { demoSurvey } from '../../../seeds/demo-survey';
import { demoSurveyText } from '../../../scripts/gen-schema';

describe('survey format', () => {
  it('committed JSON Schema equals the generated one', () => {
    expect(readFileSync('shared/schemas/survey.schema.json', 'utf8')).toBe(surveyJsonSchemaText());
  });
  it('committed demo JSON equals demoSurvey()', () => {
    expect(readFileSync('seeds/demo-survey.json', 'utf8')).toBe(demoSurveyText());
  });
  it('bad input gives path + message', () => {
    const bad = structuredClone(demoSurvey()) as unknown as { boundaries: { geometry: { origin: { x: unknown } }; sideB: { compartmentId: string } }[] };
    bad.boundaries[0].geometry.origin.x = 'ten';
    bad.boundaries[1].sideB.compartmentId = '5eed0000-0000-4000-8000-0000000fffff';
    const r = SurveySchema.safeParse(bad);
    expect(r.success).toBe(false);
    const lines = formatIssueLines(r.error!);
    expect(lines).toContain('boundaries.0.geometry.origin.x: Invalid input: expected number, received string');
  });
  it('cross-references are checked', () => {
    const s = demoSurvey();
    s.boundaries[1].sideB = { kind: 'compartment', compartmentId: '5eed0000-0000-4000-8000-0000000fffff' };
    const r = SurveySchema.safeParse(s);
    expect(r.success).toBe(false);
    expect(formatIssueLines(r.error!)).toEqual(['boundaries.1.sideB.compartmentId: no compartment has this id']);
  });
});

describe('demo survey', () => {
  const r = computeSurvey(SurveySchema.parse(demoSurvey()));
  it('is deterministic, JSON-serialisable and carries the engine version', () => {
    expect(r.engineVersion).toBe(ENGINE_VERSION);
    expect(JSON.stringify(computeSurvey(SurveySchema.parse(demoSurvey())))).toBe(JSON.stringify(r));
    expect(JSON.parse(JSON.stringify(r))).toEqual(r);
  });
  it('shows what the demo is for', () => {
    expect(r.frame.heelDeg).toBeCloseTo(4, 12);
    expect(r.frame.trimM).toBeCloseTo(1.2, 12);
    // the pressed-up No. 3 DB tank (24 × 9 × 1.2 m box, tank permeability 0.95, SOLAS II-1 Reg. 7-3)
    // holds 246.24 m³ of bunkers at 985 kg/m³ (delivery note): 242.55 t (worked by hand)
    const db = r.compartments.find((c) => c.name.startsWith('No. 3 double-bottom'))!;
    expect(db.liquid.volumeM3).toBeCloseTo(246.24, 6);
    expect(db.liquid.massKg / 1000).toBeCloseTo(242.55, 2);
    expect(r.boundaries.some((b) => b.kind === 'door' && b.parentBoundaryId)).toBe(true);
  });
});
