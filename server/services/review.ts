/**
 * The review desk's rules: status moves (shared/review/status.ts), the queue, comments, verdicts,
 * operating limits, history and comparisons. Everything is scoped to the caller's organisation: a
 * survey of another firm answers exactly like one that does not exist.
 */
import type { Knex } from 'knex';
import type {
  CompareResponse,
  FieldChange,
  NewComment,
  CommentResolution,
  NewLimit,
  QueueItem,
  ReviewBundle,
  ReviewNotes,
  RevisionEntry,
  SetVerdict,
  StatusChangeRequest,
  StatusEvent,
} from '@shared/api/review';
import type { Survey } from '@shared/schemas/survey';
import { ENGINE_VERSION, type SurveyResults } from '@shared/engine';
import { compareNumbers } from '@shared/review/compare';
import { entityNoun } from '@shared/api/entity-nouns';
import { QUEUE_STATUSES, REVIEWABLE_STATUSES, STATUS_LABELS, checkTransition, type SurveyStatus } from '@shared/review/status';
import type { AuthContext } from '../http/auth-context';
import { conflict, forbidden, notFound, validationFailed } from '../errors';
import * as repo from '../db/repositories/review';
import { ensureResults } from './engine-results';
import { sinceReviewBase } from '@shared/review/reviewed';
import { MAX_CHANGE_LINES, surveyChangeLines } from '@shared/review/survey-changes';
import { UpgradingSurveySchema } from '@shared/schemas/survey';

const NO_SURVEY = 'No such survey in your organisation.';

function splitEntity(c: repo.RevisionRow['changes'][number]): FieldChange {
  const slash = c.entity.indexOf('/');
  if (slash < 0) {
    const vessel = c.entity === 'survey' && c.field === 'vessel';
    return { entity: vessel ? 'vessel' : c.entity, entityId: null, field: c.field, old: c.old ?? null, new: c.new ?? null };
  }
  const collection = c.entity.slice(0, slash);
  return { entity: entityNoun(collection), entityId: c.entity.slice(slash + 1), field: c.field, old: c.old ?? null, new: c.new ?? null };
}

type Q = Knex | Knex.Transaction;

async function surveyOf(q: Q, auth: AuthContext, surveyId: string, forUpdate = false) {
  const s = await repo.findSurvey(q, auth.orgId, surveyId, { forUpdate });
  if (!s) throw notFound(NO_SURVEY);
  return s;
}

/** The status rules' refusal as the domain error that says why (role, own work, a missing note, or the wrong status). */
function transitionRefused(check: Exclude<ReturnType<typeof checkTransition>, { ok: true }>, status: SurveyStatus) {
  if (check.reason === 'role' || check.reason === 'own_submission') return forbidden(check.message);
  if (check.reason === 'note_required') return validationFailed(check.message, [{ path: 'note', message: check.message }]);
  return conflict(check.message, { status });
}

/** Checks and records one status move inside `trx`, the survey row locked. */
async function moveStatus(trx: Knex.Transaction, auth: AuthContext, surveyId: string, body: StatusChangeRequest) {
  const s = await surveyOf(trx, auth, surveyId, true);
  // The own-work rule: whoever made, edited or sent the survey at any revision may not accept it.
  const ownWork = body.to === 'accepted' && (await repo.hasWorkedOn(trx, surveyId, auth.userId));
  const check = checkTransition({ from: s.status, to: body.to, role: auth.role, isSubmitter: ownWork, note: body.note });
  if (!check.ok) throw transitionRefused(check, s.status);
  if (!(await repo.setSurveyStatus(trx, surveyId, s.status, body.to))) {
    throw conflict(`The survey is no longer “${STATUS_LABELS[s.status]}”.`);
  }
  const event = await repo.insertStatusEvent(trx, {
    surveyId,
    orgId: auth.orgId,
    from: s.status,
    to: body.to,
    note: body.note?.trim() || null,
    actorId: auth.userId,
    revision: s.revision,
  });
  return { moved: { surveyId, status: body.to, event }, revision: s.revision, doc: s.doc as Survey };
}

async function changeStatus(db: Knex, auth: AuthContext, surveyId: string, body: StatusChangeRequest): Promise<{ surveyId: string; status: SurveyStatus; event: StatusEvent }> {
  const { moved, revision, doc } = await db.transaction((trx) => moveStatus(trx, auth, surveyId, body));
  // The accepted revision's figures are what the brief shows from now on, even after later edits:
  // store them now rather than leave them to the background run, which computes only the latest.
  if (body.to === 'accepted') await ensureResults(db, surveyId, revision, doc);
  return moved;
}

async function queue(db: Knex, auth: AuthContext): Promise<QueueItem[]> {
  const rows = await repo.listQueue(db, auth.orgId, QUEUE_STATUSES);
  return rows.map((r) => ({
    surveyId: r.surveyId,
    title: r.title,
    vesselName: r.vesselName,
    status: r.status,
    revision: r.revision,
    surveyorName: r.surveyorName,
    submittedAt: r.submittedAt,
    soundingsAt: r.soundingsAt,
    worstUtilisation: r.worstUtilisation,
    worstBoundaryName: r.boundaries.find((b) => b.id === r.worstBoundaryId)?.name ?? null,
    engineVersion: r.engineVersion,
  }));
}

async function bundle(db: Knex, auth: AuthContext, surveyId: string): Promise<ReviewBundle> {
  const s = await surveyOf(db, auth, surveyId);
  const [results, comments, verdicts, limits, events, briefs, submittedById, organisationName, viewerWorkedOn] = await Promise.all([
    ensureResults(db, surveyId, s.revision, s.doc as Survey),
    repo.listComments(db, [surveyId]),
    repo.listVerdicts(db, [surveyId]),
    repo.listLimits(db, [surveyId]),
    repo.listStatusEvents(db, surveyId),
    repo.listBriefs(db, surveyId),
    repo.lastSubmitter(db, surveyId),
    repo.organisationName(db, auth.orgId),
    repo.hasWorkedOn(db, surveyId, auth.userId),
  ]);
  return {
    surveyId,
    status: s.status,
    revision: s.revision,
    submittedById,
    doc: s.doc,
    serverResults: results.results ?? null,
    serverEngineVersion: results.engineVersion,
    serverComputedRevision: results.revision,
    comments,
    verdicts: verdicts.map(({ surveyId: _s, ...v }) => v),
    limits: limits.map(({ surveyId: _s, ...l }) => l),
    events,
    sinceReview: await sinceReview(db, surveyId, s.revision, s.doc as Survey, events),
    briefs: auth.role === 'surveyor' ? [] : briefs,
    viewer: { userId: auth.userId, role: auth.role },
    viewerWorkedOn,
    organisationName,
  };
}

/** What changed since the revision the review rests on, when the survey changed after it (see ReviewBundle). */
async function sinceReview(db: Knex, surveyId: string, revision: number, doc: Survey, events: StatusEvent[]): Promise<ReviewBundle['sinceReview']> {
  const base = sinceReviewBase(events, revision);
  if (!base) return null;
  const kept = await repo.findSnapshot(db, surveyId, base.revision);
  const before = kept ? UpgradingSurveySchema.safeParse(kept) : null;
  const lines = before?.success ? surveyChangeLines(before.data, doc) : [];
  return { ...base, documentKept: Boolean(before?.success), lines: lines.slice(0, MAX_CHANGE_LINES), total: lines.length };
}

function targetExists(doc: Survey, kind: NewComment['target']['kind'], id: string): boolean {
  switch (kind) {
    case 'survey':
    case 'vessel':
      return id === doc.id;
    case 'condition':
      return doc.conditions.some((c) => c.id === id);
    case 'compartment':
      return doc.compartments.some((c) => c.id === id);
    case 'boundary':
      return doc.boundaries.some((b) => b.id === id);
    case 'photo':
      return (doc.photos ?? []).some((p) => p.id === id);
  }
}

/** The thread a reply joins: its parent's thread (replies are one level deep), or none for a new thread. */
async function threadOf(db: Knex, surveyId: string, parentId: string | undefined): Promise<string | null> {
  if (!parentId) return null;
  const parent = await repo.findComment(db, surveyId, parentId);
  if (!parent) throw validationFailed('The comment you reply to is not on this survey.', [{ path: 'parentId', message: 'no such comment' }]);
  return parent.parentId ?? parent.id;
}

async function addComment(db: Knex, auth: AuthContext, surveyId: string, body: NewComment) {
  const s = await surveyOf(db, auth, surveyId);
  if (body.id) {
    // A device sending again a reply it wrote offline: the comment already made is the answer.
    const seen = await repo.findCommentAnywhere(db, body.id);
    if (seen && seen.surveyId === surveyId && seen.authorId === auth.userId) return (await repo.findComment(db, surveyId, body.id))!;
    if (seen) throw validationFailed('This comment id is already in use.', [{ path: 'id', message: 'already in use' }]);
  }
  if (!targetExists(s.doc as Survey, body.target.kind, body.target.id)) {
    throw validationFailed('The survey has no such item to comment on.', [{ path: 'target', message: 'no such item in the survey' }]);
  }
  const parentId = await threadOf(db, surveyId, body.parentId);
  return repo.insertComment(db, { id: body.id, surveyId, orgId: auth.orgId, target: body.target, parentId, body: body.body, authorId: auth.userId, revision: s.revision });
}

/** The reviewer closes a thread once answered, or opens it again. */
async function resolveComment(db: Knex, auth: AuthContext, surveyId: string, commentId: string, body: CommentResolution) {
  await surveyOf(db, auth, surveyId);
  const done = await repo.setCommentResolution(db, surveyId, commentId, body.resolved ? auth.userId : null);
  if (!done) throw notFound('No such comment thread on this survey.');
  return (await repo.findComment(db, surveyId, commentId))!;
}

async function listComments(db: Knex, auth: AuthContext, surveyId: string) {
  await surveyOf(db, auth, surveyId);
  return repo.listComments(db, [surveyId]);
}

async function reviewable(db: Knex, auth: AuthContext, surveyId: string) {
  const s = await surveyOf(db, auth, surveyId);
  if (!REVIEWABLE_STATUSES.includes(s.status)) {
    throw conflict(`Verdicts and limits are set while a survey is under review; this one is “${STATUS_LABELS[s.status]}”.`);
  }
  return s;
}

async function setVerdict(db: Knex, auth: AuthContext, surveyId: string, body: SetVerdict) {
  const s = await reviewable(db, auth, surveyId);
  if (body.scope === 'boundary' && !(s.doc as Survey).boundaries.some((b) => b.id === body.boundaryId)) {
    throw validationFailed('The survey has no such boundary.', [{ path: 'boundaryId', message: 'no such boundary in the survey' }]);
  }
  return repo.upsertVerdict(db, {
    surveyId,
    orgId: auth.orgId,
    scope: body.scope,
    boundaryId: body.scope === 'boundary' ? body.boundaryId : null,
    verdict: body.verdict,
    note: body.note?.trim() || null,
    setBy: auth.userId,
    revision: s.revision,
  });
}

async function addLimit(db: Knex, auth: AuthContext, surveyId: string, body: NewLimit) {
  const s = await reviewable(db, auth, surveyId);
  const doc = s.doc as Survey;
  const r = body.rule;
  const missing: { path: string; message: string }[] = [];
  if ('compartmentId' in r && !doc.compartments.some((c) => c.id === r.compartmentId)) missing.push({ path: 'rule.compartmentId', message: 'no such compartment in the survey' });
  if ('boundaryId' in r && !doc.boundaries.some((b) => b.id === r.boundaryId)) missing.push({ path: 'rule.boundaryId', message: 'no such boundary in the survey' });
  if (missing.length) throw validationFailed('The limit names an item the survey does not have.', missing);
  return repo.insertLimit(db, { surveyId, orgId: auth.orgId, rule: r, text: body.text?.trim() || null, createdBy: auth.userId, revision: s.revision });
}

async function removeLimit(db: Knex, auth: AuthContext, surveyId: string, limitId: string) {
  await reviewable(db, auth, surveyId);
  if (!(await repo.removeLimit(db, surveyId, limitId, auth.userId))) throw notFound('No such limit on this survey.');
}

async function revisions(db: Knex, auth: AuthContext, surveyId: string): Promise<RevisionEntry[]> {
  await surveyOf(db, auth, surveyId);
  const [rows, worst] = await Promise.all([repo.listRevisions(db, surveyId), repo.worstUtilisationByRevision(db, surveyId, ENGINE_VERSION)]);
  return rows.map((r) => {
    const w = worst.get(r.revision);
    return {
      revision: r.revision,
      authorName: r.authorName,
      at: r.at,
      changes: r.changes.map(splitEntity),
      engineVersion: w?.engineVersion ?? null,
      worstUtilisation: w?.worst ?? null,
    };
  });
}

type BoundaryResult = SurveyResults['boundaries'][number];

function boundarySummary(x: BoundaryResult | undefined) {
  return x ? { netForceN: x.net.resultantN, peakPressurePa: x.net.peak.pressurePa, maxUtilisation: x.maxUtilisation } : null;
}

/** Every boundary in either revision, side by side (one that exists in only one of them has null on the other side). */
function boundariesSideBySide(A: SurveyResults | null, B: SurveyResults | null): CompareResponse['boundaries'] {
  const ids = [...new Set([...(A?.boundaries ?? []).map((x) => x.id), ...(B?.boundaries ?? []).map((x) => x.id)])];
  return ids.map((id) => {
    const ba = A?.boundaries.find((x) => x.id === id);
    const bb = B?.boundaries.find((x) => x.id === id);
    return { boundaryId: id, name: (bb ?? ba)!.name, a: boundarySummary(ba), b: boundarySummary(bb) };
  });
}

async function compare(db: Knex, auth: AuthContext, surveyId: string, qa?: number, qb?: number): Promise<CompareResponse> {
  const s = await surveyOf(db, auth, surveyId);
  const b = qb ?? s.revision;
  const a = qa ?? Math.max(1, b - 1);
  if (a > s.revision || b > s.revision) throw notFound(`The survey has ${s.revision} revisions.`);
  // The current revision's results are made on demand; older ones were stored when they were current.
  await ensureResults(db, surveyId, s.revision, s.doc as Survey);
  const [ra, rb] = await Promise.all([repo.findResultsExact(db, surveyId, a, ENGINE_VERSION), repo.findResultsExact(db, surveyId, b, ENGINE_VERSION)]);
  if (!ra || !rb) throw notFound(`No stored results for revision ${!ra ? a : b} of this survey.`);
  const A = ra.results as SurveyResults | null;
  const B = rb.results as SurveyResults | null;
  const differences = compareNumbers(A, B);
  return {
    surveyId,
    a: { revision: a, engineVersion: ra.engineVersion },
    b: { revision: b, engineVersion: rb.engineVersion },
    boundaries: boundariesSideBySide(A, B),
    differences: differences.slice(0, 200),
    differenceCount: differences.length,
  };
}

export function createReviewService(deps: { db: Knex }) {
  const { db } = deps;
  return {
    changeStatus: (auth: AuthContext, surveyId: string, body: StatusChangeRequest) => changeStatus(db, auth, surveyId, body),
    queue: (auth: AuthContext) => queue(db, auth),
    bundle: (auth: AuthContext, surveyId: string) => bundle(db, auth, surveyId),
    addComment: (auth: AuthContext, surveyId: string, body: NewComment) => addComment(db, auth, surveyId, body),
    resolveComment: (auth: AuthContext, surveyId: string, commentId: string, body: CommentResolution) =>
      resolveComment(db, auth, surveyId, commentId, body),
    listComments: (auth: AuthContext, surveyId: string) => listComments(db, auth, surveyId),
    setVerdict: (auth: AuthContext, surveyId: string, body: SetVerdict) => setVerdict(db, auth, surveyId, body),
    addLimit: (auth: AuthContext, surveyId: string, body: NewLimit) => addLimit(db, auth, surveyId, body),
    removeLimit: (auth: AuthContext, surveyId: string, limitId: string) => removeLimit(db, auth, surveyId, limitId),
    revisions: (auth: AuthContext, surveyId: string) => revisions(db, auth, surveyId),
    compare: (auth: AuthContext, surveyId: string, a?: number, b?: number) => compare(db, auth, surveyId, a, b),
  };
}

export type ReviewService = ReturnType<typeof createReviewService>;

/**
 * Review notes for the sync pull (`extras.review`): for every survey of the organisation with a
 * comment, verdict, limit or status move written at or after `sinceXid`, the survey's whole set of
 * notes, so a device simply replaces what it holds for that survey (removed limits disappear).
 */
export async function reviewNotesSince(q: Knex | Knex.Transaction, ctx: { orgId: string; sinceXid: string }): Promise<ReviewNotes[]> {
  const surveys = await repo.surveysWithReviewChangesSince(q, ctx.orgId, ctx.sinceXid);
  const ids = surveys.map((s) => s.id);
  if (ids.length === 0) return [];
  // One after another: inside the pull's transaction they share a single connection.
  const comments = await repo.listComments(q, ids);
  const verdicts = await repo.listVerdicts(q, ids);
  const limits = await repo.listLimits(q, ids);
  const lastEvents = await repo.lastStatusEvents(q, ids);
  return surveys.map((s) => ({
    surveyId: s.id,
    status: s.status,
    comments: comments.filter((c) => c.surveyId === s.id),
    verdicts: verdicts.filter((v) => v.surveyId === s.id).map(({ surveyId: _s, ...v }) => v),
    limits: limits.filter((l) => l.surveyId === s.id).map(({ surveyId: _s, ...l }) => l),
    lastEvent: lastEvents.get(s.id) ?? null,
  }));
}
