/**
 * isValidEdit (shared/schemas/survey.ts) checks only what an edit changed. Reference: SurveySchema
 * itself, parsing the whole edited survey; the two must agree on every edit. The edits are made the
 * way the sync merge makes them (shared/sync/apply.ts: copy what changes, share the rest), from the
 * demo survey, by a seeded random walk that mixes valid and invalid values. Common practice, no source.
 */
import { describe, expect, it } from 'vitest';
import { isValidEdit, SurveySchema, type Survey } from '@shared/schemas/survey';
import { SURVEY_COLLECTIONS, type SurveyCollection } from '@shared/schemas/sync';
import { entitiesOf, withEntity, withEntityField, withoutEntity, type Entity } from '@shared/sync/apply';
import demo from '../../seeds/demo-survey.json';
import { prng } from '../support/prng';

describe('isValidEdit', () => {
  it('agrees with the full survey schema on 3,000 random edits of the demo survey', () => {
    const start = SurveySchema.parse(demo) as Survey;
    const rnd = prng(20261202);
    const pick = <T,>(xs: readonly T[]): T => xs[Math.floor(rnd() * xs.length)];
    const ids = (s: Survey) => SURVEY_COLLECTIONS.flatMap((c) => entitiesOf(s, c).map((e) => e.id));
    const oddValues = (s: Survey): unknown[] => [undefined, null, -1, 0, 0.5, 1e9, '', 'x', true, {}, [], pick(ids(s)), crypto.randomUUID()];

    const edit = (s: Survey): Survey => {
      const kind = rnd();
      if (kind < 0.15) {
        const field = pick(['title', 'activeConditionId', 'casualtyDescription', 'vessel', 'schemaVersion'] as const);
        const value =
          field === 'vessel'
            ? withEntityField(s.vessel as unknown as Entity, pick(Object.keys(s.vessel)), pick(oddValues(s)))
            : field === 'activeConditionId' && rnd() < 0.5
              ? pick(s.conditions).id
              : pick(oddValues(s));
        return { ...s, [field]: value } as Survey;
      }
      const collection: SurveyCollection = pick(SURVEY_COLLECTIONS);
      const list = entitiesOf(s, collection);
      if (list.length === 0 || kind < 0.25) {
        const template = list.length ? pick(list) : pick(entitiesOf(start, collection).length ? entitiesOf(start, collection) : entitiesOf(start, 'fluids'));
        return withEntity(s, collection, { ...template, id: rnd() < 0.2 && list.length ? pick(list).id + '' : crypto.randomUUID() });
      }
      if (kind < 0.35) return withoutEntity(s, collection, pick(list).id);
      const entity = pick(list);
      const fields = Object.keys(entity).filter((f) => f !== 'id');
      const value = rnd() < 0.4 ? pick(entitiesOf(start, collection).map((e) => e[pick(fields)])) : pick(oddValues(s));
      return withEntity(s, collection, withEntityField(entity, pick(fields), value));
    };

    let prev = start;
    let accepted = 0;
    let refused = 0;
    for (let i = 0; i < 3000; i++) {
      let next = edit(prev);
      if (rnd() < 0.3) next = edit(next);
      const full = SurveySchema.safeParse(next).success;
      expect([i, isValidEdit(prev, next)]).toEqual([i, full]);
      if (full) {
        accepted++;
        if (rnd() < 0.7) prev = next;
      } else {
        refused++;
        if (rnd() < 0.05) prev = start;
      }
    }
    // Both outcomes must be well represented for the agreement to mean anything.
    expect(accepted).toBeGreaterThan(300);
    expect(refused).toBeGreaterThan(300);
    // A correctness check, not a timing one: on a busy 2-core machine 3,000 full parses take longer than the default 5 s.
  }, 120_000);

  it('checks an edited entity even when the rest of the survey is untouched', () => {
    const s = SurveySchema.parse(demo) as Survey;
    const b = s.boundaries[0] as unknown as Entity;
    expect(isValidEdit(s, withEntity(s, 'boundaries', withEntityField(b, 'name', 'Renamed')))).toBe(true);
    expect(isValidEdit(s, withEntity(s, 'boundaries', withEntityField(b, 'geometry', { kind: 'rectangle' })))).toBe(false);
    expect(isValidEdit(s, withEntity(s, 'boundaries', { ...b, id: s.compartments[0].id }))).toBe(false);
    expect(isValidEdit(s, { ...s, conditions: [] })).toBe(false);
  });
});
