/**
 * One date-time style everywhere: day month year, 24-hour clock, never the reader's locale
 * ("14 Mar 2025 07:30 UTC"). Ship's time is UTC shifted by the ship's clock offset, always shown with
 * that offset beside it ("14 Mar 2025 10:30 ship's time (UTC+03:00)").
 */
const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];
const two = (n: number) => String(n).padStart(2, '0');

function dayAndTime(d: Date): string {
  return `${d.getUTCDate()} ${MONTHS[d.getUTCMonth()]} ${d.getUTCFullYear()} ${two(d.getUTCHours())}:${two(d.getUTCMinutes())}`;
}

/** "UTC+03:00", "UTC−05:30", "UTC" for zero. */
export function utcOffsetWords(offsetMinutes: number): string {
  if (offsetMinutes === 0) return 'UTC';
  const sign = offsetMinutes > 0 ? '+' : '−';
  const a = Math.abs(offsetMinutes);
  return `UTC${sign}${two(Math.floor(a / 60))}:${two(a % 60)}`;
}

/** "14 Mar 2025 07:30 UTC", or '—' for a missing or unreadable time. */
export function formatUtc(iso: string | Date | null | undefined): string {
  if (iso === null || iso === undefined) return '—';
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? '—' : `${dayAndTime(d)} UTC`;
}

/** "14 Mar 2025 10:30 ship's time (UTC+03:00)". */
export function formatShipTime(iso: string | Date, offsetMinutes: number): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return '—';
  return `${dayAndTime(new Date(d.getTime() + offsetMinutes * 60_000))} ship's time (${utcOffsetWords(offsetMinutes)})`;
}

/** Ship's time beside UTC when the ship's offset is known, else UTC alone. */
export function formatShipAndUtc(iso: string | Date | null | undefined, offsetMinutes: number | undefined): string {
  if (iso === null || iso === undefined) return '—';
  if (offsetMinutes === undefined) return formatUtc(iso);
  return `${formatShipTime(iso, offsetMinutes)} · ${formatUtc(iso)}`;
}

/** A device-local time in the same style, with its offset (for times that are the reader's own). */
export function formatLocal(iso: string | Date | null | undefined): string {
  if (iso === null || iso === undefined) return '—';
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return '—';
  const offset = -d.getTimezoneOffset();
  return `${dayAndTime(new Date(d.getTime() + offset * 60_000))} (${utcOffsetWords(offset)})`;
}

/** A span in the one style: "14 Mar 2025 07:30 – 07:52 UTC" within a day, else both ends in full. */
export function formatUtcSpan(from: string | Date, to: string | Date): string {
  const a = formatUtc(from);
  const b = formatUtc(to);
  if (a === b) return a;
  const [dayA, dayB] = [a.slice(0, a.lastIndexOf(' ', a.length - 5)), b.slice(0, b.lastIndexOf(' ', b.length - 5))];
  return dayA === dayB ? `${a.slice(0, -4)} – ${b.slice(dayB.length + 1)}` : `${a} – ${b}`;
}

/**
 * How long ago, in words that stay readable however old a reading is: "under a minute", "25 min",
 * "3 h 20 min" up to two days, then whole days ("628 days"), never thousands of hours.
 */
export function ageWords(ms: number): string {
  const min = Math.floor(Math.max(0, ms) / 60_000);
  if (min < 1) return 'under a minute';
  if (min < 60) return `${min} min`;
  const h = Math.floor(min / 60);
  if (h < 48) return min % 60 === 0 ? `${h} h` : `${h} h ${min % 60} min`;
  const days = Math.floor(h / 24);
  return `${days} days`;
}
