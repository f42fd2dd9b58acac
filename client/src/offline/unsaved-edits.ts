/**
 * A small write-ahead note of edits on their way into the device store. An edit saved as the page
 * closes (the autosave's last flush) has only the page's last moments: localStorage is written at once,
 * IndexedDB needs a few more. Each edit is noted here synchronously before its transaction starts and
 * struck off when it commits (or is refused as invalid). A write the store fails (full disk, broken
 * store) keeps its note: the edit goes in with the next edit on this page, else at the next start.
 * Notes still here at the next start are applied then (`replayUnsavedEdits`).
 * Applying one twice is harmless: an edit that changes nothing queues nothing.
 */
import type { SurveyOp } from '@shared/schemas/sync';

const KEY = 'brineline:unsaved-edits';

interface Note {
  n: number;
  surveyId: string;
  ops: SurveyOp[];
  /** What each edit's form started from (see applyLocalChanges). */
  bases?: (SurveyOp | undefined)[];
}

function read(): Note[] {
  try {
    const raw = localStorage.getItem(KEY);
    const list: unknown = raw ? JSON.parse(raw) : [];
    return Array.isArray(list) ? (list as Note[]) : [];
  } catch {
    return [];
  }
}

/** False when the note could not be written (storage full or blocked). */
function write(list: Note[]): boolean {
  try {
    if (list.length === 0) localStorage.removeItem(KEY);
    else localStorage.setItem(KEY, JSON.stringify(list));
    return true;
  } catch {
    // storage full or blocked: the edit still goes to IndexedDB as before, only without this net
    return false;
  }
}

/**
 * Notes an edit before it is written; returns its number, for `strikeUnsavedEdit`, or null when the
 * note could not be written (then nothing holds the edit but the store write itself).
 */
export function noteUnsavedEdit(surveyId: string, ops: SurveyOp[], bases: readonly (SurveyOp | undefined)[] = []): number | null {
  const list = read();
  const n = (list.length ? Math.max(...list.map((e) => e.n)) : 0) + 1;
  return write([...list, { n, surveyId, ops, ...(bases.some(Boolean) ? { bases: [...bases] } : {}) }]) ? n : null;
}

/** The edit is in the device store (or was refused as invalid): forget the note. Never on a failed store write. */
export function strikeUnsavedEdit(n: number): void {
  const list = read();
  if (list.some((e) => e.n === n)) write(list.filter((e) => e.n !== n));
}

/** The notes left by a page that closed before its edits were stored, oldest first. */
export function unsavedEdits(): Note[] {
  return read().sort((a, b) => a.n - b.n);
}
