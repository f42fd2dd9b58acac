// The ship's clock as the Ship form takes it: hours from UTC, as a ship's log writes its zone.
import { describe, expect, it } from 'vitest';
import { parseShipClock, shipClockText } from '@client/features/workspace/components/ship-section';

describe('the ship’s clock field', () => {
  it('reads hours, hours and minutes, and the UTC prefix', () => {
    expect(parseShipClock('+1')).toBe(60);
    // India keeps UTC+05:30, Newfoundland UTC−03:30 (civil time zones, a fact of the trade)
    expect(parseShipClock('+5:30')).toBe(330);
    expect(parseShipClock('UTC−03:30')).toBe(-210);
    expect(parseShipClock('-5')).toBe(-300);
    expect(parseShipClock('')).toBeUndefined();
    expect(parseShipClock('one hour')).toBeNaN();
  });
  it('shows what it read back the same way', () => {
    expect(shipClockText(60)).toBe('+01:00');
    expect(shipClockText(-210)).toBe('-03:30');
    expect(shipClockText(undefined)).toBe('');
    expect(parseShipClock(shipClockText(-330))).toBe(-330);
  });
});
