/**
 * Reads and writes of surveys on the device. Reads are reactive (`useLiveQuery`) and live in
 * ./local-surveys.ts (Dexie only: a screen that only lists surveys loads no validation); they are
 * re-exported here. Every write goes through `createLocalSurvey` / `applyLocalChange`, which change
 * the document and append the edit to the outbox in ONE Dexie transaction — no network inside, so an edit is either fully kept or
 * not made at all, even if the phone dies mid-write. Sync (./sync.ts) does the rest.
 */
import { isValidEdit, SurveySchema, type Survey } from '@shared/schemas/survey';
import {
  SurveyOpSchema,
  type ConflictTarget,
  type SurveyOp,
  type PulledSurvey,
  type UserRef,
} from '@shared/schemas/sync';
import { applyOp, changedFields, deepEqual, findEntity, leanOp, replay } from '@shared/sync/apply';
import { formatZodIssues } from '@shared/api/format-issues';
import { clearStorageError, reportStorageError } from './storage';
import { db, getDeviceId, type LocalSurvey } from './db';
import { upgradeSurvey } from '@shared/schemas/upgrade';
import { shareUnchanged } from '@client/lib/share-unchanged';
import { rememberedUserId } from '@client/lib/identity';
import { noteUnsavedEdit, strikeUnsavedEdit, unsavedEdits } from './unsaved-edits';
import { rebaseEdit } from './rebase-edit';

export {
  dismissRejectedChange,
  getLocalSurvey,
  useAllOpenConflicts,
  useConflicts,
  useLocalSurvey,
  useLocalSurveys,
  usePendingCount,
  useRejectedChanges,
} from './local-surveys';

/** An edit that would leave the survey invalid; nothing was written. */
export class LocalChangeError extends Error {
  constructor(
    message: string,
    readonly details: { path: string; message: string }[] = [],
  ) {
    super(message);
    this.name = 'LocalChangeError';
  }
}

type Listener = () => void;
const listeners = new Set<Listener>();

/** Called after every local write commits (sync uses it to push soon). */
export function subscribeLocalChanges(fn: Listener): () => void {
  listeners.add(fn);
  return () => listeners.delete(fn);
}
const notify = () => listeners.forEach((fn) => fn());
/** For writes kept outside the survey (replies to reviewers): sync pushes them soon, as after any edit. */
export const announceLocalChange = notify;

/**
 * The survey after an edit, if valid. Only what the edit changed is checked (isValidEdit, exact given
 * that `prev` is valid, as every stored survey is): re-parsing a 2,000-boundary ship on every sounding
 * held a phone's main thread for over a second. Where that check refuses, the full parse says why.
 */
function validEdit(prev: Survey, next: Survey): Survey {
  return isValidEdit(prev, next) ? next : validate(next);
}

function validate(doc: Survey): Survey {
  const parsed = SurveySchema.safeParse(doc);
  if (!parsed.success) {
    const details = formatZodIssues(parsed.error);
    throw new LocalChangeError(`This change would leave the survey invalid: ${details[0]?.path ?? ''} ${details[0]?.message ?? ''}`.trim(), details);
  }
  return parsed.data;
}

const vesselNameOf = (doc: Survey) => doc.vessel.name;

/** Runs a write; a failure that is not the user's (a full disk, a broken store) is also reported to the storage panel. */
async function write<T>(fn: () => Promise<T>): Promise<T> {
  try {
    return await fn();
  } catch (err) {
    if (!(err instanceof LocalChangeError)) reportStorageError(err);
    throw err;
  }
}

/** Puts a new survey on this device and queues its creation on the server. */
export async function createLocalSurvey(survey: Survey, opts: { owner?: UserRef } = {}): Promise<string> {
  const doc = validate(survey);
  const userId = rememberedUserId() ?? undefined;
  const deviceId = await getDeviceId(userId ?? null);
  const now = new Date().toISOString();
  await write(() => db.transaction('rw', db.surveys, db.outbox, async () => {
    if (await db.surveys.get(doc.id)) throw new LocalChangeError('A survey with this id is already on this device.');
    await db.surveys.add({
      id: doc.id,
      doc,
      serverDoc: null,
      serverRevision: 0,
      status: 'draft',
      title: doc.title,
      vesselName: vesselNameOf(doc),
      updatedAt: now,
      ownerUserId: opts.owner?.id ?? null,
      createdBy: opts.owner ?? null,
    });
    await db.outbox.add({
      id: crypto.randomUUID(),
      deviceId,
      userId,
      surveyId: doc.id,
      baseRevision: 0,
      createdAt: now,
      op: { kind: 'create', survey: doc },
      state: 'pending',
    });
  }));
  notify();
  return doc.id;
}

/**
 * What is queued for an edit: an upsert of an existing entity that changed one field goes as a lean
 * `patch` of the part that changed (a sounding, not the whole condition); otherwise the upsert gets
 * `fields`, the fields of the entity this edit actually changed (empty: nothing changed).
 */
function queuedOp(doc: Survey, op: SurveyOp): SurveyOp {
  if (op.kind !== 'upsert') return op;
  const before = findEntity(doc, op.collection, op.entity.id);
  if (!before) return { ...op, fields: undefined };
  const lean = leanOp(before, op);
  return lean.kind === 'patch' ? lean : { ...op, fields: changedFields(before, op.entity) };
}

/**
 * Applies edits to a survey on this device and queues them for the server, all in one transaction.
 * Each edit must leave a valid survey (the server checks the same); on error nothing is written.
 * `bases[i]`, when given, is edit i as its form started (or last saved): only what changed since is
 * written over what the device holds by then (./rebase-edit.ts), so a form opened on an older copy
 * never puts older values back. Returns the ids of the queued changes.
 */
export async function applyLocalChanges(surveyId: string, ops: SurveyOp[], bases: readonly (SurveyOp | undefined)[] = []): Promise<string[]> {
  const parsedOps = ops.map((op) => {
    const r = SurveyOpSchema.safeParse(op);
    if (!r.success) throw new LocalChangeError('This change is not valid.', formatZodIssues(r.error));
    if (r.data.kind === 'create') throw new LocalChangeError('Use createLocalSurvey to create a survey.');
    return r.data;
  });
  // Noted before the first wait: a page closing now still keeps the edit (./unsaved-edits.ts).
  const note = parsedOps.some((op) => op.kind === 'resolve-conflict') ? null : noteUnsavedEdit(surveyId, parsedOps, bases);
  try {
    // edits held earlier go in first, so this one never lands under an older value
    await storeHeldEdits();
    const ids = await storeLocalChanges(surveyId, parsedOps, bases);
    if (note !== null) strikeUnsavedEdit(note);
    return ids;
  } catch (err) {
    if (note === null) throw err;
    if (err instanceof LocalChangeError) {
      strikeUnsavedEdit(note); // refused as invalid: the form says why and keeps what was typed
      throw err;
    }
    // the store failed (full disk, broken store): the note stays, so the edit is not lost
    heldNotes.add(note);
    throw new HeldEditError(reportStorageError(err, true), { cause: err });
  }
}

/**
 * The store write failed but the edit is kept in its note (./unsaved-edits.ts) and goes in with the
 * next edit on this page, or at the next start (`replayUnsavedEdits`). Its message says so.
 */
export class HeldEditError extends Error {
  constructor(message: string, options?: { cause?: unknown }) {
    super(message, options);
    this.name = 'HeldEditError';
  }
}

/** Notes of edits this page could not store (a failed write); stored first at the next edit. */
const heldNotes = new Set<number>();

/** Stores the held edits, oldest first; throws (keeping the rest held) if the store still fails. */
async function storeHeldEdits(): Promise<void> {
  if (heldNotes.size === 0) return;
  const notes = unsavedEdits();
  for (const n of [...heldNotes]) if (!notes.some((e) => e.n === n)) heldNotes.delete(n); // stored elsewhere
  for (const e of notes) {
    if (!heldNotes.has(e.n)) continue;
    try {
      await storeLocalChanges(e.surveyId, e.ops, e.bases ?? []);
    } catch (err) {
      // as at start: an edit the survey no longer takes is dropped, a failing store keeps it
      if (!(err instanceof LocalChangeError)) throw err;
    }
    strikeUnsavedEdit(e.n);
    heldNotes.delete(e.n);
  }
  if (heldNotes.size === 0) clearStorageError(); // the "held, not yet stored" message is no longer true
}

/**
 * Applies the edits a page noted but could not store before it closed (see ./unsaved-edits.ts);
 * called once at start, before the first sync. Returns how many were applied.
 */
export async function replayUnsavedEdits(): Promise<number> {
  let applied = 0;
  for (const e of unsavedEdits()) {
    try {
      applied += (await storeLocalChanges(e.surveyId, e.ops, e.bases ?? [])).length;
    } catch (err) {
      // a broken store keeps the note for the next start; an edit the survey no longer takes is dropped
      if (!(err instanceof LocalChangeError)) throw err;
    }
    strikeUnsavedEdit(e.n);
  }
  if (applied > 0) notify();
  return applied;
}

/** `op` with only what changed since `base` put over the survey as it is now (see ./rebase-edit.ts). */
function rebasedOp(doc: Survey, op: SurveyOp, base: SurveyOp | undefined): SurveyOp {
  if (op.kind === 'set' && base?.kind === 'set' && base.path === op.path) {
    return { ...op, value: rebaseEdit(doc[op.path], base.value, op.value) } as SurveyOp;
  }
  if (op.kind === 'upsert' && base?.kind === 'upsert' && base.collection === op.collection && base.entity.id === op.entity.id) {
    const current = findEntity(doc, op.collection, op.entity.id);
    if (current) return { ...op, entity: rebaseEdit(current, base.entity, op.entity) } as SurveyOp;
  }
  return op;
}

/** A `set` to the value the survey already has changes nothing (so a replayed edit queues nothing). */
const unchangedSet = (doc: Survey, op: SurveyOp) => op.kind === 'set' && deepEqual(doc[op.path], op.value);

async function storeLocalChanges(surveyId: string, parsedOps: readonly SurveyOp[], bases: readonly (SurveyOp | undefined)[]): Promise<string[]> {
  const userId = rememberedUserId() ?? undefined;
  const deviceId = await getDeviceId(userId ?? null);
  const ids: string[] = [];
  await write(() => db.transaction('rw', db.surveys, db.outbox, async () => {
    const local = await db.surveys.get(surveyId);
    if (!local) throw new LocalChangeError('This survey is not on this device.');
    let doc = local.doc;
    const now = new Date().toISOString();
    for (const [i, raw] of parsedOps.entries()) {
      const op = queuedOp(doc, rebasedOp(doc, raw, bases[i]));
      if ((op.kind === 'upsert' && op.fields && op.fields.length === 0) || unchangedSet(doc, op)) continue; // nothing changed
      doc = validEdit(doc, applyOp(doc, op));
      const id = crypto.randomUUID();
      ids.push(id);
      await db.outbox.add({
        id,
        deviceId,
        userId,
        surveyId,
        baseRevision: local.serverRevision,
        createdAt: now,
        op,
        state: 'pending',
      });
    }
    if (ids.length > 0) {
      // the whole row put back as read: `update` would read the row (both documents) a second time
      await db.surveys.put({ ...local, doc, title: doc.title, vesselName: vesselNameOf(doc), updatedAt: now });
    }
  }));
  if (ids.length > 0) notify();
  return ids;
}

/** Applies one edit on this device and queues it (see applyLocalChanges, also for `base`). Returns the change id, or null if it changed nothing. */
export async function applyLocalChange(surveyId: string, op: SurveyOp, base?: SurveyOp): Promise<string | null> {
  const [id] = await applyLocalChanges(surveyId, [op], [base]);
  return id ?? null;
}

/**
 * Settles a conflict with the chosen value (`conflict.kept`, `conflict.proposed`, or anything else
 * valid for its target): the survey on this device takes it at once, and the choice is queued for
 * the server like any other edit.
 */
export async function resolveConflict(conflictId: string, value: unknown): Promise<void> {
  const conflict = await db.conflicts.get(conflictId);
  if (!conflict) throw new LocalChangeError('This conflict is no longer on this device.');
  const target: ConflictTarget = conflict.target;
  await db.transaction('rw', [db.surveys, db.outbox, db.conflicts, db.meta], async () => {
    await applyLocalChanges(conflict.surveyId, [{ kind: 'resolve-conflict', conflictId, target, value: value ?? null }]);
    await db.conflicts.update(conflictId, { status: 'resolved', resolving: 1, resolvedAt: new Date().toISOString() });
  });
}

/**
 * The server's document of a pulled survey, checked. It is shared with the copy this device already
 * holds (the server's last copy, else the working one: both were checked when stored), so
 * `isValidEdit` checks only what moved since, exactly as a full parse would; where it refuses, the
 * full parse runs and throws why (the pull then fails as before and nothing is stored). A full
 * parse of a 2,000-boundary survey held a phone's main thread for over a second after every push.
 */
export function checkedServerDoc(local: Pick<LocalSurvey, 'doc' | 'serverDoc'> | undefined, raw: unknown): Survey {
  const doc = upgradeSurvey(raw);
  const base = local?.serverDoc ?? local?.doc;
  if (base && typeof doc === 'object' && doc !== null && !Array.isArray(doc)) {
    const shared = shareUnchanged<unknown>(base, doc) as Survey;
    if (isValidEdit(base, shared)) return shared;
  }
  return SurveySchema.parse(doc);
}

/**
 * Takes the server's copies into the store without losing local work: each document becomes the
 * server copy with this device's pending edits replayed on top. Called by sync after a pull; each
 * document is checked here (`checkedServerDoc`), so a bad one stores nothing.
 */
export async function mergeServerSurveys(list: PulledSurvey[]): Promise<void> {
  if (list.length === 0) return;
  await db.transaction('rw', db.surveys, db.outbox, async () => {
    for (const s of list) {
      const local = await db.surveys.get(s.id);
      if (local && local.serverRevision > s.revision) continue;
      const serverDoc = checkedServerDoc(local, s.doc);
      const pending = await db.outbox.where({ surveyId: s.id, state: 'pending' }).sortBy('seq');
      const doc = replay(serverDoc, pending.map((e) => e.op)) ?? serverDoc;
      await db.surveys.put({
        id: s.id,
        doc,
        serverDoc,
        serverRevision: s.revision,
        status: s.status,
        title: doc.title,
        vesselName: vesselNameOf(doc),
        updatedAt: pending.length > 0 && local ? local.updatedAt : s.updatedAt,
        ownerUserId: local?.ownerUserId ?? s.createdBy.id,
        createdBy: s.createdBy,
      });
    }
  });
}

/** Recomputes one survey's local document after the outbox lost entries (a refused change). */
export async function rebaseLocalSurvey(surveyId: string): Promise<void> {
  await db.transaction('rw', db.surveys, db.outbox, async () => {
    const local = await db.surveys.get(surveyId);
    if (!local) return;
    const pending = await db.outbox.where({ surveyId, state: 'pending' }).sortBy('seq');
    const doc = replay(local.serverDoc, pending.map((e) => e.op));
    // A survey the server never accepted keeps its last document on the device: never drop work.
    if (doc) await db.surveys.update(surveyId, { doc, title: doc.title, vesselName: vesselNameOf(doc) });
  });
}
