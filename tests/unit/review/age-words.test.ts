/** How long ago a reading was taken, in words that stay readable for old readings (#17). */
import { describe, expect, it } from 'vitest';
import { ageWords } from '@shared/review/time-words';

const MIN = 60_000, H = 60 * MIN, DAY = 24 * H;

describe('ageWords', () => {
  it('minutes, then hours and minutes up to two days', () => {
    expect(ageWords(20_000)).toBe('under a minute');
    expect(ageWords(25 * MIN + 59_000)).toBe('25 min');
    expect(ageWords(3 * H + 20 * MIN)).toBe('3 h 20 min');
    expect(ageWords(2 * H)).toBe('2 h');
    expect(ageWords(47 * H + 59 * MIN)).toBe('47 h 59 min');
  });
  it('whole days past two days: the demo reading of 14 Mar 2025 07:30 UTC seen on 2 Dec 2026 is 628 days old, never "15076 h"', () => {
    // 14 Mar 2025 → 14 Mar 2026 is 365 days (2026 is no leap year), → 14 Nov 2026 another 245
    // (Mar 17 + Apr 30 + May 31 + Jun 30 + Jul 31 + Aug 31 + Sep 30 + Oct 31 + Nov 14), → 2 Dec 18:
    // 628 days by the calendar (common practice, no source: counted by hand)
    const age = Date.parse('2026-12-02T15:00:00Z') - Date.parse('2025-03-14T07:30:00Z');
    expect(ageWords(age)).toBe('628 days');
    expect(ageWords(2 * DAY)).toBe('2 days');
  });
  it('a time in the future (a device clock behind the ship) is no negative age', () => {
    expect(ageWords(-5 * MIN)).toBe('under a minute');
  });
});
