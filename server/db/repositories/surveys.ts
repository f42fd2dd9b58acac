/** SQL for surveys, their revisions, results, processed changes and conflicts. snake_case stops here. */
import type { Knex } from 'knex';
import type { Survey } from '@shared/schemas/survey';
import { upgradeSurvey } from '@shared/schemas/upgrade';
import type {
  Conflict,
  ConflictTarget,
  ListSurveysQuery,
  PushStatus,
  SurveyResults,
  SurveyStatus,
  SurveySummary,
  SyncedSurvey,
} from '@shared/schemas/sync';
import type { FieldChange, FieldRevisions } from '@shared/sync/merge';
import type { Role } from '@shared/api/roles';
import { runNamed } from '../knex';

type Q = Knex | Knex.Transaction;

/** jsonb parameters go as JSON text: node-postgres would turn a JS array into a PostgreSQL array. */
const json = (v: unknown) => JSON.stringify(v ?? null);
const iso = (d: Date | string | null | undefined) => (d == null ? null : new Date(d).toISOString());
/**
 * A stored document in the current format. The migration of 2026-12-03 upgraded every stored
 * document; this covers one written meanwhile by an older server. The same object when current.
 */
const current = (doc: Survey): Survey => upgradeSurvey(doc) as Survey;

export interface SurveyState {
  id: string;
  orgId: string;
  doc: Survey;
  revision: number;
  revs: FieldRevisions;
  status: SurveyStatus;
  vesselId: string | null;
}

interface SurveyRow {
  id: string;
  organisation_id: string;
  doc: Survey;
  revision: number;
  field_revisions: FieldRevisions;
  status: SurveyStatus;
  vessel_id: string | null;
}

const toState = (r: SurveyRow): SurveyState => ({
  id: r.id,
  orgId: r.organisation_id,
  doc: current(r.doc),
  revision: r.revision,
  revs: r.field_revisions ?? {},
  status: r.status,
  vesselId: r.vessel_id,
});

/** What a push run starts from, read in one round trip: see lockForRun. */
export interface RunStart {
  /** The caller's active role when a member was checked (null: not an active member). */
  memberRole: Role | null;
  survey?: SurveyState;
  seen: Map<string, ProcessedChange>;
}

/**
 * One round trip at the start of a push run: locks the survey row for this transaction
 * (SELECT … FOR UPDATE, undefined when the organisation has no such survey; with `lock: false` only
 * reads it, for an optimistic run), looks up which of the
 * changes were already processed, and with `member` the caller's active role. The look-up reads as
 * of the statement's start, so a change recorded by a transaction that held the lock while we waited
 * is not seen here; recording it again then inserts fewer rows than expected (insertRunWrites), and
 * the run is redone, when it is seen.
 */
export async function lockForRun(
  trx: Q,
  orgId: string,
  id: string,
  changes: { id: string; deviceId: string; seq: number }[],
  member?: MemberCheck,
  opts: { lock: boolean } = { lock: true },
): Promise<RunStart> {
  // Fixed text whatever the number of changes (arrays as parameters), so it stays one prepared statement.
  const { rows } = await runNamed(
    trx,
    opts.lock ? 'bl_lock_for_run' : 'bl_read_for_run',
      `WITH s AS (
         SELECT id, organisation_id, doc, revision, field_revisions, status, vessel_id
         FROM surveys WHERE id = ? AND organisation_id = ? ${opts.lock ? 'FOR UPDATE' : ''}
       )
       SELECT (SELECT role FROM memberships WHERE user_id = ? AND organisation_id = ? AND status = 'active') AS member_role,
              (SELECT row_to_json(s) FROM s) AS survey,
              (SELECT json_agg(json_build_object('device_id', pc.device_id, 'seq', pc.seq, 'change_id', pc.change_id,
                        'organisation_id', pc.organisation_id, 'status', pc.status, 'revision', pc.revision,
                        'reason', pc.reason, 'conflict_ids', pc.conflict_ids))
                 -- Two index look-ups (by device and sequence, and by change id), never a scan of the history.
                 FROM (SELECT pc.device_id, pc.seq, pc.change_id, pc.organisation_id, pc.status, pc.revision, pc.reason, pc.conflict_ids
                         FROM processed_changes pc JOIN unnest(?::uuid[], ?::int[]) AS k(device_id, seq)
                           ON pc.device_id = k.device_id AND pc.seq = k.seq
                       UNION
                       SELECT pc.device_id, pc.seq, pc.change_id, pc.organisation_id, pc.status, pc.revision, pc.reason, pc.conflict_ids
                         FROM processed_changes pc WHERE pc.change_id = ANY(?::uuid[])) AS pc) AS seen`,
      [
        id,
        orgId,
        member?.userId ?? null,
        member?.orgId ?? null,
        changes.map((c) => c.deviceId),
        changes.map((c) => c.seq),
        changes.map((c) => c.id),
      ],
  );
  const row = rows[0] as { member_role: Role | null; survey: SurveyRow | null; seen: ProcessedJsonRow[] | null };
  return {
    memberRole: member ? row.member_role : null,
    survey: row.survey ? toState(row.survey) : undefined,
    seen: processedOf(changes, row.seen ?? []),
  };
}

export async function surveyIdTaken(db: Q, id: string): Promise<boolean> {
  return Boolean(await db('surveys').where({ id }).first('id'));
}

/** The vessel of this name in the organisation, made when new. */
export async function findOrCreateVessel(db: Q, orgId: string, vessel: { name: string; imo?: string }): Promise<string> {
  const found = await db('vessels').where({ organisation_id: orgId }).whereRaw('lower(name) = lower(?)', [vessel.name]).first('id');
  if (found) return found.id;
  const [row] = await db.raw(
    `INSERT INTO vessels (organisation_id, name, imo) VALUES (?, ?, ?)
     ON CONFLICT (organisation_id, lower(name)) DO UPDATE SET name = vessels.name RETURNING id`,
    [orgId, vessel.name, vessel.imo ?? null],
  ).then((r: { rows: { id: string }[] }) => r.rows);
  return row.id;
}

export interface SurveyColumns {
  doc: Survey;
  revision: number;
  revs: FieldRevisions;
  title: string;
  vesselName: string;
  vesselId: string | null;
  soundingsAt: string | null;
}

export async function insertSurvey(
  db: Q,
  s: SurveyColumns & { id: string; orgId: string; createdBy: string },
): Promise<void> {
  await db('surveys').insert({
    id: s.id,
    organisation_id: s.orgId,
    vessel_id: s.vesselId,
    vessel_name: s.vesselName,
    title: s.title,
    created_by: s.createdBy,
    doc: json(s.doc),
    revision: s.revision,
    field_revisions: json(s.revs),
    soundings_at: s.soundingsAt,
  });
}

export interface RevisionRow {
  surveyId: string;
  revision: number;
  orgId: string;
  userId: string;
  deviceId: string | null;
  changeId: string | null;
  changes: FieldChange[];
}

export async function insertRevisions(db: Q, rows: RevisionRow[]): Promise<void> {
  if (rows.length === 0) return;
  await db('survey_revisions').insert(rows.map(revisionRow));
}

export const insertRevision = (db: Q, r: RevisionRow) => insertRevisions(db, [r]);

export async function revisionAuthor(db: Q, surveyId: string, revision: number): Promise<string | null> {
  const row = await db('survey_revisions').where({ survey_id: surveyId, revision }).first('user_id');
  return row?.user_id ?? null;
}

export interface ProcessedChange {
  orgId: string;
  status: Exclude<PushStatus, 'duplicate'>;
  revision: number | null;
  reason: string | null;
  conflictIds: string[];
}

interface ProcessedJsonRow {
  device_id: string;
  seq: number;
  change_id: string;
  organisation_id: string;
  status: Exclude<PushStatus, 'duplicate'>;
  revision: number | null;
  reason: string | null;
  conflict_ids: string[] | null;
}

/** Which of `changes` the recorded rows cover (matched by id, or by device and sequence number). */
function processedOf(changes: { id: string; deviceId: string; seq: number }[], rows: ProcessedJsonRow[]): Map<string, ProcessedChange> {
  const out = new Map<string, ProcessedChange>();
  for (const c of changes) {
    const row = rows.find((r) => r.change_id === c.id || (r.device_id === c.deviceId && Number(r.seq) === c.seq));
    if (row) {
      out.set(c.id, {
        orgId: row.organisation_id,
        status: row.status,
        revision: row.revision,
        reason: row.reason,
        conflictIds: row.conflict_ids ?? [],
      });
    }
  }
  return out;
}

export interface ProcessedRow {
  deviceId: string;
  seq: number;
  changeId: string;
  orgId: string;
  surveyId: string;
  userId: string;
  status: Exclude<PushStatus, 'duplicate'>;
  revision: number | null;
  reason: string | null;
  conflictIds: string[];
}

const revisionRow = (r: RevisionRow) => ({
  survey_id: r.surveyId,
  revision: r.revision,
  organisation_id: r.orgId,
  user_id: r.userId,
  device_id: r.deviceId,
  change_id: r.changeId,
  changes: json(r.changes),
});

const processedRow = (p: ProcessedRow) => ({
  device_id: p.deviceId,
  seq: p.seq,
  change_id: p.changeId,
  organisation_id: p.orgId,
  survey_id: p.surveyId,
  user_id: p.userId,
  status: p.status,
  revision: p.revision,
  reason: p.reason,
  conflict_ids: json(p.conflictIds),
});

/**
 * What a push run writes, in one statement: its revisions, its change records and the survey's new
 * state. `inserted`: how many change records were new (fewer than given when another transaction
 * recorded one of them first; the caller then redoes the run).
 *
 * With `onlyAtRevision` (an optimistic run, outside any transaction) the statement first locks the
 * survey row if it is still at that revision, and writes nothing at all otherwise (`guardHeld`
 * false). A change recorded meanwhile then fails the statement with a unique violation, which also
 * writes nothing.
 */
export async function insertRunWrites(
  q: Q,
  w: {
    revisions: RevisionRow[];
    processed: ProcessedRow[];
    survey?: { id: string; columns: SurveyColumns; docJson?: string };
    onlyAtRevision?: number;
    /** With `onlyAtRevision`: the organisation the survey must belong to. */
    orgId?: string;
    /** With `onlyAtRevision`: write only while this caller is an active member with one of these roles. */
    member?: MemberCheck & { roles: readonly Role[] };
  },
): Promise<{ inserted: number; guardHeld: boolean; memberRole: Role | null }> {
  const guarded = w.onlyAtRevision !== undefined;
  if (!guarded && !w.processed.length && !w.revisions.length && !w.survey) return { inserted: 0, guardHeld: true, memberRole: null };
  const surveyId = w.survey?.id ?? w.processed[0]?.surveyId ?? w.revisions[0]?.surveyId ?? null;
  // Rows go as one JSON array per table and the survey update is switched by a flag, so the text is
  // the same for every run: one prepared statement, parsed and planned once per connection.
  const when = guarded ? ' AND EXISTS (SELECT 1 FROM g)' : '';
  const c = w.survey?.columns;
  const { rows } = await runNamed(
    q,
    guarded ? 'bl_run_writes_at_revision' : 'bl_run_writes',
      `WITH g AS (
         SELECT id FROM surveys
          WHERE id = ? AND organisation_id = ? AND revision = ?
            AND (?::uuid IS NULL OR EXISTS (SELECT 1 FROM memberships m WHERE m.user_id = ? AND m.organisation_id = ?
                                              AND m.status = 'active' AND m.role = ANY(?::text[])))
          FOR UPDATE
       ),
       r AS (
         INSERT INTO survey_revisions (survey_id, revision, organisation_id, user_id, device_id, change_id, changes)
         SELECT survey_id, revision, organisation_id, user_id, device_id, change_id, changes
           FROM jsonb_populate_recordset(NULL::survey_revisions, ?::jsonb)
          WHERE true${when}
       ),
       u AS (
         UPDATE surveys SET doc = ?::json, revision = ?, field_revisions = ?::json, title = ?, vessel_name = ?,
                vessel_id = ?, soundings_at = ?, updated_at = now()
          WHERE id = ? AND ?::boolean${when}
       ),
       p AS (
         INSERT INTO processed_changes (device_id, seq, change_id, organisation_id, survey_id, user_id, status, revision, reason, conflict_ids)
         SELECT device_id, seq, change_id, organisation_id, survey_id, user_id, status, revision, reason, conflict_ids
           FROM jsonb_populate_recordset(NULL::processed_changes, ?::jsonb)
          WHERE true${when}
         ${guarded ? '' : 'ON CONFLICT DO NOTHING'}
         RETURNING 1
       )
       SELECT (SELECT count(*) FROM p)::int AS n, (SELECT count(*) FROM g)::int AS guard, ${MEMBER_ROLE_SQL} AS member_role`,
      [
        guarded ? surveyId : null,
        guarded ? (w.orgId ?? null) : null,
        w.onlyAtRevision ?? null,
        w.member?.userId ?? null,
        w.member?.userId ?? null,
        w.member?.orgId ?? null,
        w.member ? [...w.member.roles] : null,
        JSON.stringify(w.revisions.map((r) => ({ ...revisionRow(r), changes: r.changes }))),
        c ? (w.survey?.docJson ?? json(c.doc)) : null,
        c?.revision ?? null,
        c ? json(c.revs) : null,
        c?.title ?? null,
        c?.vesselName ?? null,
        c?.vesselId ?? null,
        c?.soundingsAt ?? null,
        w.survey?.id ?? null,
        Boolean(w.survey),
        JSON.stringify(w.processed.map((p) => ({ ...processedRow(p), conflict_ids: p.conflictIds }))),
        w.member?.userId ?? null,
        w.member?.orgId ?? null,
      ],
  );
  const row = rows[0] as { n: number; guard: number; member_role: Role | null };
  return { inserted: Number(row.n), guardHeld: !guarded || Number(row.guard) > 0, memberRole: w.member ? row.member_role : null };
}

// ---- conflicts ----

const CONFLICT_COLUMNS = [
  'c.id',
  'c.survey_id',
  'c.target',
  'c.proposed',
  'c.kept',
  'c.base_revision',
  'c.kept_revision',
  'c.proposed_device_id',
  'c.change_id',
  'c.status',
  'c.created_at',
  'c.resolved_at',
  'pu.id as proposed_by_id',
  'pu.name as proposed_by_name',
  'ku.id as kept_by_id',
  'ku.name as kept_by_name',
  'ru.id as resolved_by_id',
  'ru.name as resolved_by_name',
];

interface ConflictRow {
  id: string;
  survey_id: string;
  target: ConflictTarget;
  proposed: unknown;
  kept: unknown;
  base_revision: number;
  kept_revision: number;
  proposed_device_id: string;
  change_id: string;
  status: 'open' | 'resolved';
  created_at: Date;
  resolved_at: Date | null;
  proposed_by_id: string;
  proposed_by_name: string;
  kept_by_id: string | null;
  kept_by_name: string | null;
  resolved_by_id: string | null;
  resolved_by_name: string | null;
}

const toConflict = (r: ConflictRow): Conflict => ({
  id: r.id,
  surveyId: r.survey_id,
  target: r.target,
  proposed: r.proposed ?? null,
  kept: r.kept ?? null,
  baseRevision: r.base_revision,
  keptRevision: r.kept_revision,
  proposedBy: { id: r.proposed_by_id, name: r.proposed_by_name },
  proposedDeviceId: r.proposed_device_id,
  keptBy: r.kept_by_id ? { id: r.kept_by_id, name: r.kept_by_name ?? '' } : null,
  changeId: r.change_id,
  status: r.status,
  createdAt: iso(r.created_at)!,
  resolvedAt: iso(r.resolved_at),
  resolvedBy: r.resolved_by_id ? { id: r.resolved_by_id, name: r.resolved_by_name ?? '' } : null,
});

const conflictQuery = (db: Q) =>
  db('survey_conflicts as c')
    .join('users as pu', 'pu.id', 'c.proposed_by')
    .leftJoin('users as ku', 'ku.id', 'c.kept_by')
    .leftJoin('users as ru', 'ru.id', 'c.resolved_by');

export async function insertConflict(
  db: Q,
  c: {
    id: string;
    orgId: string;
    surveyId: string;
    target: ConflictTarget;
    proposed: unknown;
    kept: unknown;
    baseRevision: number;
    keptRevision: number;
    keptBy: string | null;
    keptDeviceId: string | null;
    proposedBy: string;
    proposedDeviceId: string;
    changeId: string;
  },
): Promise<void> {
  await db('survey_conflicts').insert({
    id: c.id,
    organisation_id: c.orgId,
    survey_id: c.surveyId,
    target: json(c.target),
    proposed: json(c.proposed),
    kept: json(c.kept),
    base_revision: c.baseRevision,
    kept_revision: c.keptRevision,
    kept_by: c.keptBy,
    kept_device_id: c.keptDeviceId,
    proposed_by: c.proposedBy,
    proposed_device_id: c.proposedDeviceId,
    change_id: c.changeId,
  });
}

export async function findConflicts(db: Q, orgId: string, ids: string[]): Promise<Conflict[]> {
  if (ids.length === 0) return [];
  const rows = await conflictQuery(db).where('c.organisation_id', orgId).whereIn('c.id', ids).select<ConflictRow[]>(CONFLICT_COLUMNS);
  return rows.map(toConflict);
}

export async function lockConflict(
  trx: Knex.Transaction,
  orgId: string,
  id: string,
): Promise<{ surveyId: string; status: 'open' | 'resolved'; target: ConflictTarget } | undefined> {
  const row = await trx('survey_conflicts').where({ id, organisation_id: orgId }).forUpdate().first('survey_id', 'status', 'target');
  return row ? { surveyId: row.survey_id, status: row.status, target: row.target } : undefined;
}

export async function markConflictResolved(db: Q, id: string, userId: string, changeId: string): Promise<void> {
  await db('survey_conflicts')
    .where({ id })
    .update({ status: 'resolved', resolved_at: db.fn.now(), resolved_by: userId, resolution_change_id: changeId });
}

export async function surveyConflicts(db: Q, orgId: string, surveyId: string, status?: 'open'): Promise<Conflict[]> {
  const q = conflictQuery(db).where({ 'c.organisation_id': orgId, 'c.survey_id': surveyId });
  if (status) q.andWhere('c.status', status);
  const rows = await q.orderBy('c.created_at').select<ConflictRow[]>(CONFLICT_COLUMNS);
  return rows.map(toConflict);
}

/** Conflicts of the organisation written by transactions at or after `sinceXid`. */
export async function conflictsSince(db: Q, orgId: string, sinceXid: string): Promise<Conflict[]> {
  const rows = await conflictQuery(db)
    .where('c.organisation_id', orgId)
    .andWhereRaw('c.change_xid >= ?::xid8', [sinceXid])
    .orderBy('c.created_at')
    .limit(5000)
    .select<ConflictRow[]>(CONFLICT_COLUMNS);
  return rows.map(toConflict);
}

// ---- reading surveys ----

const SUMMARY_COLUMNS = [
  's.id',
  's.title',
  's.vessel_name',
  's.status',
  's.revision',
  's.created_at',
  's.updated_at',
  's.soundings_at',
  'u.id as created_by_id',
  'u.name as created_by_name',
];

interface SummaryRow {
  id: string;
  title: string;
  vessel_name: string;
  status: SurveyStatus;
  revision: number;
  created_at: Date;
  updated_at: Date;
  soundings_at: Date | null;
  created_by_id: string;
  created_by_name: string;
  open_conflicts: number;
}

/** SUMMARY_COLUMNS and the open-conflict count as SQL text, for the fixed-text (prepared) reads. */
const SUMMARY_SQL = `s.id, s.title, s.vessel_name, s.status, s.revision, s.created_at, s.updated_at, s.soundings_at,
  u.id AS created_by_id, u.name AS created_by_name,
  (SELECT count(*) FROM survey_conflicts sc WHERE sc.survey_id = s.id AND sc.status = 'open')::int AS open_conflicts`;

/** The caller's active role, from the two parameters (user id, organisation id); NULL parameters: no check. */
const MEMBER_ROLE_SQL = `(SELECT role FROM memberships WHERE user_id = ? AND organisation_id = ? AND status = 'active')`;

const toSummary = (r: SummaryRow): SurveySummary => ({
  id: r.id,
  title: r.title,
  vesselName: r.vessel_name,
  status: r.status,
  revision: r.revision,
  createdBy: { id: r.created_by_id, name: r.created_by_name },
  createdAt: iso(r.created_at)!,
  updatedAt: iso(r.updated_at)!,
  soundingsAt: iso(r.soundings_at),
  openConflicts: Number(r.open_conflicts ?? 0),
});

const OPEN_CONFLICTS = (db: Q) =>
  db.raw(`(SELECT count(*) FROM survey_conflicts sc WHERE sc.survey_id = s.id AND sc.status = 'open')::int AS open_conflicts`);

const summaryQuery = (db: Q) => db('surveys as s').join('users as u', 'u.id', 's.created_by').select(SUMMARY_COLUMNS).select(OPEN_CONFLICTS(db));

const SORT_COLUMNS: Record<ListSurveysQuery['sort'], string> = {
  updated: 's.updated_at',
  created: 's.created_at',
  title: 'lower(s.title)',
  vessel: 'lower(s.vessel_name)',
  soundings: 's.soundings_at',
  status: 's.status',
};

/** Whose membership a read checks in its own query (see `checksMembership` in server/http/route.ts). */
export interface MemberCheck {
  userId: string;
  orgId: string;
}

/**
 * A page of the organisation's surveys and how many match, in one round trip; with `member`, the
 * caller's active role too (null: not an active member, and then nothing else counts). The page
 * comes as the JSON text of its SurveySummary items, built by PostgreSQL, so the rows are neither
 * parsed into objects nor serialised again on their way out.
 */
export async function listSurveysJson(
  db: Q,
  orgId: string,
  q: ListSurveysQuery,
  member?: MemberCheck,
): Promise<{ itemsJson: string; total: number; memberRole: Role | null }> {
  const dir = q.order === 'asc' ? 'ASC' : 'DESC';
  const order = `${SORT_COLUMNS[q.sort]} ${dir} NULLS LAST, s.id ${dir}`;
  const statuses = q.status?.length ? q.status : null;
  const like = q.q ? `%${q.q.replace(/[\\%_]/g, (m) => `\\${m}`)}%` : null;
  // Filters are switched by their parameters (NULL: no filter), so the text depends on the sort
  // alone: one prepared statement per sort and direction.
  const where = `s.organisation_id = ? AND (?::text[] IS NULL OR s.status = ANY(?::text[])) AND (?::text IS NULL OR s.title ILIKE ? OR s.vessel_name ILIKE ?)`;
  const filter = [orgId, statuses, statuses, like, like, like];
  const { rows } = await runNamed(
    db,
    `bl_list_${q.sort}_${dir}`,
      `SELECT ${MEMBER_ROLE_SQL} AS member_role,
              (SELECT count(*) FROM surveys s WHERE ${where})::int AS total,
              (SELECT coalesce(json_agg(json_build_object(
                        'id', p.id, 'title', p.title, 'vesselName', p.vessel_name, 'status', p.status, 'revision', p.revision,
                        'createdBy', json_build_object('id', p.created_by_id, 'name', p.created_by_name),
                        'createdAt', ${isoSql('p.created_at')}, 'updatedAt', ${isoSql('p.updated_at')},
                        'soundingsAt', ${isoSql('p.soundings_at')}, 'openConflicts', p.open_conflicts) ORDER BY p.page_row), '[]')::text
                 FROM (SELECT ${SUMMARY_SQL}, row_number() OVER (ORDER BY ${order}) AS page_row
                         FROM surveys s JOIN users u ON u.id = s.created_by
                        WHERE ${where}
                        ORDER BY ${order}
                        LIMIT ? OFFSET ?) AS p) AS items_json`,
      [member?.userId ?? null, member?.orgId ?? null, ...filter, ...filter, q.pageSize, (q.page - 1) * q.pageSize],
  );
  const row = rows[0] as { member_role: Role | null; total: number; items_json: string };
  return { itemsJson: row.items_json, total: Number(row.total), memberRole: member ? row.member_role : null };
}

export async function findSurvey(db: Q, orgId: string, id: string): Promise<(SurveySummary & { doc: Survey }) | undefined> {
  const row = await summaryQuery(db).select('s.doc').where({ 's.id': id, 's.organisation_id': orgId }).first();
  return row ? { ...toSummary(row as SummaryRow), doc: current((row as { doc: Survey }).doc) } : undefined;
}

/** Latest results' metadata, with the results themselves as their stored JSON text. */
export type RawResults = Omit<SurveyResults, 'results'> & { resultsJson: string };

/** What a survey read needs, from one round trip: see readSurveyRaw. */
export interface RawSurveyRead {
  /** The caller's active role when a member was checked (null: not an active member). */
  memberRole: Role | null;
  /** `docJson` is null when the caller already holds the document of this revision (`known.docRevision`). */
  survey?: SurveySummary & { docJson: string | null };
  /** The most recent results with this engine version (of any revision); `resultsJson` null as for the document. */
  results?: Omit<RawResults, 'resultsJson'> & { resultsJson: string | null };
  /** The survey's open conflicts, oldest first. */
  conflicts: Conflict[];
}

/** A timestamp as JSON text in the form `iso()` gives (milliseconds, truncated like node-postgres does). */
const isoSql = (col: string) => `to_char(${col} AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"')`;

/** Revisions whose document and results text the caller already holds: those come back as null, unread. */
export interface KnownText {
  docRevision?: number;
  resultsRevision?: number;
}

/**
 * A survey of the organisation as stored JSON text, its latest results (JSON text) and its open
 * conflicts, in one query; with `member`, the caller's active role too. A document is never changed
 * without a new revision and results are stored once per (revision, engine version), so text the
 * caller holds for the same revision is still current: it is neither read from storage nor sent.
 */
export async function readSurveyRaw(
  db: Q,
  orgId: string,
  id: string,
  engineVersion: string,
  member?: MemberCheck,
  known: KnownText = {},
): Promise<RawSurveyRead> {
  const { rows } = await runNamed(
    db,
    'bl_survey_read',
      `SELECT ${MEMBER_ROLE_SQL} AS member_role, ${SUMMARY_SQL},
              CASE WHEN s.revision = ? THEN NULL ELSE s.doc::text END AS doc_json,
              r.revision AS results_revision, r.engine_version, r.error, r.computed_at, r.results_json,
              (SELECT json_agg(json_build_object(
                  'id', c.id, 'survey_id', c.survey_id, 'target', c.target, 'proposed', c.proposed, 'kept', c.kept,
                  'base_revision', c.base_revision, 'kept_revision', c.kept_revision, 'proposed_device_id', c.proposed_device_id,
                  'change_id', c.change_id, 'status', c.status, 'created_at', ${isoSql('c.created_at')}, 'resolved_at', ${isoSql('c.resolved_at')},
                  'proposed_by_id', pu.id, 'proposed_by_name', pu.name, 'kept_by_id', ku.id, 'kept_by_name', ku.name,
                  'resolved_by_id', ru.id, 'resolved_by_name', ru.name) ORDER BY c.created_at)::text
                 FROM survey_conflicts c
                 JOIN users pu ON pu.id = c.proposed_by
                 LEFT JOIN users ku ON ku.id = c.kept_by
                 LEFT JOIN users ru ON ru.id = c.resolved_by
                WHERE c.organisation_id = s.organisation_id AND c.survey_id = s.id AND c.status = 'open') AS conflicts_json
         FROM (SELECT 1) AS one
         LEFT JOIN surveys s ON s.id = ? AND s.organisation_id = ?
         LEFT JOIN users u ON u.id = s.created_by
         LEFT JOIN LATERAL (
           SELECT revision, engine_version, error, computed_at,
                  CASE WHEN revision = ? THEN NULL ELSE coalesce(results::text, 'null') END AS results_json
             FROM survey_results
            WHERE survey_id = s.id AND engine_version = ?
            ORDER BY revision DESC
            LIMIT 1
         ) AS r ON true`,
      [member?.userId ?? null, member?.orgId ?? null, known.docRevision ?? -1, id, orgId, known.resultsRevision ?? -1, engineVersion],
  );
  const row = rows[0] as (SummaryRow & Record<string, unknown>) | undefined;
  const out: RawSurveyRead = { memberRole: member ? ((row?.member_role as Role | null) ?? null) : null, conflicts: [] };
  if (!row?.id) return out;
  out.survey = { ...toSummary(row), docJson: row.doc_json as string | null };
  if (row.results_revision != null) {
    out.results = {
      revision: row.results_revision as number,
      engineVersion: row.engine_version as string,
      error: row.error as string | null,
      computedAt: iso(row.computed_at as Date)!,
      resultsJson: row.results_json as string | null,
    };
  }
  if (row.conflicts_json) out.conflicts = (JSON.parse(row.conflicts_json as string) as ConflictRow[]).map(toConflict);
  return out;
}

// ---- results ----

export async function findResults(db: Q, surveyId: string, revision: number, engineVersion: string): Promise<SurveyResults | undefined> {
  const row = await db('survey_results')
    .where({ survey_id: surveyId, revision, engine_version: engineVersion })
    .first('revision', 'engine_version', 'results', 'error', 'computed_at');
  return row
    ? { revision: row.revision, engineVersion: row.engine_version, results: row.results, error: row.error, computedAt: iso(row.computed_at)! }
    : undefined;
}

/** The most recent results stored for a survey with this engine version. */
export async function latestResults(db: Q, surveyId: string, engineVersion: string): Promise<SurveyResults | undefined> {
  const row = await db('survey_results')
    .where({ survey_id: surveyId, engine_version: engineVersion })
    .orderBy('revision', 'desc')
    .first('revision', 'engine_version', 'results', 'error', 'computed_at');
  return row
    ? { revision: row.revision, engineVersion: row.engine_version, results: row.results, error: row.error, computedAt: iso(row.computed_at)! }
    : undefined;
}

export async function currentDoc(db: Q, id: string): Promise<{ doc: Survey; revision: number } | undefined> {
  const row = (await db('surveys').where({ id }).first('doc', 'revision')) as { doc: Survey; revision: number } | undefined;
  return row && { doc: current(row.doc), revision: row.revision };
}

/** The current document when its revision has no results of this engine version yet; undefined otherwise. */
export async function docNeedingResults(db: Q, id: string, engineVersion: string): Promise<{ doc: Survey; revision: number } | undefined> {
  const { rows } = await runNamed<{ doc: Survey; revision: number }>(
    db,
    'bl_doc_needing_results',
    `SELECT s.doc, s.revision FROM surveys s
      WHERE s.id = ?
        AND NOT EXISTS (SELECT 1 FROM survey_results r WHERE r.survey_id = s.id AND r.revision = s.revision AND r.engine_version = ?)`,
    [id, engineVersion],
  );
  return rows[0] && { doc: current(rows[0].doc), revision: rows[0].revision };
}

export async function insertResults(
  db: Q,
  r: { surveyId: string; revision: number; engineVersion: string; results: unknown; error: string | null },
): Promise<void> {
  await db('survey_results')
    .insert({ survey_id: r.surveyId, revision: r.revision, engine_version: r.engineVersion, results: json(r.results), error: r.error })
    .onConflict(['survey_id', 'revision', 'engine_version'])
    .ignore();
}

// ---- pull ----

/** The oldest transaction still running: everything older is settled (committed or rolled back). */
export async function snapshotXmin(trx: Knex.Transaction): Promise<string> {
  const r = await trx.raw('SELECT pg_snapshot_xmin(pg_current_snapshot())::text AS xmin');
  return r.rows[0].xmin;
}

/** Surveys of the organisation written at or after `floor` (or after the `after` position), in xid order. */
export async function surveysChangedSince(
  trx: Knex.Transaction,
  orgId: string,
  from: { floor: string } | { after: [string, string] },
  limit: number,
): Promise<(SyncedSurvey & { xid: string })[]> {
  const q = trx('surveys as s')
    .join('users as u', 'u.id', 's.created_by')
    .where('s.organisation_id', orgId)
    .select('s.id', 's.revision', 's.status', 's.doc', 's.updated_at', 'u.id as created_by_id', 'u.name as created_by_name')
    .select(trx.raw('s.change_xid::text AS xid'))
    .orderByRaw('s.change_xid, s.id')
    .limit(limit);
  if ('floor' in from) q.andWhereRaw('s.change_xid >= ?::xid8', [from.floor]);
  else q.andWhereRaw('(s.change_xid, s.id) > (?::xid8, ?::uuid)', from.after);
  const rows = await q;
  return rows.map((r) => ({
    id: r.id,
    revision: r.revision,
    status: r.status,
    doc: current(r.doc),
    createdBy: { id: r.created_by_id, name: r.created_by_name },
    updatedAt: iso(r.updated_at)!,
    xid: r.xid,
  }));
}
