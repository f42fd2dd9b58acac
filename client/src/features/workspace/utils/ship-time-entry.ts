/**
 * Times typed as a ship's log writes them, whatever language the device speaks: an ISO-like date and
 * a 24-hour clock, "2025-03-14 09:45", read in a named clock (the ship's, or this device's). A
 * browser's own date-time picker follows the device's locale instead ("03/14/2025, 09:45 AM" in
 * one, "14.03.2025, 09:45" in another), which is how day and month get swapped on deck.
 */

/** What the field asks for, said beside it. */
export const SHIP_TIME_FORMAT = 'YYYY-MM-DD HH:MM, 24 h';

const ENTRY = /^(\d{4})-(\d{1,2})-(\d{1,2})[ T]+(\d{1,2})[:.h](\d{2})(?::(\d{2}))?$/;
const two = (n: number) => String(n).padStart(2, '0');

/**
 * "2025-03-14 09:45" (or with a "T", as an ISO time is written) in a clock `offsetMin` minutes ahead
 * of UTC, as an ISO instant; null when it is not a date and time that exists (14 for a month, 30 Feb).
 */
export function parseShipTimeEntry(text: string, offsetMin: number): string | null {
  const m = ENTRY.exec(text.trim());
  if (!m) return null;
  const [y, mo, d, h, mi, s] = [m[1], m[2], m[3], m[4], m[5], m[6] ?? '0'].map(Number);
  if (h > 23 || mi > 59 || s > 59) return null;
  const asUtc = Date.UTC(y, mo - 1, d, h, mi, s);
  const back = new Date(asUtc);
  // Date.UTC rolls 30 Feb over into March: a day or month that does not exist is refused, not moved
  if (back.getUTCFullYear() !== y || back.getUTCMonth() !== mo - 1 || back.getUTCDate() !== d) return null;
  return new Date(asUtc - offsetMin * 60_000).toISOString();
}

/** An ISO instant as the field shows it in a clock `offsetMin` minutes ahead of UTC: "2025-03-14 09:45". */
export function shipTimeEntry(iso: string, offsetMin: number): string {
  const t = Date.parse(iso);
  if (Number.isNaN(t)) return '';
  const d = new Date(t + offsetMin * 60_000);
  return `${d.getUTCFullYear()}-${two(d.getUTCMonth() + 1)}-${two(d.getUTCDate())} ${two(d.getUTCHours())}:${two(d.getUTCMinutes())}`;
}

/** This device's offset from UTC in minutes at about the instant a clock reading names (summer time counts). */
export function deviceOffsetAt(text: string): number {
  const guess = parseShipTimeEntry(text, 0);
  return -new Date(guess ?? Date.now()).getTimezoneOffset();
}
