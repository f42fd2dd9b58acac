/**
 * Push: applies each device change exactly once. Changes are taken in order, in runs of consecutive
 * changes to the same survey; every change is recorded in `processed_changes` keyed by (owner, device, seq),
 * so a retried, duplicated or concurrent push finds the change already recorded and answers
 * `duplicate`. Each run climbs a ladder, each step writing nothing when it gives up: from the survey
 * as this server last wrote it (SurveyStateCache), else from a fresh read, else locked (run.ts). A
 * locked run is one transaction: a crash anywhere rolls it back whole, so there is no revision
 * without its change record and no change record without its revision. (Runs are the "batch with
 * savepoints" variant without the savepoints: the only per-change database failure, a NUL
 * character, is refused before writing.) Serialization failures, deadlocks and racing inserts
 * retry the run with a short random wait.
 */
import type { Logger } from 'pino';
import type { Role } from '@shared/api/roles';
import type { Conflict, PushResult, SurveyChange } from '@shared/schemas/sync';
import type { Db } from '../../db/knex';
import type { AuthContext } from '../../http/auth-context';
import { findConflicts } from '../../db/repositories/conflicts';
import type { ResultsScheduler } from '../results-scheduler';
import { CheckEachChange, runFromKnown, runFromRead, runLocked, type ConfirmMembership, type RunAttempt } from './run';
import { NeedsLock, type RunOutcome } from './writes';
import type { KnownSurveyState, SurveyStateCache } from './state-cache';
import type { DeviceOwners } from './device-owners';
import { refuseReviewersEdits, type SurveyMakers } from '../editing';

/** PostgreSQL errors worth retrying the whole run for: serialization failure, deadlock, a racing insert. */
const RETRYABLE = new Set(['40001', '40P01', '23505']);
const MAX_RUN_ATTEMPTS = 5;

export interface PushOutcome {
  results: PushResult[];
  conflicts: Conflict[];
}

export interface PushOptions {
  scheduler?: ResultsScheduler;
  logger?: Logger;
  /** Check the caller's membership in the first run's opening query and hand the role found to this (see listSurveys). */
  confirm?: ConfirmMembership;
  /** The roles that may push (with `confirm`): lets a run skip its opening read, checking the membership as it writes. */
  roles?: readonly Role[];
  /** Surveys as this server last wrote them. */
  known?: SurveyStateCache;
  /** Device owners: a push with another person's device id is refused before anything runs. */
  devices?: DeviceOwners;
  /** Who made each survey, for the reviewer's read-only rule. */
  makers?: SurveyMakers;
}

/**
 * Splits changes into runs of consecutive changes to the same survey, keeping their order. A
 * "Send for review" (`submit`) is a run of its own: it moves the status the edits before it left
 * (the database moves a reviewed survey to "changed since review" as they are written), and edits
 * after it start again from the status it set.
 */
export function runsOf(changes: SurveyChange[]): SurveyChange[][] {
  const runs: SurveyChange[][] = [];
  let alone = false;
  for (const c of changes) {
    const last = runs[runs.length - 1];
    const submit = c.op.kind === 'submit';
    if (last && !alone && !submit && last[0].surveyId === c.surveyId) last.push(c);
    else runs.push([c]);
    alone = submit;
  }
  return runs;
}

export async function push(db: Db, auth: AuthContext, changes: SurveyChange[], opts: PushOptions = {}): Promise<PushOutcome> {
  const results: PushResult[] = [];
  const conflictIds: string[] = [];
  if (changes.length) await opts.devices?.check(auth, changes.map((c) => c.deviceId));
  // "Send for review" is no edit, and a new survey is the caller's own
  await refuseReviewersEdits(db, auth, changes.filter((c) => c.op.kind !== 'submit' && c.op.kind !== 'create').map((c) => c.surveyId), opts.makers);
  let confirm = opts.confirm;
  for (const run of runsOf(changes)) {
    const out = await pushRun(db, { auth, run, checkEach: false, confirm }, opts);
    // The membership is confirmed by the first run's query; later runs need not ask again.
    confirm = undefined;
    results.push(...out.results);
    conflictIds.push(...out.conflictIds);
  }
  return { results, conflicts: await findConflicts(db, auth.orgId, conflictIds) };
}

type Step = 'known' | 'read' | 'locked';

/** One run up the ladder, with retries; remembers what it wrote and schedules the results. */
async function pushRun(db: Db, a: RunAttempt, opts: PushOptions): Promise<RunOutcome> {
  const surveyId = a.run[0].surveyId;
  const cached = opts.known?.get(surveyId);
  let step: Step = cached?.orgId === a.auth.orgId ? 'known' : 'read';
  for (let attempt = 1; ; attempt++) {
    try {
      const out = await attemptRun(db, step, a, cached, opts.roles);
      if (out.written) opts.known?.set(surveyId, out.written.state, out.written.jsonBytes);
      if (out.touched) opts.scheduler?.schedule(surveyId);
      return out;
    } catch (err) {
      opts.known?.delete(surveyId);
      const next = afterFailure(err, step, a, attempt);
      if (next.free) attempt--;
      step = next.step;
      if (next.wait) {
        opts.logger?.debug({ code: (err as PgError).code, attempt }, 'push run retried');
        await new Promise((r) => setTimeout(r, 5 * attempt + Math.random() * 20));
      }
    }
  }
}

function attemptRun(db: Db, step: Step, a: RunAttempt, cached: KnownSurveyState | undefined, roles?: readonly Role[]): Promise<RunOutcome> {
  if (step === 'known') return runFromKnown(db, a, cached!, roles);
  if (step === 'read') return runFromRead(db, a);
  return runLocked(db, a);
}

interface PgError {
  code?: string;
}

/**
 * What to do after a failed attempt, or throw: the next step, whether it spends no attempt (`free`),
 * and whether to wait before it. (23503 on an optimistic step: a vessel the remembered state links
 * to is gone.)
 */
function afterFailure(err: unknown, step: Step, a: RunAttempt, attempt: number): { step: Step; free: boolean; wait: boolean } {
  if (err instanceof CheckEachChange && !a.checkEach) {
    a.checkEach = true;
    return { step: step === 'known' ? 'read' : step, free: false, wait: false };
  }
  const code = (err as PgError).code;
  if (step !== 'locked' && (err instanceof NeedsLock || (code && (RETRYABLE.has(code) || code === '23503')))) {
    // Nothing was written: do the run again from a fresh read, then locked.
    return { step: step === 'known' ? 'read' : 'locked', free: true, wait: false };
  }
  if (!code || !RETRYABLE.has(code) || attempt >= MAX_RUN_ATTEMPTS) throw err;
  return { step, free: false, wait: true };
}
