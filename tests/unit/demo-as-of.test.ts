// The demo's readings are seeded as taken about an hour before the seeding, every interval kept.
import { describe, expect, it } from 'vitest';
import { demoAsOf, demoSurvey } from '../../seeds/demo-survey';

const times = (d: ReturnType<typeof demoSurvey>) => [...d.conditions.map((c) => c.time), ...d.compartments.flatMap((c) => c.soundingLog?.readings.map((r) => r.time) ?? [])].map(Date.parse);

describe('demoAsOf', () => {
  it('moves the latest reading to 60–75 min before the seeding, on a quarter hour', () => {
    const now = new Date('2026-12-02T15:14:08Z');
    const latest = Math.max(...times(demoAsOf(demoSurvey(), now)));
    expect(new Date(latest).toISOString()).toBe('2026-12-02T14:00:00.000Z');
    const age = now.getTime() - latest;
    expect(age).toBeGreaterThanOrEqual(60 * 60_000);
    expect(age).toBeLessThan(75 * 60_000);
  });
  it('keeps every interval between readings, and nothing but the times changes', () => {
    const before = demoSurvey(), after = demoAsOf(before, new Date('2026-12-02T15:14:08Z'));
    const a = times(before), b = times(after);
    expect(b.map((t) => t - b[0])).toEqual(a.map((t) => t - a[0]));
    const strip = (d: typeof before) => JSON.stringify(d, (k, v: unknown) => (k === 'time' ? undefined : v));
    expect(strip(after)).toBe(strip(before));
  });
});
