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
    // the demo has hydrostatic particulars: the forecast's attitude follows the ship's response, and the brief says so
    expect(f.attitude.mode).toBe('follows-response');
    expect(words.attitude).toBe('Attitude follows the ship’s response');
    expect(words.assumptions).toContain(f.attitude.note.slice(1));
    // every downflooding point is either named with its time or the brief says none goes under
    expect(words.downflooding.length).toBeGreaterThan(0);
  }, 60_000);
});
