/** The desk's "changed since review" list: every change between two documents, in plain words and the reader's units. */
import { describe, expect, it } from 'vitest';
import { unit } from 'mathjs';
import { demoSurvey } from '../../../seeds/demo-survey';
import type { Survey } from '@shared/schemas/survey';
import { changeLineText, surveyChangeLines } from '@shared/review/survey-changes';

const words = (a: Survey, b: Survey, system: 'si' | 'us' = 'si') => surveyChangeLines(a, b).map((l) => changeLineText(l, system));

/** A deep copy to edit. */
const copy = (s: Survey): Survey => structuredClone(s);

describe('surveyChangeLines', () => {
  it('says nothing for the same document', () => {
    const s = demoSurvey();
    expect(surveyChangeLines(s, copy(s))).toEqual([]);
  });

  it('words a sounding by the space it was taken in', () => {
    const before = demoSurvey();
    const after = copy(before);
    const hold2 = before.compartments.find((c) => c.name === 'No. 2 hold')!;
    const layer = after.conditions[0]!.contents.find((c) => c.compartmentId === hold2.id)!.layers[0]!;
    if (layer.level.kind !== 'sounding') throw new Error('the demo sounds No. 2 hold');
    layer.level = { ...layer.level, soundingM: 4.6 };
    expect(words(before, after)).toEqual(['Sounding in No. 2 hold: 3.6 m → 4.6 m']);
  });

  it('words drafts, heel, a boundary’s rating and an added boundary', () => {
    const before = demoSurvey();
    const after = copy(before);
    after.conditions[0]!.drafts.aftM = 7.5;
    after.conditions[0]!.heelDeg = 4.5;
    const bulkhead = after.boundaries.find((b) => b.name === 'No. 2/3 hold bulkhead')!;
    bulkhead.ratedCapacity = { kind: 'pressure', pressurePa: 1 };
    after.boundaries.push({ ...structuredClone(bulkhead), id: '00000000-0000-4000-8000-0000000009aa', name: 'Patch over the shell crack' });
    expect(words(before, after)).toEqual([
      'Draft aft: 7.4 m → 7.5 m',
      'Heel: 4° → 4.5°',
      'Boundary “No. 2/3 hold bulkhead”: rated capacity pressure: 110 kPa → 0.001 kPa',
      'Boundary “Patch over the shell crack”: added',
    ]);
  });

  it('gives a removed item and a changed shape as one line each', () => {
    const before = demoSurvey();
    const after = copy(before);
    after.boundaries = after.boundaries.filter((b) => b.name !== 'Engine room aft watertight door');
    const deck = after.boundaries.find((b) => b.name === "No. 1 'tween deck")!;
    if (deck.geometry.kind !== 'rectangle') throw new Error('the demo deck is a rectangle');
    deck.geometry = { ...deck.geometry, edgeV: { x: 21, y: 0, z: 0 } };
    expect(words(before, after)).toEqual(["Boundary “No. 1 'tween deck”: geometry: changed", 'Boundary “Engine room aft watertight door”: removed']);
  });

  it('converts to the reader’s units', () => {
    const before = demoSurvey();
    const after = copy(before);
    after.boundaries.find((b) => b.name === 'No. 2/3 hold bulkhead')!.ratedCapacity = { kind: 'pressure', pressurePa: 120e3 };
    // mathjs's own unit table (outside the project) for kPa → psi
    const psi = (kPa: number) => Number(unit(kPa, 'kPa').toNumber('psi').toPrecision(6));
    expect(words(before, after, 'us')).toEqual([`Boundary “No. 2/3 hold bulkhead”: rated capacity pressure: ${psi(110)} psi → ${psi(120)} psi`]);
  });
});
