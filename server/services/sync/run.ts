/**
 * One attempt at one run, in one of three ways, each reading what the plan needs, planning, then
 * writing: from the survey as this server last wrote it (no read), from a fresh read (no
 * transaction), or locked (a transaction that locks the survey row first). The first two throw
 * NeedsLock, having written nothing, for anything only the locked way handles.
 */
import { randomUUID } from 'node:crypto';
import type { Knex } from 'knex';
import type { Role } from '@shared/api/roles';
import type { SurveyChange } from '@shared/schemas/sync';
import type { Db } from '../../db/knex';
import type { AuthContext } from '../../http/auth-context';
import { lockForRun } from '../../db/repositories/push-writes';
import { surveyIdTaken } from '../../db/repositories/surveys';
import { lockConflicts } from '../../db/repositories/conflicts';
import { planRun, type PlanInput, type PlanOutcome, type RunPlan, type StartSurvey } from './plan';
import { NeedsLock, writeLocked, writeOptimistic, type RunOutcome } from './writes';
import type { KnownSurveyState } from './state-cache';
import { unauthorized } from '../../errors';

/** The run's final document is invalid: do it again checking every change on its own. */
export class CheckEachChange extends Error {}

/** Hands the caller's role found by a run's own query to the route (see `checksMembership`). */
export type ConfirmMembership = (role: Role | null) => unknown;

export interface RunAttempt {
  auth: AuthContext;
  run: SurveyChange[];
  checkEach: boolean;
  confirm?: ConfirmMembership;
}

function planned(outcome: PlanOutcome): RunPlan {
  if (outcome.kind === 'needs-lock') throw new NeedsLock();
  if (outcome.kind === 'check-each') throw new CheckEachChange();
  return outcome;
}

const planOf = (a: RunAttempt, rest: Pick<PlanInput, 'survey' | 'seen' | 'mode'> & Partial<PlanInput>) =>
  planned(planRun({ orgId: a.auth.orgId, userId: a.auth.userId, run: a.run, checkEach: a.checkEach, newId: randomUUID, ...rest }));

/**
 * From the survey as this server last wrote it: no opening read; the write checks the revision and,
 * with `confirm`, the caller's membership (one of `roles`) in the same statement.
 */
export async function runFromKnown(db: Db, a: RunAttempt, known: KnownSurveyState, roles?: readonly Role[]): Promise<RunOutcome> {
  const plan = planOf(a, { survey: known, seen: new Map(), mode: 'optimistic' });
  const { auth, confirm } = a;
  const member = confirm && roles ? { userId: auth.userId, orgId: auth.orgId, sessionId: auth.sessionId, roles } : undefined;
  if (confirm && !member && (plan.processed.length || plan.revisions.length)) throw new NeedsLock();
  const { memberRole, ...out } = await writeOptimistic(db, auth, a.run[0].surveyId, known, plan, member);
  if (member && memberRole !== undefined) confirm?.(memberRole);
  return out;
}

/** From a fresh read (with `confirm`, the same query checks the caller's membership), without a transaction. */
export async function runFromRead(db: Db, a: RunAttempt): Promise<RunOutcome> {
  const surveyId = a.run[0].surveyId;
  const start = await lockForRun(db, a.auth, surveyId, a.run, a.confirm ? a.auth : undefined, { lock: false });
  a.confirm?.(start.memberRole);
  if (!start.survey) throw new NeedsLock();
  const plan = planOf(a, { survey: start.survey, seen: start.seen, mode: 'optimistic' });
  return writeOptimistic(db, a.auth, surveyId, start.survey, plan);
}

/** In a transaction that locks the survey row and the conflicts the run settles before planning. */
export async function runLocked(db: Db, a: RunAttempt): Promise<RunOutcome> {
  return db.transaction(async (trx) => {
    const surveyId = a.run[0].surveyId;
    // The role the plan judges a move by is the stored membership's (read in the same statement), never the token's.
    const start = await lockForRun(trx, a.auth, surveyId, a.run, a.auth, { lock: true });
    a.confirm?.(start.memberRole);
    if (!start.memberRole) throw unauthorized();
    const plan = planOf(a, { survey: start.survey, seen: start.seen, mode: 'locked', role: start.memberRole, ...(await lockedInputs(trx, a, start.survey)) });
    return writeLocked(trx, a.auth, surveyId, start.survey, plan);
  });
}

/** What only a locked plan needs: whether a new survey's id is taken, and the conflicts the run settles (locked). */
async function lockedInputs(trx: Knex.Transaction, a: RunAttempt, survey: StartSurvey | undefined): Promise<Pick<PlanInput, 'idTaken' | 'conflicts'>> {
  const creates = a.run.some((c) => c.op.kind === 'create');
  const idTaken = !survey && creates ? await surveyIdTaken(trx, a.run[0].surveyId) : false;
  const ids = new Set(a.run.flatMap((c) => (c.op.kind === 'resolve-conflict' ? [c.op.conflictId] : [])));
  return { idTaken, conflicts: await lockConflicts(trx, a.auth.orgId, [...ids]) };
}
