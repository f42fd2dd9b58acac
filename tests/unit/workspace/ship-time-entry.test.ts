// Times typed in one style whatever the device's language: ISO-like date, 24-hour clock, a named clock.
import { describe, expect, it } from 'vitest';
import { parseShipTimeEntry, shipTimeEntry } from '@client/features/workspace/utils/ship-time-entry';

describe('the ship’s time field', () => {
  it('reads "YYYY-MM-DD HH:MM" (or with a T) in the ship’s clock as UTC', () => {
    // UTC+01:00: 09:45 ship's time is 08:45 UTC; UTC−05:00: 21:30 is 02:30 UTC the next day
    expect(parseShipTimeEntry('2025-03-14 09:45', 60)).toBe('2025-03-14T08:45:00.000Z');
    expect(parseShipTimeEntry('2025-03-14T09:45', 60)).toBe('2025-03-14T08:45:00.000Z');
    expect(parseShipTimeEntry(' 2025-03-14  21:30 ', -300)).toBe('2025-03-15T02:30:00.000Z');
  });
  it('refuses what is no date and time rather than moving it: 30 Feb, month 13, 24:00, a 12-hour time, a locale date', () => {
    expect(parseShipTimeEntry('2025-02-30 10:00', 0)).toBeNull();
    expect(parseShipTimeEntry('2025-13-01 10:00', 0)).toBeNull();
    expect(parseShipTimeEntry('2025-03-14 24:00', 0)).toBeNull();
    expect(parseShipTimeEntry('2025-03-14 09:45 PM', 0)).toBeNull();
    expect(parseShipTimeEntry('14.03.2025, 09:45', 0)).toBeNull();
    expect(parseShipTimeEntry('', 0)).toBeNull();
  });
  it('shows a stored time back in the same style and clock', () => {
    expect(shipTimeEntry('2025-03-14T08:45:00.000Z', 60)).toBe('2025-03-14 09:45');
    // 2024 is a leap year: 23:30 UTC on 28 Feb is 29 Feb 02:30 at UTC+03:00
    expect(shipTimeEntry('2024-02-28T23:30:00Z', 180)).toBe('2024-02-29 02:30');
    expect(parseShipTimeEntry(shipTimeEntry('2025-03-14T08:45:00.000Z', -330), -330)).toBe('2025-03-14T08:45:00.000Z');
  });
});
