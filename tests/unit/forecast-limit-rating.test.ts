/** A forecast's time-to-limit row carries the governing rating, so the screen can say its value and direction. */
import { describe, expect, it } from 'vitest';
import { forecastFlooding } from '@shared/engine';
import { demoSurvey } from '../../seeds/demo-survey';

describe('forecast limits name the governing rating', () => {
  it('a limit governed by a rating carries the rating the surveyor entered (the input is the fact, not a formula)', () => {
    const s = demoSurvey();
    const f = forecastFlooding(s);
    const byRating = f.limits.filter((l) => l.governs === 'rating');
    expect(byRating.length, 'the demo has a boundary that reaches its rating').toBeGreaterThan(0);
    for (const l of byRating) {
      const b = s.boundaries.find((x) => x.id === l.boundaryId)!;
      expect(l.rating).not.toBeNull();
      const r = b.ratedCapacity;
      const entered = [r ? (r.kind === 'pressure' ? r.pressurePa : r.forceN) : undefined, b.directionalCapacity?.towardsA, b.directionalCapacity?.towardsB];
      expect(entered).toContain(l.rating!.rated);
      expect(['either', 'towards-A', 'towards-B']).toContain(l.rating!.direction);
      if (b.ratedCapacity) expect(l.rating!.direction).toBe('either');
    }
    // a limit governed by something else carries no rating words of its own
    for (const l of f.limits.filter((x) => x.governs === null)) expect(l.rating).toBeNull();
  }, 60_000);
});
