/**
 * Push and pull. A push applies each device change exactly once: changes are taken in order, in
 * runs of consecutive changes to the same survey; each run is one transaction that locks the survey
 * row (SELECT … FOR UPDATE) and records every change in `processed_changes` keyed by (device, seq),
 * so a retried, duplicated or concurrent push finds the change already recorded and answers
 * `duplicate`. A crash anywhere rolls the run back whole: no revision without its change record,
 * no change record without its revision. (Runs are the "batch with savepoints" variant without the
 * savepoints: the only per-change database failure, a NUL character, is refused before writing.)
 *
 * A pull pages through the organisation's rows by the id of the transaction that last wrote them
 * (xid8). The cursor it hands back is the oldest transaction still running when it read, so a
 * transaction that commits late is still picked up next time (a row may come twice; never zero times).
 */
import { randomUUID } from 'node:crypto';
import type { Knex } from 'knex';
import { LRUCache } from 'lru-cache';
import type { Logger } from 'pino';
import { isValidEdit, SurveySchema, type Survey } from '@shared/schemas/survey';
import type { Role } from '@shared/api/roles';
import type { Conflict, PullQuery, PullResponse, PushResult, SurveyChange, SurveyStatus } from '@shared/schemas/sync';
import { deepEqual } from '@shared/sync/apply';
import { mergeChange, type FieldRevisions } from '@shared/sync/merge';
import { formatZodIssues } from '@shared/api/format-issues';
import type { Db } from '../db/knex';
import type { AuthContext } from '../http/auth-context';
import * as repo from '../db/repositories/surveys';
import { columnsOf, type ResultsScheduler } from './surveys';
import { pullExtraSources } from './pull-extras';

/** PostgreSQL errors worth retrying the whole run for: serialization failure, deadlock, a racing insert. */
const RETRYABLE = new Set(['40001', '40P01', '23505']);
const MAX_RUN_ATTEMPTS = 5;

interface PgError {
  code?: string;
}

/** Splits changes into runs of consecutive changes to the same survey, keeping their order. */
function runsOf(changes: SurveyChange[]): SurveyChange[][] {
  const runs: SurveyChange[][] = [];
  for (const c of changes) {
    const last = runs[runs.length - 1];
    if (last && last[0].surveyId === c.surveyId) last.push(c);
    else runs.push([c]);
  }
  return runs;
}

interface RunState {
  doc: Survey;
  revision: number;
  revs: FieldRevisions;
  dirty: boolean;
}

interface RunOutcome {
  results: PushResult[];
  conflictIds: string[];
  touched: boolean;
  /** The survey as the run left it in the database, when the run wrote it, and the size of its JSON. */
  written?: { state: KnownSurveyState; jsonBytes: number };
}

/** Thrown when a run's final document is invalid: the run is redone checking every change on its own. */
class CheckEachChange extends Error {}

/**
 * How a run holds the survey. `locked`: in a transaction that locks the survey row first (BEGIN,
 * SELECT … FOR UPDATE, writes, COMMIT). `optimistic`: the usual run of plain edits, in two round
 * trips and no transaction: a read, then one statement that writes everything only if the survey is
 * still at the revision read (else nothing). Anything the optimistic path does not handle — a new
 * survey, a conflict, settling one, a change of vessel, a lost race — throws NeedsLock before
 * anything is written, and the run is done again locked.
 */
type RunMode =
  | { kind: 'locked'; q: Knex.Transaction }
  | {
      kind: 'optimistic';
      q: Db;
      /** The survey as this server last wrote it: the opening read is skipped (see SurveyStateCache). */
      known?: KnownSurveyState;
      /** With `known`: the roles that may push; the write checks the membership itself. */
      roles?: readonly Role[];
    };

/** A survey as stored at a revision: what a run starts from. */
export interface KnownSurveyState {
  orgId: string;
  revision: number;
  doc: Survey;
  revs: FieldRevisions;
  vesselId: string | null;
  status: SurveyStatus;
}

/**
 * The state of each survey as this server last wrote it in a push. A push of plain edits to a survey
 * found here skips its opening read and goes out as one statement that writes only if the survey is
 * still at that revision, the caller is still an active member and none of its changes was recorded
 * before (the change records' unique keys); otherwise nothing is written, the entry is dropped and
 * the run is done again from a fresh read. The documents are kept as parsed back from the JSON text
 * written, so they are exactly what a read would give.
 */
export class SurveyStateCache {
  private readonly entries: LRUCache<string, KnownSurveyState>;

  /** `maxBytes`: a bound on the documents kept, reckoned as four bytes of memory per byte of their JSON. */
  constructor(maxBytes = 128 * 1024 * 1024) {
    this.entries = new LRUCache({ maxSize: maxBytes });
  }
  get(id: string): KnownSurveyState | undefined {
    return this.entries.get(id);
  }
  set(id: string, state: KnownSurveyState, jsonBytes: number): void {
    this.entries.set(id, state, { size: 1024 + 4 * jsonBytes });
  }
  delete(id: string): void {
    this.entries.delete(id);
  }
}

class NeedsLock extends Error {}

/**
 * Why the survey would not be valid, or null. With `from`, the valid survey the run started from,
 * only what the run changed is checked (isValidEdit, exact); the full check runs when that refuses,
 * to word the reason.
 */
function validationReason(doc: Survey, from?: Survey): string | null {
  if (from && isValidEdit(from, doc)) return null;
  const parsed = SurveySchema.safeParse(doc);
  if (parsed.success) return null;
  const issues = formatZodIssues(parsed.error).slice(0, 3);
  return `The survey would not be valid after this change: ${issues.map((i) => `${i.path}: ${i.message}`).join('; ')}.`;
}

/**
 * Applies one run of changes to one survey inside `trx`. Reads and writes are batched: one lock,
 * one look-up of already-processed changes, then bulk inserts of revisions, conflicts and change
 * records, and one update of the survey. Validating the whole survey after every change is the
 * costly part, so the fast path validates the run's final document only; when that fails, the run
 * is redone with `checkEach`, which refuses exactly the changes that break the survey.
 */
async function processRun(
  mode: RunMode,
  auth: AuthContext,
  run: SurveyChange[],
  checkEach: boolean,
  confirm?: (role: Role | null) => unknown,
): Promise<RunOutcome> {
  const trx = mode.q;
  const optimistic = mode.kind === 'optimistic';
  const surveyId = run[0].surveyId;
  const results: PushResult[] = [];
  const conflictIds: string[] = [];
  const known = mode.kind === 'optimistic' ? mode.known : undefined;
  const start: repo.RunStart = known
    ? { memberRole: null, survey: { id: surveyId, ...known }, seen: new Map() }
    : await repo.lockForRun(trx, auth.orgId, surveyId, run, confirm ? auth : undefined, { lock: !optimistic });
  if (!known) confirm?.(start.memberRole);
  const locked = start.survey;
  if (optimistic && !locked) throw new NeedsLock();
  let state: RunState | null = locked ? { doc: locked.doc, revision: locked.revision, revs: locked.revs, dirty: false } : null;
  let linked = locked ? { vesselId: locked.vesselId, vesselName: locked.doc.vessel.name } : undefined;
  let touched = false;

  const seen = start.seen;
  const processed: repo.ProcessedRow[] = [];
  const thisRun = new Map<string, repo.ProcessedRow>();
  const revisions: repo.RevisionRow[] = [];
  const conflictRows: Parameters<typeof repo.insertConflict>[1][] = [];
  const resolutions: { conflictId: string; changeId: string }[] = [];

  const base = (c: SurveyChange) => ({ changeId: c.id, deviceId: c.deviceId, seq: c.seq, surveyId: c.surveyId });
  const authorOf = async (revision: number) =>
    revisions.find((r) => r.revision === revision)?.userId ?? (await repo.revisionAuthor(trx, surveyId, revision));

  for (const change of run) {
    const earlier =
      seen.get(change.id) ??
      [...thisRun.values()].find((p) => p.changeId === change.id || (p.deviceId === change.deviceId && p.seq === change.seq));
    if (earlier) {
      if (earlier.orgId !== auth.orgId) {
        results.push({ ...base(change), status: 'rejected', reason: 'This change id is already in use.' });
      } else {
        results.push({
          ...base(change),
          status: 'duplicate',
          firstStatus: earlier.status,
          revision: earlier.revision ?? undefined,
          conflictIds: earlier.conflictIds.length ? earlier.conflictIds : undefined,
          reason: earlier.reason ?? undefined,
        });
      }
      continue;
    }

    const record = (r: Pick<repo.ProcessedRow, 'status' | 'revision' | 'reason' | 'conflictIds'>) => {
      const row: repo.ProcessedRow = {
        deviceId: change.deviceId,
        seq: change.seq,
        changeId: change.id,
        orgId: auth.orgId,
        surveyId,
        userId: auth.userId,
        ...r,
      };
      processed.push(row);
      thisRun.set(change.id, row);
    };
    const reject = (reason: string) => {
      record({ status: 'rejected', revision: state?.revision ?? null, reason, conflictIds: [] });
      results.push({ ...base(change), status: 'rejected', reason, revision: state?.revision });
    };

    // PostgreSQL cannot store a NUL character in text or jsonb: refuse it here, not with a failed transaction.
    if (JSON.stringify(change.op).includes('\\u0000')) {
      reject('The change holds a character the server cannot store (a NUL character in a text).');
      continue;
    }

    const op = change.op;
    if (optimistic && (op.kind === 'create' || op.kind === 'resolve-conflict')) throw new NeedsLock();
    if (op.kind === 'create') {
      if (state) {
        reject('This survey already exists on the server.');
        continue;
      }
      if (await repo.surveyIdTaken(trx, surveyId)) {
        reject('A survey with this id already exists.');
        continue;
      }
      const columns = await columnsOf(trx, auth.orgId, op.survey, 1, {});
      await repo.insertSurvey(trx, { id: surveyId, orgId: auth.orgId, createdBy: auth.userId, ...columns });
      linked = { vesselId: columns.vesselId, vesselName: op.survey.vessel.name };
      revisions.push({
        surveyId,
        revision: 1,
        orgId: auth.orgId,
        userId: auth.userId,
        deviceId: change.deviceId,
        changeId: change.id,
        changes: [{ entity: 'survey', field: null, old: null, new: 'created' }],
      });
      state = { doc: op.survey, revision: 1, revs: {}, dirty: false };
      record({ status: 'applied', revision: 1, reason: null, conflictIds: [] });
      results.push({ ...base(change), status: 'applied', revision: 1 });
      touched = true;
      continue;
    }

    if (!state) {
      reject('This survey is not on the server for your organisation.');
      continue;
    }

    if (op.kind === 'resolve-conflict') {
      if (mode.kind !== 'locked') throw new NeedsLock();
      const c = await repo.lockConflict(mode.q, auth.orgId, op.conflictId);
      if (!c || c.surveyId !== surveyId) {
        reject('This conflict is not on the server.');
        continue;
      }
      if (c.status === 'resolved' || resolutions.some((r) => r.conflictId === op.conflictId)) {
        reject('This conflict was already settled on another device; the survey shows the value chosen there.');
        continue;
      }
      if (!deepEqual(c.target, op.target)) {
        reject('The choice does not match what the conflict is about.');
        continue;
      }
    }

    const outcome = mergeChange(state.doc, state.revs, change, state.revision + 1);
    if (outcome.status === 'rejected') {
      reject(outcome.reason);
      continue;
    }
    const applied = outcome.changes.length > 0;
    if (applied && checkEach) {
      const invalid = validationReason(outcome.doc);
      if (invalid) {
        reject(invalid);
        continue;
      }
    }

    const revision = applied ? state.revision + 1 : state.revision;
    if (applied) {
      revisions.push({
        surveyId,
        revision,
        orgId: auth.orgId,
        userId: auth.userId,
        deviceId: change.deviceId,
        changeId: change.id,
        changes: outcome.changes,
      });
    }
    if (optimistic && outcome.conflicts.length) throw new NeedsLock();
    const ids: string[] = [];
    for (const d of outcome.conflicts) {
      const id = randomUUID();
      ids.push(id);
      conflictRows.push({
        id,
        orgId: auth.orgId,
        surveyId,
        target: d.target,
        proposed: d.proposed,
        kept: d.kept,
        baseRevision: change.baseRevision,
        keptRevision: d.keptMark.r,
        keptBy: await authorOf(d.keptMark.r),
        keptDeviceId: d.keptMark.d,
        proposedBy: auth.userId,
        proposedDeviceId: change.deviceId,
        changeId: change.id,
      });
    }
    if (op.kind === 'resolve-conflict') resolutions.push({ conflictId: op.conflictId, changeId: change.id });
    record({ status: outcome.status, revision, reason: null, conflictIds: ids });
    results.push({ ...base(change), status: outcome.status, revision, conflictIds: ids.length ? ids : undefined });
    conflictIds.push(...ids);
    if (applied) {
      state = { doc: outcome.doc, revision, revs: outcome.revs, dirty: true };
      touched = true;
    }
  }

  if (state?.dirty && !checkEach && validationReason(state.doc, locked?.doc)) throw new CheckEachChange();

  if (optimistic) {
    // Linking another vessel may insert one: that is for the locked path.
    if (state?.dirty && linked?.vesselName.toLowerCase() !== state.doc.vessel.name.toLowerCase()) throw new NeedsLock();
    // Only changes already recorded: their answers stand whatever happened since.
    if (!processed.length && !revisions.length) return { results, conflictIds, touched };
    const columns = state?.dirty ? await columnsOf(trx, auth.orgId, state.doc, state.revision, state.revs, linked) : undefined;
    const docJson = columns ? JSON.stringify(columns.doc) : undefined;
    const member = known && confirm ? (mode.kind === 'optimistic' && mode.roles ? { userId: auth.userId, orgId: auth.orgId, roles: mode.roles } : undefined) : undefined;
    if (known && confirm && !member) throw new NeedsLock();
    // Written only while the survey is still at the revision read; otherwise nothing is written at all.
    const written = await repo.insertRunWrites(trx, {
      revisions,
      processed,
      survey: columns ? { id: surveyId, columns, docJson } : undefined,
      onlyAtRevision: locked!.revision,
      orgId: auth.orgId,
      member,
    });
    if (!written.guardHeld) throw new NeedsLock();
    if (member) confirm?.(written.memberRole);
    return { results, conflictIds, touched, written: stateAfter(auth, locked!, state!, columns, docJson) };
  }

  for (const c of conflictRows) await repo.insertConflict(trx, c);
  for (const r of resolutions) await repo.markConflictResolved(trx, r.conflictId, auth.userId, r.changeId);
  const columns = state?.dirty ? await columnsOf(trx, auth.orgId, state.doc, state.revision, state.revs, linked) : undefined;
  const docJson = columns ? JSON.stringify(columns.doc) : undefined;
  const survey = columns ? { id: surveyId, columns, docJson } : undefined;
  // Another transaction recorded one of these changes since our look-up: redo the run to answer 'duplicate'.
  if ((await repo.insertRunWrites(trx, { revisions, processed, survey })).inserted < processed.length) {
    throw Object.assign(new Error('change recorded concurrently'), { code: '23505' });
  }
  const written = locked && state ? stateAfter(auth, locked, state, columns, docJson) : undefined;
  return { results, conflictIds, touched: touched || conflictIds.length > 0, written };
}

/** The survey as a run left it: the document as parsed back from the text written, so equal to a fresh read. */
function stateAfter(
  auth: AuthContext,
  before: repo.SurveyState,
  state: RunState,
  columns: repo.SurveyColumns | undefined,
  docJson: string | undefined,
): RunOutcome['written'] {
  if (!columns || !docJson) return undefined;
  const revsJson = JSON.stringify(state.revs);
  return {
    state: {
      orgId: auth.orgId,
      revision: state.revision,
      doc: JSON.parse(docJson) as Survey,
      revs: JSON.parse(revsJson) as FieldRevisions,
      vesselId: columns.vesselId,
      status: before.status,
    },
    jsonBytes: docJson.length + revsJson.length,
  };
}

export interface PushOutcome {
  results: PushResult[];
  conflicts: Conflict[];
}

export async function push(
  db: Db,
  auth: AuthContext,
  changes: SurveyChange[],
  opts: {
    scheduler?: ResultsScheduler;
    logger?: Logger;
    /** Check the caller's membership in the first run's opening query and hand the role found to this (see listSurveys). */
    confirm?: (role: Role | null) => unknown;
    /** The roles that may push (with `confirm`): lets a run skip its opening read, checking the membership as it writes. */
    roles?: readonly Role[];
    /** Surveys as this server last wrote them (see SurveyStateCache). */
    known?: SurveyStateCache;
  } = {},
): Promise<PushOutcome> {
  const results: PushResult[] = [];
  const conflictIds: string[] = [];
  let confirm = opts.confirm;
  for (const run of runsOf(changes)) {
    const surveyId = run[0].surveyId;
    let checkEach = false;
    // From the survey as last written, else from a fresh read, else locked: each step writes nothing when it gives up.
    const cached = opts.known?.get(surveyId);
    let how: 'known' | 'read' | 'locked' = cached?.orgId === auth.orgId ? 'known' : 'read';
    for (let attempt = 1; ; attempt++) {
      try {
        const out =
          how === 'locked'
            ? await db.transaction((trx) => processRun({ kind: 'locked', q: trx }, auth, run, checkEach, confirm))
            : await processRun(
                { kind: 'optimistic', q: db, known: how === 'known' ? cached : undefined, roles: opts.roles },
                auth,
                run,
                checkEach,
                confirm,
              );
        confirm = undefined;
        if (out.written) opts.known?.set(surveyId, out.written.state, out.written.jsonBytes);
        results.push(...out.results);
        conflictIds.push(...out.conflictIds);
        if (out.touched) opts.scheduler?.schedule(surveyId);
        break;
      } catch (err) {
        opts.known?.delete(surveyId);
        if (err instanceof CheckEachChange && !checkEach) {
          checkEach = true;
          if (how === 'known') how = 'read';
          continue;
        }
        const code = (err as PgError).code;
        // (23503: a vessel the remembered state links to is gone.)
        if (how !== 'locked' && (err instanceof NeedsLock || (code && (RETRYABLE.has(code) || code === '23503')))) {
          // Nothing was written: do the run again from a fresh read, then locked.
          how = how === 'known' ? 'read' : 'locked';
          attempt--;
          continue;
        }
        if (!code || !RETRYABLE.has(code) || attempt >= MAX_RUN_ATTEMPTS) throw err;
        opts.logger?.debug({ code, attempt }, 'push run retried');
        await new Promise((r) => setTimeout(r, 5 * attempt + Math.random() * 20));
      }
    }
  }
  return { results, conflicts: await repo.findConflicts(db, auth.orgId, conflictIds) };
}

// ---- pull ----

interface Cursor {
  floor: string;
  after?: [string, string];
}

function parseCursor(s: string): Cursor {
  const [floor, xid, id] = s.split(':');
  return xid && id ? { floor, after: [xid, id] } : { floor };
}

const minXid = (a: string, b: string) => (BigInt(a) <= BigInt(b) ? a : b);

export async function pull(db: Db, auth: AuthContext, q: PullQuery): Promise<PullResponse> {
  const cursor = parseCursor(q.cursor);
  return db.transaction(
    async (trx) => {
      const xmin = await repo.snapshotXmin(trx);
      const rows = await repo.surveysChangedSince(trx, auth.orgId, cursor.after ? { after: cursor.after } : { floor: cursor.floor }, q.limit + 1);
      const hasMore = rows.length > q.limit;
      const page = rows.slice(0, q.limit);
      // Carry forward the lowest "still running" mark seen during the paging, so nothing is skipped.
      const floor = cursor.after ? minXid(cursor.floor, xmin) : xmin;
      const last = page[page.length - 1];
      const next = hasMore ? `${floor}:${last.xid}:${last.id}` : floor;

      // Conflicts and extras come with the first page of a round (they are small).
      const first = !cursor.after;
      const conflicts = first ? await repo.conflictsSince(trx, auth.orgId, cursor.floor) : [];
      const extras: Record<string, unknown[]> = {};
      if (first) {
        for (const [name, source] of Object.entries(pullExtraSources)) {
          extras[name] = await source(trx, { orgId: auth.orgId, userId: auth.userId, role: auth.role, sinceXid: cursor.floor });
        }
      }
      return {
        cursor: next,
        hasMore,
        surveys: page.map(({ xid: _xid, ...s }) => s),
        conflicts,
        extras,
        serverTime: new Date().toISOString(),
      };
    },
    { isolationLevel: 'repeatable read', readOnly: true },
  );
}
