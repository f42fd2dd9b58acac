/**
 * Writing a planned run. Optimistic: no transaction, one statement that writes everything only while
 * the survey is still at the revision the plan started from (else nothing, and NeedsLock). Locked:
 * inside the run's transaction, after the survey row was locked: the new survey, its conflicts and
 * settlements, then the same one statement.
 */
import type { Knex } from 'knex';
import type { Role } from '@shared/api/roles';
import type { Survey } from '@shared/schemas/survey';
import type { PushResult } from '@shared/schemas/sync';
import type { FieldRevisions } from '@shared/sync/merge';
import type { Db } from '../../db/knex';
import type { AuthContext } from '../../http/auth-context';
import { insertSurvey, revisionAuthor, type SurveyColumns } from '../../db/repositories/surveys';
import { insertRunWrites } from '../../db/repositories/push-writes';
import { insertConflict, markConflictResolved } from '../../db/repositories/conflicts';
import { insertStatusEvent, setSurveyStatus } from '../../db/repositories/review';
import type { MemberCheck } from '../../db/repositories/survey-sql';
import { columnsOf } from '../survey-columns';
import type { EndState, RunPlan, StartSurvey } from './plan';
import type { KnownSurveyState } from './state-cache';

/** An optimistic run cannot go on (it wrote nothing): do it again from a fresh read, then locked. */
export class NeedsLock extends Error {}

export interface RunOutcome {
  results: PushResult[];
  conflictIds: string[];
  touched: boolean;
  /** The survey as the run left it in the database, when the run wrote it, and the size of its JSON. */
  written?: { state: KnownSurveyState; jsonBytes: number };
}

type Caller = Pick<AuthContext, 'orgId' | 'userId'>;
type Linked = { vesselId: string | null; vesselName: string };

const linkOf = (s: StartSurvey | Survey, vesselId: string | null): Linked => ({
  vesselId,
  vesselName: 'doc' in s ? s.doc.vessel.name : s.vessel.name,
});

/** The run's answers, before anything it wrote. */
const answered = (plan: RunPlan): RunOutcome => ({ results: plan.results, conflictIds: plan.conflicts.map((c) => c.id), touched: plan.touched });

/**
 * The survey's new columns and the JSON text of its document and field revisions, when the run changed
 * the document: each serialised once, for the write and for the state the run leaves (stateAfter).
 */
async function newColumns(q: Db | Knex.Transaction, orgId: string, final: EndState | undefined, linked: Linked | undefined) {
  if (!final) return undefined;
  const columns = await columnsOf(q, orgId, final.doc, final.revision, final.revs, linked);
  return { columns, docJson: JSON.stringify(columns.doc), revsJson: JSON.stringify(columns.revs) };
}

/** The survey as a run left it: the document as parsed back from the text written, so equal to a fresh read. */
function stateAfter(orgId: string, before: StartSurvey, final: EndState, written: { columns: SurveyColumns; docJson: string; revsJson: string }): RunOutcome['written'] {
  const { revsJson } = written;
  return {
    state: {
      orgId,
      revision: final.revision,
      doc: JSON.parse(written.docJson) as Survey,
      revs: JSON.parse(revsJson) as FieldRevisions,
      vesselId: written.columns.vesselId,
      status: before.status,
    },
    jsonBytes: written.docJson.length + revsJson.length,
  };
}

/**
 * Writes an optimistic plan in one statement, only while the survey is still at `start.revision` and `start.status`
 * (and, with `member`, while the caller is an active member with one of its roles).
 * `memberRole`: what that statement found, when it ran with `member`.
 */
export async function writeOptimistic(
  db: Db,
  caller: Caller,
  surveyId: string,
  start: StartSurvey,
  plan: RunPlan,
  member?: MemberCheck & { roles: readonly Role[] },
): Promise<RunOutcome & { memberRole?: Role | null }> {
  // Only changes already recorded: their answers stand whatever happened since.
  if (!plan.processed.length && !plan.revisions.length) return answered(plan);
  const written = await newColumns(db, caller.orgId, plan.final, linkOf(start, start.vesselId));
  const out = await insertRunWrites(db, {
    revisions: plan.revisions,
    processed: plan.processed,
    survey: written ? { id: surveyId, ...written } : undefined,
    onlyAtRevision: start.revision,
    onlyAtStatus: start.status,
    orgId: caller.orgId,
    member,
  });
  if (!out.guardHeld) throw new NeedsLock();
  const state = written && plan.final ? stateAfter(caller.orgId, start, plan.final, written) : undefined;
  return { ...answered(plan), written: state, memberRole: member ? out.memberRole : undefined };
}

/** Writes a locked plan inside the run's transaction (the survey row, if any, is locked already). */
export async function writeLocked(
  trx: Knex.Transaction,
  caller: Caller,
  surveyId: string,
  start: StartSurvey | undefined,
  plan: RunPlan,
): Promise<RunOutcome> {
  let linked = start ? linkOf(start, start.vesselId) : undefined;
  if (plan.created) {
    const columns = await columnsOf(trx, caller.orgId, plan.created, 1, {});
    await insertSurvey(trx, { id: surveyId, orgId: caller.orgId, createdBy: caller.userId, ...columns });
    linked = linkOf(plan.created, columns.vesselId);
  }
  for (const c of plan.conflicts) {
    await insertConflict(trx, { ...c, keptBy: c.keptBy !== undefined ? c.keptBy : await revisionAuthor(trx, surveyId, c.keptRevision) });
  }
  for (const r of plan.resolutions) await markConflictResolved(trx, r.conflictId, caller.userId, r.changeId);
  const written = await newColumns(trx, caller.orgId, plan.final, linked);
  const out = await insertRunWrites(trx, { revisions: plan.revisions, processed: plan.processed, survey: written && { id: surveyId, ...written } });
  // Another transaction recorded one of these changes since our look-up: redo the run to answer 'duplicate'.
  if (out.inserted < plan.processed.length) throw Object.assign(new Error('change recorded concurrently'), { code: '23505' });
  for (const m of plan.statusMoves) {
    // The survey row is locked: the status the plan started from is still the stored one.
    await setSurveyStatus(trx, surveyId, m.from, m.to);
    await insertStatusEvent(trx, { surveyId, orgId: caller.orgId, from: m.from, to: m.to, note: null, actorId: caller.userId, revision: m.revision });
  }
  const state = start && written && plan.final ? stateAfter(caller.orgId, start, plan.final, written) : undefined;
  return { ...answered(plan), written: state };
}
