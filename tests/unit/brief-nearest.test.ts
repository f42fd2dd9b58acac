/** The master's brief states the nearest time-to-limit in plain words, with its assumptions. */
import { describe, expect, it } from 'vitest';
import { nearestLimitWords } from '../../server/brief/render-brief';
import { forecastFlooding } from '@shared/engine';
import { hmm } from '@shared/api/cautions';
import { demoSurvey } from '../../seeds/demo-survey';

describe('nearest time-to-limit on the brief', () => {
  it('names the first boundary to reach its limit and when, and says what it assumes', () => {
    const s = demoSurvey();
    // with no boundary entered, nothing can reach a limit
    const none = nearestLimitWords({ ...s, boundaries: [] })!;
    expect(none.sentence).toBe('No boundary reaches its limit within the next 24 hours.');
    const words = nearestLimitWords(s)!;
    const f = forecastFlooding(s);
    const first = f.limits[0];
    expect(words.sentence).toContain(first.name);
    if (first.atS > 0) expect(words.sentence).toContain(hmm(first.atS));
    else expect(words.sentence).toContain('already past its limit');
    expect(words.assumptions).toContain('New soundings replace it');
    expect(words.assumptions).toContain('present attitude');
  });
});
