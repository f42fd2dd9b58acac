/**
 * The person last signed in on this device, remembered in localStorage (never a token) so work
 * goes on under their name with no network. Read by the session and by the device store, which
 * stamps each edit with its author.
 */
export const IDENTITY_KEY = 'brineline.identity';

/** The remembered person's id, or null when nobody is remembered (or storage is unavailable). */
export function rememberedUserId(): string | null {
  try {
    const raw = localStorage.getItem(IDENTITY_KEY);
    if (!raw) return null;
    const id = (JSON.parse(raw) as { id?: unknown } | null)?.id;
    return typeof id === 'string' ? id : null;
  } catch {
    return null;
  }
}
