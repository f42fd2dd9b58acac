/**
 * Lean pushes (#18 item 3): an edit of one field of an entity is queued as a `patch` of the part that
 * changed; applying it gives the same document as the whole upsert; the server's plan applies it to its
 * own copy and validates the whole survey, as for an upsert; old upserts are still taken.
 */
import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import type { Condition, Survey } from '@shared/schemas/survey';
import { SurveyChangeSchema, type SurveyChange, type SurveyOp, type UpsertOp } from '@shared/schemas/sync';
import { applyOp, findEntity, leanOp, type Entity } from '@shared/sync/apply';
import { planRun, type PlanOutcome, type RunPlan } from '../../server/services/sync/plan';
import { demoSurvey } from '../../seeds/demo-survey';
import { generateVessel } from '../../scripts/bench-engine';

let seq = 0;
const DEVICES: Record<string, string> = { a: '7d0c0000-0000-4000-8000-00000000000a', b: '7d0c0000-0000-4000-8000-00000000000b' };
const change = (surveyId: string, op: SurveyOp, baseRevision = 1, device = 'a'): SurveyChange => ({
  id: randomUUID(),
  deviceId: DEVICES[device],
  seq: ++seq,
  surveyId,
  baseRevision,
  createdAt: '2026-12-01T00:00:00.000Z',
  op,
});

function planned(o: PlanOutcome): RunPlan {
  if (o.kind !== 'planned') throw new Error(`expected a plan, got ${o.kind}`);
  return o;
}
const plan = (doc: Survey, run: SurveyChange[], checkEach = false) =>
  planned(planRun({ orgId: 'org', userId: 'user', seen: new Map(), mode: 'locked', checkEach, newId: () => randomUUID(), run, survey: { doc, revision: 1, revs: {}, vesselId: null, status: 'draft' } }));

/** The active condition with one layer's sounding changed, as the contents form saves it. */
function withSounding(s: Survey, compartmentId: string, soundingM: number): { before: Condition; after: Condition } {
  const before = s.conditions.find((c) => c.id === s.activeConditionId)!;
  const after: Condition = {
    ...before,
    contents: before.contents.map((k) =>
      k.compartmentId !== compartmentId ? k : { ...k, layers: k.layers.map((l, i) => (i === 0 && l.level.kind === 'sounding' ? { ...l, level: { ...l.level, soundingM } } : l)) },
    ),
  };
  return { before, after };
}

const upsert = (c: Condition): UpsertOp => ({ kind: 'upsert', collection: 'conditions', entity: c });

describe('leanOp', () => {
  it('turns a one-sounding upsert into a patch of that sounding, giving the same document', () => {
    const s = demoSurvey();
    const hold = s.compartments.find((c) => c.name === 'No. 2 hold')!;
    const { before, after } = withSounding(s, hold.id, 4.15);
    const op = leanOp(before as unknown as Entity, upsert(after));
    const layerId = before.contents.find((k) => k.compartmentId === hold.id)!.layers[0].id;
    expect(op).toEqual({ kind: 'patch', collection: 'conditions', entityId: before.id, path: ['contents', hold.id, 'layers', layerId, 'level', 'soundingM'], value: 4.15 });
    expect(applyOp(s, op)).toEqual(applyOp(s, upsert(after)));
  });

  it('keeps an upsert for a new entity or several fields, and patches a removed key by leaving value out', () => {
    const s = demoSurvey();
    const cond = s.conditions[0];
    expect(leanOp(undefined, upsert(cond)).kind).toBe('upsert');
    expect(leanOp(cond as unknown as Entity, upsert({ ...cond, heelDeg: 2, seaDensityKgM3: 1020 })).kind).toBe('upsert');
    const removed = leanOp({ ...cond, heelDeg: 2 } as unknown as Entity, upsert({ ...cond, heelDeg: undefined }));
    expect(removed).toEqual({ kind: 'patch', collection: 'conditions', entityId: cond.id, path: ['heelDeg'] });
    expect(findEntity(applyOp({ ...s, conditions: [{ ...cond, heelDeg: 2 }] }, removed), 'conditions', cond.id)?.heelDeg).toBeUndefined();
  });

  it('a one-sounding push of the 2,000-boundary survey is under 2 KB (the whole condition is far more)', () => {
    const s = generateVessel();
    s.boundaries = s.boundaries.slice(0, 2000);
    const target = s.conditions[0].contents[7].compartmentId;
    const { before, after } = withSounding(s, target, 3.3);
    const lean = change(s.id, leanOp(before as unknown as Entity, upsert(after)));
    const whole = change(s.id, upsert(after));
    const bytes = (c: SurveyChange) => new TextEncoder().encode(JSON.stringify({ changes: [c] })).length;
    expect(SurveyChangeSchema.safeParse(lean).success).toBe(true);
    expect(bytes(lean)).toBeLessThan(2048);
    expect(bytes(whole)).toBeGreaterThan(20 * bytes(lean));
  });
});

describe('the server takes a patch', () => {
  it('applies it to its own copy: the same document and revision trail as the whole upsert', () => {
    const s = demoSurvey();
    const hold = s.compartments.find((c) => c.name === 'No. 2 hold')!;
    const { before, after } = withSounding(s, hold.id, 4.15);
    const byPatch = plan(s, [change(s.id, leanOp(before as unknown as Entity, upsert(after)))]);
    const byUpsert = plan(s, [change(s.id, upsert(after))]);
    expect(byPatch.results[0].status).toBe('applied');
    expect(byPatch.final?.doc).toEqual(byUpsert.final?.doc);
    expect(byPatch.revisions[0].changes).toEqual(byUpsert.revisions[0].changes);
  });

  it('validates the whole survey after it: a patch that breaks the survey is refused with the reason', () => {
    const s = demoSurvey();
    const cond = s.conditions[0];
    const k = cond.contents[0];
    // a layer naming a fluid nobody defined: only the whole-survey check (references) can see it
    const bad: SurveyOp = { kind: 'patch', collection: 'conditions', entityId: cond.id, path: ['contents', k.compartmentId, 'layers', k.layers[0].id, 'fluidId'], value: 'no-such-fluid' };
    const p = plan(s, [change(s.id, bad)], true);
    expect(p.results[0].status).toBe('rejected');
    expect(p.results[0].reason).toContain('no-such-fluid');
    // and a value of the wrong kind
    const wrong: SurveyOp = { kind: 'patch', collection: 'conditions', entityId: cond.id, path: ['heelDeg'], value: 'steep' };
    expect(plan(s, [change(s.id, wrong)], true).results[0].status).toBe('rejected');
  });

  it('refuses a patch whose place is gone (the device then sends the whole entity), and never changes an id', () => {
    const s = demoSurvey();
    const cond = s.conditions[0];
    const gone: SurveyOp = { kind: 'patch', collection: 'conditions', entityId: cond.id, path: ['contents', randomUUID(), 'gas'], value: { kind: 'vented' } };
    expect(plan(s, [change(s.id, gone)]).results[0].status).toBe('rejected');
    const missing: SurveyOp = { kind: 'patch', collection: 'conditions', entityId: randomUUID(), path: ['heelDeg'], value: 1 };
    expect(plan(s, [change(s.id, missing)]).results[0].status).toBe('rejected');
    const id: SurveyOp = { kind: 'patch', collection: 'conditions', entityId: cond.id, path: ['id'], value: randomUUID() };
    expect(plan(s, [change(s.id, id)]).results[0].status).toBe('rejected');
  });

  it('keeps both values as a conflict when another device changed that field since', () => {
    const s = demoSurvey();
    const hold = s.compartments.find((c) => c.name === 'No. 2 hold')!;
    const { before, after } = withSounding(s, hold.id, 4.15);
    const other = withSounding(s, hold.id, 1.1).after;
    const p = plan(s, [change(s.id, upsert(other), 1, 'b'), change(s.id, leanOp(before as unknown as Entity, upsert(after)), 1, 'a')]);
    expect(p.results.map((r) => r.status)).toEqual(['applied', 'conflict']);
    expect(p.conflicts[0].target).toEqual({ kind: 'entity-field', collection: 'conditions', entityId: before.id, field: 'contents' });
    expect(p.final?.doc.conditions[0].contents).toEqual(other.contents);
  });

  it('still takes the old whole-entity upsert a queued outbox may hold', () => {
    const s = demoSurvey();
    const hold = s.compartments.find((c) => c.name === 'No. 2 hold')!;
    const { after } = withSounding(s, hold.id, 2.2);
    const p = plan(s, [change(s.id, { ...upsert(after), fields: ['contents'] }), change(s.id, upsert({ ...after, heelDeg: 1.5 }))]);
    expect(p.results.map((r) => r.status)).toEqual(['applied', 'applied']);
    expect(p.final?.doc.conditions[0]).toEqual({ ...after, heelDeg: 1.5 });
  });
});
