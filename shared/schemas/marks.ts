/**
 * Marks on figures: which values of an entity are assumed (a default the surveyor has not confirmed)
 * or estimated (judged rather than measured). Keys are the field's path inside its entity, dot
 * separated (`stiffening.sectionModulusM3`, `shores.<id>.section`, `drafts.forwardM`, `level`);
 * confirming an assumed value removes its mark. Optional everywhere, so every older document parses.
 * IMO numbers are checked here too, because the vessel form and the import share the rule.
 */
import { z } from 'zod';
import { capMessage, SURVEY_LIMITS } from './limits';

export const FIGURE_MARKS = ['assumed', 'estimated'] as const;
export type FigureMark = (typeof FIGURE_MARKS)[number];

export const MarksSchema = z
  .record(z.string().min(1).max(200), z.enum(FIGURE_MARKS))
  .refine((marks) => Object.keys(marks).length <= SURVEY_LIMITS.marks, capMessage(SURVEY_LIMITS.marks, 'marks'));
export type Marks = z.infer<typeof MarksSchema>;

/** The mark on one field, if any. */
export function markOf(marks: Marks | undefined, field: string): FigureMark | undefined {
  return marks?.[field];
}

/** Marks with one field set to `mark`, or cleared when `mark` is undefined (a new object, never changed in place). */
export function withMark(marks: Marks | undefined, field: string, mark: FigureMark | undefined): Marks | undefined {
  const next: Marks = { ...(marks ?? {}) };
  if (mark === undefined) delete next[field];
  else next[field] = mark;
  return Object.keys(next).length > 0 ? next : undefined;
}

/**
 * Whether a 7-digit IMO ship identification number passes its check digit: the first six digits
 * weighted 7, 6, 5, 4, 3, 2 and summed; the last digit of the sum is the seventh digit
 * (IMO Resolution A.1117(30), the IMO ship identification number scheme).
 */
export function imoCheckDigitOk(imo: string): boolean {
  if (!/^\d{7}$/.test(imo)) return false;
  let sum = 0;
  for (let i = 0; i < 6; i++) sum += Number(imo[i]) * (7 - i);
  return sum % 10 === Number(imo[6]);
}

/** The value at a marks key inside an entity; inside an array, a segment is the element's id. */
export function fieldAt(entity: unknown, field: string): unknown {
  let cur: unknown = entity;
  for (const key of field.split('.')) {
    if (Array.isArray(cur)) cur = cur.find((e: unknown) => typeof e === 'object' && e !== null && (e as { id?: unknown }).id === key);
    else if (cur !== null && typeof cur === 'object') cur = (cur as Record<string, unknown>)[key];
    else return undefined;
  }
  return cur;
}

/**
 * An edit settles assumptions: a field marked "assumed" whose value the edit changed now holds what
 * the surveyor entered, so its mark goes; a field that is now empty loses any mark.
 */
export function settleMarks(marks: Marks | undefined, before: unknown, after: unknown): Marks | undefined {
  if (!marks) return undefined;
  let next: Marks | undefined = marks;
  for (const [field, mark] of Object.entries(marks)) {
    const now = fieldAt(after, field);
    const gone = now === undefined;
    const was = fieldAt(before, field);
    // a field the edit brings in keeps its mark (a new shore starts from assumed values)
    const changed = mark === 'assumed' && was !== undefined && JSON.stringify(now) !== JSON.stringify(was);
    if (gone || changed) next = withMark(next, field, undefined);
  }
  return next;
}
