/**
 * The plan of one push run: a pure function from what the database held when the run started (the
 * survey, the changes already recorded, and for a locked run the conflicts the run settles and
 * whether a new survey's id is taken) and the run's changes, to what the run answers and writes —
 * results, revision rows, change records, conflicts — or to why it cannot be planned this way:
 * `needs-lock` (an optimistic run met something only the locked run handles) or `check-each` (the
 * final document is invalid: plan again checking every change on its own). No I/O here: the caller
 * fetches what the plan needs first (run.ts) and writes what it gives (writes.ts).
 */
import { isValidEdit, SurveySchema, type Survey } from '@shared/schemas/survey';
import type { ConflictTarget, PushResult, SurveyChange, SurveyStatus } from '@shared/schemas/sync';
import { deepEqual } from '@shared/sync/apply';
import { mergeChange, type ConflictDraft, type FieldRevisions } from '@shared/sync/merge';
import { formatIssueLines } from '@shared/api/format-issues';
import type { Role } from '@shared/api/roles';
import { checkTransition } from '@shared/review/status';
import type { ProcessedChange, ProcessedRow } from '../../db/repositories/push-writes';
import type { RevisionRow } from '../../db/repositories/surveys';
import type { ConflictInsert } from '../../db/repositories/conflicts';

/** The survey as stored when the run starts. */
export interface StartSurvey {
  doc: Survey;
  revision: number;
  revs: FieldRevisions;
  vesselId: string | null;
  status: SurveyStatus;
}

/** A conflict a `resolve-conflict` change settles, as read (and locked) before the run. */
export interface ConflictAtStart {
  surveyId: string;
  status: 'open' | 'resolved';
  target: ConflictTarget;
}

export interface PlanInput {
  orgId: string;
  userId: string;
  /** Consecutive changes to one survey, in order. */
  run: readonly SurveyChange[];
  /** The survey of this organisation with the run's survey id; undefined when there is none. */
  survey?: StartSurvey;
  /** Changes of the run already recorded, by change id. */
  seen: ReadonlyMap<string, ProcessedChange>;
  /** `optimistic`: no transaction; anything but plain edits gives `needs-lock`. */
  mode: 'optimistic' | 'locked';
  /** Validate after every change (after a `check-each` answer), not only the final document. */
  checkEach: boolean;
  /** Locked, no survey, a `create` in the run: whether any organisation's survey already has this id. */
  idTaken?: boolean;
  /** Locked: the conflicts the run's `resolve-conflict` changes name, by id (absent: not on the server). */
  conflicts?: ReadonlyMap<string, ConflictAtStart>;
  /** Ids for new conflicts. */
  newId: () => string;
  /** The caller's role, for a `submit` change (the rules of shared/review/status.ts). */
  role?: Role;
}

/** A status move a `submit` change makes (written after the run's edits, in its transaction). */
export interface StatusMove {
  changeId: string;
  from: SurveyStatus;
  to: SurveyStatus;
  revision: number;
}

/** A conflict to store; `keptBy` undefined: the author of `keptRevision` is to be looked up. */
export type PlannedConflict = Omit<ConflictInsert, 'keptBy'> & { keptBy?: string | null };

/** The survey after the run, when the run changed it. */
export interface EndState {
  doc: Survey;
  revision: number;
  revs: FieldRevisions;
}

export interface RunPlan {
  kind: 'planned';
  results: PushResult[];
  processed: ProcessedRow[];
  revisions: RevisionRow[];
  conflicts: PlannedConflict[];
  resolutions: { conflictId: string; changeId: string }[];
  /** A `create` change's document: the survey row to insert (revision 1) before anything else. */
  created?: Survey;
  /** The survey after the run, when the run changed its document. */
  final?: EndState;
  /** Anything for the results scheduler: a new revision or a new conflict. */
  touched: boolean;
  /** Status moves made by `submit` changes, in order. */
  statusMoves: StatusMove[];
}

export type PlanOutcome = RunPlan | { kind: 'needs-lock' } | { kind: 'check-each' };

/** Signals that end planning early; turned into the outcome by `planRun`. */
class Stop extends Error {
  constructor(readonly outcome: 'needs-lock' | 'check-each') {
    super(outcome);
  }
}

/**
 * Why the survey would not be valid, or null. With `from`, the valid survey the run started from,
 * only what the run changed is checked (isValidEdit, exact); the full check runs when that refuses,
 * to word the reason.
 */
export function validationReason(doc: Survey, from?: Survey): string | null {
  if (from && isValidEdit(from, doc)) return null;
  const parsed = SurveySchema.safeParse(doc);
  if (parsed.success) return null;
  return `The survey would not be valid after this change: ${formatIssueLines(parsed.error).slice(0, 3).join('; ')}.`;
}

/** The plan of one run; see the file's comment. */
export function planRun(input: PlanInput): PlanOutcome {
  try {
    const planner = new RunPlanner(input);
    for (const change of input.run) planner.take(change);
    return planner.finish();
  } catch (err) {
    if (err instanceof Stop) return { kind: err.outcome };
    throw err;
  }
}

const answerOf = (c: SurveyChange) => ({ changeId: c.id, deviceId: c.deviceId, seq: c.seq, surveyId: c.surveyId });

/** The run so far: the survey as the changes taken have left it, and everything to answer and write. */
class RunPlanner {
  private state?: EndState & { dirty: boolean };
  private readonly plan: RunPlan = { kind: 'planned', results: [], processed: [], revisions: [], conflicts: [], resolutions: [], touched: false, statusMoves: [] };
  private readonly thisRun = new Map<string, ProcessedRow>();
  private status: SurveyStatus;

  constructor(private readonly input: PlanInput) {
    this.status = input.survey?.status ?? 'draft';
    if (input.mode === 'optimistic' && !input.survey) throw new Stop('needs-lock');
    const s = input.survey;
    if (s) this.state = { doc: s.doc, revision: s.revision, revs: s.revs, dirty: false };
  }

  take(change: SurveyChange): void {
    const earlier = this.earlier(change);
    if (earlier) return this.answerRepeat(change, earlier);
    // PostgreSQL cannot store a NUL character in text or jsonb: refuse it here, not with a failed transaction.
    if (JSON.stringify(change.op).includes('\\u0000')) {
      return this.reject(change, 'The change holds a character the server cannot store (a NUL character in a text).');
    }
    const op = change.op;
    if (this.input.mode === 'optimistic' && (op.kind === 'create' || op.kind === 'resolve-conflict')) throw new Stop('needs-lock');
    if (op.kind === 'create') return this.create(change, op.survey);
    if (!this.state) return this.reject(change, 'This survey is not on the server for your organisation.');
    if (op.kind === 'submit') return this.submit(change, this.state);
    if (op.kind === 'resolve-conflict') {
      const refused = this.resolutionRefused(op.conflictId, op.target);
      if (refused) return this.reject(change, refused);
    }
    this.merge(change, this.state);
  }

  finish(): PlanOutcome {
    const { state, input, plan } = this;
    if (state?.dirty && !input.checkEach && validationReason(state.doc, input.survey?.doc)) throw new Stop('check-each');
    // Linking another vessel may insert one: that is for the locked run.
    const renamed = state?.dirty && input.survey?.doc.vessel.name.toLowerCase() !== state.doc.vessel.name.toLowerCase();
    if (input.mode === 'optimistic' && renamed) throw new Stop('needs-lock');
    if (state?.dirty) plan.final = { doc: state.doc, revision: state.revision, revs: state.revs };
    plan.touched ||= plan.conflicts.length > 0;
    return plan;
  }

  /** The record of this change made before, in an earlier push or earlier in this run. */
  private earlier(change: SurveyChange): ProcessedChange | undefined {
    const sameChange = (p: ProcessedRow) => p.changeId === change.id || (p.deviceId === change.deviceId && p.seq === change.seq);
    return this.input.seen.get(change.id) ?? [...this.thisRun.values()].find(sameChange);
  }

  private answerRepeat(change: SurveyChange, earlier: ProcessedChange): void {
    // Someone else's change id (another firm's, or a colleague's): never a repeat of this caller's change.
    if (earlier.orgId !== this.input.orgId || earlier.userId !== this.input.userId) {
      this.plan.results.push({ ...answerOf(change), status: 'rejected', reason: 'This change id is already in use.' });
      return;
    }
    this.plan.results.push({
      ...answerOf(change),
      status: 'duplicate',
      firstStatus: earlier.status,
      revision: earlier.revision ?? undefined,
      conflictIds: earlier.conflictIds.length ? earlier.conflictIds : undefined,
      reason: earlier.reason ?? undefined,
    });
  }

  private record(change: SurveyChange, r: Pick<ProcessedRow, 'status' | 'revision' | 'reason' | 'conflictIds'>): void {
    const { orgId, userId } = this.input;
    const row: ProcessedRow = { deviceId: change.deviceId, seq: change.seq, changeId: change.id, orgId, surveyId: change.surveyId, userId, ...r };
    this.plan.processed.push(row);
    this.thisRun.set(change.id, row);
  }

  private reject(change: SurveyChange, reason: string): void {
    const revision = this.state?.revision;
    this.record(change, { status: 'rejected', revision: revision ?? null, reason, conflictIds: [] });
    this.plan.results.push({ ...answerOf(change), status: 'rejected', reason, revision });
  }

  private revisionRow(change: SurveyChange, revision: number, changes: RevisionRow['changes']): RevisionRow {
    const { orgId, userId } = this.input;
    return { surveyId: change.surveyId, revision, orgId, userId, deviceId: change.deviceId, changeId: change.id, changes };
  }

  private create(change: SurveyChange, doc: Survey): void {
    if (this.state) return this.reject(change, 'This survey already exists on the server.');
    if (this.input.idTaken) return this.reject(change, 'A survey with this id already exists.');
    this.plan.created = doc;
    this.plan.revisions.push(this.revisionRow(change, 1, [{ entity: 'survey', field: null, old: null, new: 'created' }]));
    this.state = { doc, revision: 1, revs: {}, dirty: false };
    this.record(change, { status: 'applied', revision: 1, reason: null, conflictIds: [] });
    this.plan.results.push({ ...answerOf(change), status: 'applied', revision: 1 });
    this.plan.touched = true;
  }

  /** Why a `resolve-conflict` change cannot settle its conflict, or null. */
  private resolutionRefused(conflictId: string, target: ConflictTarget): string | null {
    const c = this.input.conflicts?.get(conflictId);
    if (!c || c.surveyId !== this.input.run[0].surveyId) return 'This conflict is not on the server.';
    if (c.status === 'resolved' || this.plan.resolutions.some((r) => r.conflictId === conflictId)) {
      return 'This conflict was already settled on another device; the survey shows the value chosen there.';
    }
    if (!deepEqual(c.target, target)) return 'The choice does not match what the conflict is about.';
    return null;
  }

  /**
   * "Send for review" queued on a device. A push sends it in a run of its own (push.ts `runsOf`),
   * so the status it starts from is the one the locked read found, after the edits before it.
   */
  private submit(change: SurveyChange, state: EndState): void {
    if (this.input.mode === 'optimistic') throw new Stop('needs-lock');
    const from = this.status;
    if (from !== 'submitted') {
      const check = checkTransition({ from, to: 'submitted', role: this.input.role ?? 'surveyor', isSubmitter: false });
      if (!check.ok) return this.reject(change, check.message);
      this.plan.statusMoves.push({ changeId: change.id, from, to: 'submitted', revision: state.revision });
      this.status = 'submitted';
    }
    // Already sent (a second tap while offline): nothing more to do, and nothing refused.
    this.record(change, { status: 'applied', revision: state.revision, reason: null, conflictIds: [] });
    this.plan.results.push({ ...answerOf(change), status: 'applied', revision: state.revision });
  }

  private merge(change: SurveyChange, state: EndState): void {
    const outcome = mergeChange(state.doc, state.revs, change, state.revision + 1);
    if (outcome.status === 'rejected') return this.reject(change, outcome.reason);
    const applied = outcome.changes.length > 0;
    if (applied && this.input.checkEach) {
      const invalid = validationReason(outcome.doc);
      if (invalid) return this.reject(change, invalid);
    }
    const revision = applied ? state.revision + 1 : state.revision;
    if (applied) this.plan.revisions.push(this.revisionRow(change, revision, outcome.changes));
    if (this.input.mode === 'optimistic' && outcome.conflicts.length) throw new Stop('needs-lock');
    const ids = outcome.conflicts.map((d) => this.addConflict(change, d));
    if (change.op.kind === 'resolve-conflict') this.plan.resolutions.push({ conflictId: change.op.conflictId, changeId: change.id });
    this.record(change, { status: outcome.status, revision, reason: null, conflictIds: ids });
    this.plan.results.push({ ...answerOf(change), status: outcome.status, revision, conflictIds: ids.length ? ids : undefined });
    if (applied) {
      this.state = { doc: outcome.doc, revision, revs: outcome.revs, dirty: true };
      this.plan.touched = true;
    }
  }

  private addConflict(change: SurveyChange, d: ConflictDraft): string {
    const id = this.input.newId();
    const { orgId, userId } = this.input;
    // The kept value's author is known here when this run wrote it; otherwise the writer looks it up.
    const keptBy = this.plan.revisions.find((r) => r.revision === d.keptMark.r)?.userId;
    this.plan.conflicts.push({
      id,
      orgId,
      surveyId: change.surveyId,
      target: d.target,
      proposed: d.proposed,
      kept: d.kept,
      baseRevision: change.baseRevision,
      keptRevision: d.keptMark.r,
      keptBy,
      keptDeviceId: d.keptMark.d,
      proposedBy: userId,
      proposedDeviceId: change.deviceId,
      changeId: change.id,
    });
    return id;
  }
}
