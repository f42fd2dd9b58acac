/**
 * SQL of the review desk and the master's brief. snake_case stops here. The survey rows, their
 * revisions and their stored results belong to the sync service's tables; this file only reads
 * them (and moves `surveys.status`).
 */
import type { Knex } from 'knex';
import type {
  BriefLink,
  CommentTarget,
  LimitRule,
  OperatingLimit,
  ReviewComment,
  StatusEvent,
  Verdict,
} from '@shared/api/review';
import type { SurveyStatus } from '@shared/review/status';

type Q = Knex | Knex.Transaction;

const iso = (v: Date | string | null): string | null => (v === null ? null : new Date(v).toISOString());

// ---- surveys (read, and the status column) -------------------------------------------------------

export interface SurveyRow {
  id: string;
  orgId: string;
  status: SurveyStatus;
  revision: number;
  doc: unknown;
  createdBy: string | null;
}

export async function findSurvey(db: Q, orgId: string, surveyId: string, opts: { forUpdate?: boolean } = {}): Promise<SurveyRow | undefined> {
  const q = db('surveys').where({ id: surveyId, organisation_id: orgId }).first('id', 'organisation_id', 'status', 'revision', 'doc', 'created_by');
  if (opts.forUpdate) q.forUpdate();
  const row = await q;
  return row
    ? { id: row.id, orgId: row.organisation_id, status: row.status, revision: row.revision, doc: row.doc, createdBy: row.created_by ?? null }
    : undefined;
}

export async function setSurveyStatus(db: Q, surveyId: string, from: SurveyStatus, to: SurveyStatus): Promise<boolean> {
  const n = await db('surveys').where({ id: surveyId, status: from }).update({ status: to, updated_at: db.fn.now() });
  return n === 1;
}

export interface StoredResults {
  revision: number;
  engineVersion: string;
  results: unknown;
  error: string | null;
}

/** Of several stored results for one revision, the one from `engineVersion`, else the newest. */
const PREFER_ENGINE = [
  { column: 'revision', order: 'desc' as const },
  { column: 'engine_first', order: 'desc' as const },
  { column: 'computed_at', order: 'desc' as const },
];

function resultsQuery(db: Q, surveyId: string, engineVersion: string) {
  return db('survey_results')
    .where({ survey_id: surveyId })
    .select('revision', 'engine_version', 'results', 'error', 'computed_at', db.raw('(engine_version = ?) as engine_first', [engineVersion]));
}

const toResults = (row: Record<string, unknown>): StoredResults => ({
  revision: row.revision as number,
  engineVersion: row.engine_version as string,
  results: row.results,
  error: (row.error as string | null) ?? null,
});

/** The stored results of exactly this revision (preferring `engineVersion`). */
export async function findResultsExact(db: Q, surveyId: string, revision: number, engineVersion: string): Promise<StoredResults | undefined> {
  const row = await resultsQuery(db, surveyId, engineVersion).andWhere({ revision }).orderBy(PREFER_ENGINE).first();
  return row ? toResults(row) : undefined;
}

export interface RevisionRow {
  revision: number;
  authorName: string | null;
  at: string;
  changes: { entity: string; field: string | null; old: unknown; new: unknown }[];
}

export async function listRevisions(db: Q, surveyId: string): Promise<RevisionRow[]> {
  const rows = await db('survey_revisions as r')
    .leftJoin('users as u', 'u.id', 'r.user_id')
    .where('r.survey_id', surveyId)
    .orderBy('r.revision', 'asc')
    .select('r.revision', 'u.name as author_name', 'r.created_at', 'r.changes');
  return rows.map((r) => ({ revision: r.revision, authorName: r.author_name ?? null, at: iso(r.created_at)!, changes: r.changes ?? [] }));
}

/** Per revision, the worst utilisation in its stored results (preferring `engineVersion`). */
export async function worstUtilisationByRevision(db: Q, surveyId: string, engineVersion: string): Promise<Map<number, { engineVersion: string; worst: number | null }>> {
  const rows = await db('survey_results')
    .where({ survey_id: surveyId })
    .orderByRaw('revision, (engine_version = ?) asc, computed_at asc', [engineVersion])
    .select('revision', 'engine_version', db.raw("(results->'summary'->>'maxUtilisation')::float8 as worst"));
  // Ordered so the preferred row of each revision comes last and wins.
  return new Map(rows.map((r) => [r.revision as number, { engineVersion: r.engine_version as string, worst: (r.worst as number | null) ?? null }]));
}

// ---- queue ---------------------------------------------------------------------------------------

export interface QueueRow {
  surveyId: string;
  title: string;
  vesselName: string;
  status: SurveyStatus;
  revision: number;
  surveyorName: string | null;
  submittedAt: string | null;
  soundingsAt: string | null;
  worstUtilisation: number | null;
  worstBoundaryId: string | null;
  engineVersion: string | null;
  boundaries: { id: string; name: string }[];
}

export async function listQueue(db: Q, orgId: string, statuses: readonly SurveyStatus[]): Promise<QueueRow[]> {
  // The latest "sent for review" event gives who sent it and since when it has waited.
  const rows = await db('surveys as s')
    .leftJoin(
      db('status_events')
        .distinctOn('survey_id')
        .where('to_status', 'submitted')
        .orderBy([{ column: 'survey_id' }, { column: 'at', order: 'desc' }])
        .select('survey_id', 'actor_id', 'at')
        .as('e'),
      'e.survey_id',
      's.id',
    )
    .leftJoin('users as u', 'u.id', 'e.actor_id')
    .leftJoin(
      db('survey_results')
        .distinctOn('survey_id')
        .orderBy([{ column: 'survey_id' }, { column: 'revision', order: 'desc' }, { column: 'computed_at', order: 'desc' }])
        .select(
          'survey_id',
          'engine_version',
          db.raw("(results->'summary'->>'maxUtilisation')::float8 as worst"),
          db.raw("results->'summary'->>'maxUtilisationBoundaryId' as worst_boundary"),
        )
        .as('r'),
      'r.survey_id',
      's.id',
    )
    .where('s.organisation_id', orgId)
    .whereIn('s.status', statuses as SurveyStatus[])
    .orderByRaw('coalesce(e.at, s.updated_at) asc')
    .select(
      's.id',
      's.status',
      's.revision',
      's.title',
      's.vessel_name',
      's.soundings_at',
      db.raw("coalesce((select jsonb_agg(jsonb_build_object('id', b->>'id', 'name', b->>'name')) from json_array_elements(s.doc->'boundaries') b), '[]'::jsonb) as boundaries"),
      'u.name as surveyor_name',
      'e.at as submitted_at',
      'r.engine_version',
      'r.worst',
      'r.worst_boundary',
    );
  return rows.map((r) => ({
    surveyId: r.id,
    title: r.title ?? '',
    vesselName: r.vessel_name ?? '',
    status: r.status,
    revision: r.revision,
    surveyorName: r.surveyor_name ?? null,
    submittedAt: iso(r.submitted_at ?? null),
    soundingsAt: iso(r.soundings_at ?? null),
    worstUtilisation: r.worst ?? null,
    worstBoundaryId: r.worst_boundary ?? null,
    engineVersion: r.engine_version ?? null,
    boundaries: r.boundaries ?? [],
  }));
}

// ---- status events -------------------------------------------------------------------------------

const eventColumns = ['e.id', 'e.from_status', 'e.to_status', 'e.note', 'e.revision', 'e.at', 'e.actor_id', 'u.name as actor_name'];
const toEvent = (r: Record<string, unknown>): StatusEvent => ({
  id: r.id as string,
  from: r.from_status as SurveyStatus,
  to: r.to_status as SurveyStatus,
  note: (r.note as string | null) ?? null,
  actorName: (r.actor_name as string) ?? '',
  revision: r.revision as number,
  at: iso(r.at as Date)!,
});

export async function insertStatusEvent(
  db: Q,
  e: { surveyId: string; orgId: string; from: SurveyStatus; to: SurveyStatus; note: string | null; actorId: string; revision: number },
): Promise<StatusEvent> {
  const [row] = await db('status_events')
    .insert({ survey_id: e.surveyId, organisation_id: e.orgId, from_status: e.from, to_status: e.to, note: e.note, actor_id: e.actorId, revision: e.revision })
    .returning('id');
  const full = await db('status_events as e').join('users as u', 'u.id', 'e.actor_id').where('e.id', row.id).first(eventColumns);
  return toEvent(full);
}

export async function listStatusEvents(db: Q, surveyId: string): Promise<StatusEvent[]> {
  const rows = await db('status_events as e').join('users as u', 'u.id', 'e.actor_id').where('e.survey_id', surveyId).orderBy('e.at', 'asc').select(eventColumns);
  return rows.map(toEvent);
}

/** The latest status move of each survey. */
export async function lastStatusEvents(db: Q, surveyIds: string[]): Promise<Map<string, StatusEvent>> {
  const rows = await db('status_events as e')
    .join('users as u', 'u.id', 'e.actor_id')
    .whereIn('e.survey_id', surveyIds)
    .distinctOn('e.survey_id')
    .orderBy([{ column: 'e.survey_id' }, { column: 'e.at', order: 'desc' }])
    .select([...eventColumns, 'e.survey_id']);
  return new Map(rows.map((r) => [r.survey_id as string, toEvent(r)]));
}

/** Surveys of the organisation with any review record written by a transaction at or after `sinceXid`. */
export async function surveysWithReviewChangesSince(db: Q, orgId: string, sinceXid: string): Promise<{ id: string; status: SurveyStatus }[]> {
  const changed = (table: string) => db(table).where('organisation_id', orgId).andWhereRaw('change_xid >= ?::xid8', [sinceXid]).select('survey_id');
  return db('surveys')
    .where('organisation_id', orgId)
    .whereIn('id', changed('review_comments').union(changed('review_verdicts'), changed('operating_limits'), changed('status_events')))
    .orderBy('id')
    .select('id', 'status');
}

/** Who sent the survey for review most recently, if anyone. */
export async function lastSubmitter(db: Q, surveyId: string): Promise<string | null> {
  const row = await db('status_events').where({ survey_id: surveyId, to_status: 'submitted' }).orderBy('at', 'desc').first('actor_id');
  return row?.actor_id ?? null;
}

/**
 * Whether `userId` has had a hand in the survey at any revision: made it, sent it for review (at the
 * desk or queued on a device), wrote any revision of it, or pushed any change to it that was not
 * refused (an edit kept as a conflict included). Such a person may not accept it (the own-work rule).
 */
export async function hasWorkedOn(db: Q, surveyId: string, userId: string): Promise<boolean> {
  const { rows } = await db.raw(
    `SELECT EXISTS (SELECT 1 FROM surveys WHERE id = ? AND created_by = ?)
         OR EXISTS (SELECT 1 FROM status_events WHERE survey_id = ? AND actor_id = ? AND to_status = 'submitted')
         OR EXISTS (SELECT 1 FROM survey_revisions WHERE survey_id = ? AND user_id = ?)
         OR EXISTS (SELECT 1 FROM processed_changes WHERE survey_id = ? AND user_id = ? AND status <> 'rejected') AS worked`,
    [surveyId, userId, surveyId, userId, surveyId, userId, surveyId, userId],
  );
  return Boolean((rows as { worked: boolean }[])[0]?.worked);
}

/** The document as it was at `revision`, kept when a change sent the survey back for review. */
export async function findSnapshot(db: Q, surveyId: string, revision: number): Promise<unknown | undefined> {
  const row = await db('review_snapshots').where({ survey_id: surveyId, revision }).first('doc');
  return row?.doc;
}

/** The latest move to "accepted" or "under review", for the brief's "reviewed by". */
export async function lastReviewEvent(db: Q, surveyId: string): Promise<{ name: string; at: string } | null> {
  const row = await db('status_events as e')
    .join('users as u', 'u.id', 'e.actor_id')
    .where('e.survey_id', surveyId)
    .whereIn('e.to_status', ['accepted', 'in_review'])
    .orderByRaw("(e.to_status = 'accepted') desc, e.at desc")
    .first('u.name', 'e.at');
  return row ? { name: row.name, at: iso(row.at)! } : null;
}

// ---- comments ------------------------------------------------------------------------------------

const commentColumns = [
  'c.id',
  'c.survey_id',
  'c.target_kind',
  'c.target_id',
  'c.parent_id',
  'c.body',
  'c.revision',
  'c.created_at',
  'u.name as author_name',
  'm.role as author_role',
  'c.resolved_at',
  'r.name as resolved_by_name',
];

function commentsQuery(db: Q) {
  return db('review_comments as c')
    .join('users as u', 'u.id', 'c.author_id')
    .leftJoin('users as r', 'r.id', 'c.resolved_by')
    .leftJoin('memberships as m', function () {
      this.on('m.user_id', '=', 'c.author_id').andOn('m.organisation_id', '=', 'c.organisation_id');
    });
}

const toComment = (r: Record<string, unknown>): ReviewComment => ({
  id: r.id as string,
  surveyId: r.survey_id as string,
  target: { kind: r.target_kind as CommentTarget['kind'], id: r.target_id as string },
  parentId: (r.parent_id as string | null) ?? null,
  body: r.body as string,
  authorName: r.author_name as string,
  authorRole: (r.author_role as string | null) ?? 'former member',
  revision: r.revision as number,
  createdAt: iso(r.created_at as Date)!,
  resolvedAt: iso(r.resolved_at as Date | null) ?? null,
  resolvedByName: (r.resolved_by_name as string | null) ?? null,
});

export async function findComment(db: Q, surveyId: string, commentId: string): Promise<ReviewComment | undefined> {
  const row = await commentsQuery(db).where({ 'c.id': commentId, 'c.survey_id': surveyId }).first(commentColumns);
  return row ? toComment(row) : undefined;
}

export async function insertComment(
  db: Q,
  c: { id?: string; surveyId: string; orgId: string; target: CommentTarget; parentId: string | null; body: string; authorId: string; revision: number },
): Promise<ReviewComment> {
  const [row] = await db('review_comments')
    .insert({
      ...(c.id ? { id: c.id } : {}),
      survey_id: c.surveyId,
      organisation_id: c.orgId,
      target_kind: c.target.kind,
      target_id: c.target.id,
      parent_id: c.parentId,
      body: c.body,
      author_id: c.authorId,
      revision: c.revision,
    })
    .returning('id');
  return (await findComment(db, c.surveyId, row.id))!;
}

export async function listComments(db: Q, surveyIds: string[]): Promise<ReviewComment[]> {
  if (surveyIds.length === 0) return [];
  const rows = await commentsQuery(db).whereIn('c.survey_id', surveyIds).orderBy('c.created_at', 'asc').orderBy('c.id').select(commentColumns);
  return rows.map(toComment);
}

// ---- verdicts ------------------------------------------------------------------------------------

const toVerdict = (r: Record<string, unknown>): Verdict => ({
  scope: r.scope as 'survey' | 'boundary',
  boundaryId: r.scope === 'boundary' ? (r.boundary_id as string) : null,
  verdict: r.verdict as string,
  note: (r.note as string | null) ?? null,
  setByName: r.set_by_name as string,
  revision: r.revision as number,
  setAt: iso(r.set_at as Date)!,
});

export async function upsertVerdict(
  db: Q,
  v: { surveyId: string; orgId: string; scope: 'survey' | 'boundary'; boundaryId: string | null; verdict: string; note: string | null; setBy: string; revision: number },
): Promise<Verdict> {
  const row = {
    survey_id: v.surveyId,
    organisation_id: v.orgId,
    scope: v.scope,
    boundary_id: v.boundaryId ?? '',
    verdict: v.verdict,
    note: v.note,
    set_by: v.setBy,
    revision: v.revision,
    set_at: db.fn.now(),
  };
  await db('review_verdicts').insert(row).onConflict(['survey_id', 'scope', 'boundary_id']).merge(['verdict', 'note', 'set_by', 'revision', 'set_at']);
  const list = await listVerdicts(db, [v.surveyId]);
  return list.find((x) => x.scope === v.scope && (x.boundaryId ?? '') === (v.boundaryId ?? ''))!;
}

export async function listVerdicts(db: Q, surveyIds: string[]): Promise<(Verdict & { surveyId: string })[]> {
  if (surveyIds.length === 0) return [];
  const rows = await db('review_verdicts as v')
    .join('users as u', 'u.id', 'v.set_by')
    .whereIn('v.survey_id', surveyIds)
    .orderBy([{ column: 'v.scope', order: 'desc' }, { column: 'v.set_at' }])
    .select('v.*', 'u.name as set_by_name');
  return rows.map((r) => ({ ...toVerdict(r), surveyId: r.survey_id as string }));
}

// ---- operating limits ----------------------------------------------------------------------------

const toLimit = (r: Record<string, unknown>): OperatingLimit => ({
  id: r.id as string,
  rule: r.rule as LimitRule,
  text: (r.text as string | null) ?? null,
  createdByName: r.created_by_name as string,
  revision: r.revision as number,
  createdAt: iso(r.created_at as Date)!,
});

export async function insertLimit(
  db: Q,
  l: { surveyId: string; orgId: string; rule: LimitRule; text: string | null; createdBy: string; revision: number },
): Promise<OperatingLimit> {
  const [row] = await db('operating_limits')
    .insert({ survey_id: l.surveyId, organisation_id: l.orgId, rule: JSON.stringify(l.rule), text: l.text, created_by: l.createdBy, revision: l.revision })
    .returning('id');
  return (await listLimits(db, [l.surveyId])).find((x) => x.id === row.id)!;
}

export async function removeLimit(db: Q, surveyId: string, limitId: string, by: string): Promise<boolean> {
  const n = await db('operating_limits').where({ id: limitId, survey_id: surveyId }).whereNull('removed_at').update({ removed_at: db.fn.now(), removed_by: by });
  return n === 1;
}

export async function listLimits(db: Q, surveyIds: string[]): Promise<(OperatingLimit & { surveyId: string })[]> {
  if (surveyIds.length === 0) return [];
  const rows = await db('operating_limits as l')
    .join('users as u', 'u.id', 'l.created_by')
    .whereIn('l.survey_id', surveyIds)
    .whereNull('l.removed_at')
    .orderBy('l.created_at', 'asc')
    .select('l.*', 'u.name as created_by_name');
  return rows.map((r) => ({ ...toLimit(r), surveyId: r.survey_id as string }));
}

// ---- brief links ---------------------------------------------------------------------------------

const toBrief = (r: Record<string, unknown>): BriefLink => ({
  id: r.id as string,
  recipientEmail: r.recipient_email as string,
  units: r.units as 'si' | 'us',
  revision: r.revision as number,
  expiresAt: iso(r.expires_at as Date)!,
  createdAt: iso(r.created_at as Date)!,
  createdByName: r.created_by_name as string,
  revokedAt: iso((r.revoked_at as Date | null) ?? null),
  openings: Number(r.openings ?? 0),
  lastOpenedAt: iso((r.last_opened_at as Date | null) ?? null),
  acknowledgement: r.ack_name ? { name: r.ack_name as string, at: iso(r.ack_at as Date)!, revision: Number(r.ack_revision) } : null,
});

function briefsQuery(db: Q) {
  return db('brief_links as b')
    .join('users as u', 'u.id', 'b.created_by')
    .select(
      'b.*',
      'u.name as created_by_name',
      db.raw('(select count(*) from brief_openings o where o.brief_link_id = b.id) as openings'),
      db.raw('(select max(opened_at) from brief_openings o where o.brief_link_id = b.id) as last_opened_at'),
      'a.name as ack_name',
      'a.acknowledged_at as ack_at',
      'a.revision as ack_revision',
    )
    .joinRaw(
      'left join lateral (select name, acknowledged_at, revision from brief_acknowledgements k where k.brief_link_id = b.id order by acknowledged_at desc, id desc limit 1) a on true',
    );
}

export async function insertBrief(
  db: Q,
  b: { surveyId: string; orgId: string; tokenHash: string; recipientEmail: string; units: 'si' | 'us'; revision: number; expiresAt: Date; createdBy: string },
): Promise<BriefLink> {
  const [row] = await db('brief_links')
    .insert({
      survey_id: b.surveyId,
      organisation_id: b.orgId,
      token_hash: b.tokenHash,
      recipient_email: b.recipientEmail,
      units: b.units,
      revision: b.revision,
      expires_at: b.expiresAt,
      created_by: b.createdBy,
    })
    .returning('id');
  return toBrief(await briefsQuery(db).where('b.id', row.id).first());
}

export async function listBriefs(db: Q, surveyId: string): Promise<BriefLink[]> {
  const rows = await briefsQuery(db).where('b.survey_id', surveyId).orderBy('b.created_at', 'desc');
  return rows.map(toBrief);
}

export async function findBriefInOrg(db: Q, orgId: string, briefId: string): Promise<(BriefLink & { surveyId: string }) | undefined> {
  const row = await briefsQuery(db).where({ 'b.id': briefId, 'b.organisation_id': orgId }).first();
  return row ? { ...toBrief(row), surveyId: row.survey_id } : undefined;
}

export async function revokeBrief(db: Q, briefId: string, by: string): Promise<void> {
  await db('brief_links').where({ id: briefId }).whereNull('revoked_at').update({ revoked_at: db.fn.now(), revoked_by: by });
}

export interface LiveBrief {
  id: string;
  surveyId: string;
  orgId: string;
  units: 'si' | 'us';
  revision: number;
  expiresAt: string;
}

/** A link by its token's hash, only while it is neither revoked nor expired. */
export async function findLiveBrief(db: Q, tokenHash: string): Promise<LiveBrief | undefined> {
  const row = await db('brief_links')
    .where({ token_hash: tokenHash })
    .whereNull('revoked_at')
    .andWhere('expires_at', '>', db.fn.now())
    .first('id', 'survey_id', 'organisation_id', 'units', 'revision', 'expires_at');
  return row
    ? { id: row.id, surveyId: row.survey_id, orgId: row.organisation_id, units: row.units, revision: row.revision, expiresAt: iso(row.expires_at)! }
    : undefined;
}

export async function logBriefOpening(db: Q, briefId: string, ip: string | null, userAgent: string | null): Promise<void> {
  await db('brief_openings').insert({ brief_link_id: briefId, ip, user_agent: userAgent?.slice(0, 300) ?? null });
}

export async function insertBriefAcknowledgement(db: Q, a: { briefId: string; name: string; revision: number; ip: string | null; userAgent: string | null }): Promise<void> {
  await db('brief_acknowledgements').insert({ brief_link_id: a.briefId, name: a.name, revision: a.revision, ip: a.ip, user_agent: a.userAgent?.slice(0, 300) ?? null });
}

/** The latest acknowledgement of a link, for the brief page itself. */
export async function lastBriefAcknowledgement(db: Q, briefId: string): Promise<{ name: string; at: string; revision: number } | null> {
  const row = await db('brief_acknowledgements').where({ brief_link_id: briefId }).orderBy([{ column: 'acknowledged_at', order: 'desc' }, { column: 'id', order: 'desc' }]).first('name', 'acknowledged_at', 'revision');
  return row ? { name: row.name, at: iso(row.acknowledged_at)!, revision: row.revision } : null;
}

/** The engineer who issued a link: name and e-mail, so the master knows whom to call. */
export async function briefIssuer(db: Q, briefId: string): Promise<{ name: string; email: string } | null> {
  const row = await db('brief_links as b').join('users as u', 'u.id', 'b.created_by').where('b.id', briefId).first('u.name', 'u.email');
  return row ? { name: row.name, email: row.email } : null;
}

export async function organisationName(db: Q, orgId: string): Promise<string> {
  const row = await db('organisations').where({ id: orgId }).first('name');
  return row?.name ?? '';
}

export async function userName(db: Q, userId: string): Promise<string> {
  const row = await db('users').where({ id: userId }).first('name');
  return row?.name ?? '';
}

/** Any comment with this id, on any survey (a device-made id must not collide with another's comment). */
export async function findCommentAnywhere(db: Q, commentId: string): Promise<{ surveyId: string; authorId: string } | undefined> {
  const row = await db('review_comments').where({ id: commentId }).first('survey_id', 'author_id');
  return row ? { surveyId: row.survey_id as string, authorId: row.author_id as string } : undefined;
}

/** Closes or reopens a thread (its first comment); false when there is no such thread on the survey. */
export async function setCommentResolution(db: Q, surveyId: string, commentId: string, resolvedBy: string | null): Promise<boolean> {
  const n = await db('review_comments')
    .where({ id: commentId, survey_id: surveyId })
    .whereNull('parent_id')
    .update({ resolved_at: resolvedBy ? db.fn.now() : null, resolved_by: resolvedBy });
  return n > 0;
}
