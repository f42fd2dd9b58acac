/**
 * A sounding log with one reading: the format keeps it, the forecast gives its level and volume
 * at once, and no rate is made up from it.
 */
import { describe, expect, it } from 'vitest';
import { computeSurvey, forecastFlooding } from '@shared/engine';
import { SurveySchema } from '@shared/schemas/survey';
import { baseSurvey, boxCompartment } from './fixtures';

describe('the first sounding of a log', () => {
  const comp = boxCompartment([10, -5, 1], [20, 5, 9], {
    permeability: 0.95,
    soundingLog: { pipe: { x: 12, y: 2, bottomZM: 1 }, readings: [{ time: '2025-03-14T06:00:00Z', soundingM: 2.4 }] },
  });
  const survey = () => {
    const s = baseSurvey({ aft: 5, fwd: 5 });
    s.compartments.push(structuredClone(comp));
    return s;
  };

  it('is a valid log on its own; an empty log is not', () => {
    expect(SurveySchema.safeParse(survey()).success).toBe(true);
    const empty = survey();
    empty.compartments[0].soundingLog!.readings = [];
    expect(SurveySchema.safeParse(empty).success).toBe(false);
  });

  it('gives the level and the volume at its time, and no rate', () => {
    const f = forecastFlooding(survey(), { horizonH: 1 });
    const sp = f.spaces.find((x) => x.id === comp.id)!;
    expect(sp.soundings).toBeNull();
    expect(sp.firstSounding).not.toBeNull();
    expect(sp.firstSounding!.time).toBe('2025-03-14T06:00:00Z');
    expect(sp.firstSounding!.soundingM).toBe(2.4);
    // upright box, pipe on its bottom: the level is the sounding, and the volume plan area × depth × permeability
    // (volume of a rectangular prism, elementary geometry): 10 m × 10 m × 2.4 m × 0.95 = 228 m³
    expect(sp.firstSounding!.levelM).toBeCloseTo(2.4, 9);
    expect(sp.firstSounding!.volumeM3).toBeCloseTo(228, 6);
    expect(f.latestReadingTime).toBe('2025-03-14T06:00:00Z');
    // the load results make no inflow figure from one reading either
    const r = computeSurvey(survey());
    expect(r.compartments.find((c) => c.id === comp.id)?.inflow?.measured ?? null).toBeNull();
  });

  it('a second reading makes the rate', () => {
    const s = survey();
    s.compartments[0].soundingLog!.readings.push({ time: '2025-03-14T07:00:00Z', soundingM: 2.9 });
    const sp = forecastFlooding(s, { horizonH: 1 }).spaces.find((x) => x.id === comp.id)!;
    expect(sp.firstSounding).toBeNull();
    // 0.5 m in 1 h over 100 m² × 0.95: 47.5 m³/h
    expect(sp.soundings!.grossInflowM3S * 3600).toBeCloseTo(47.5, 6);
  });
});
