/** SQL for reading surveys: the list page, one survey, one survey as its stored JSON text. */
import type { Survey } from '@shared/schemas/survey';
import type { Conflict, ListSurveysQuery, StoredResults, SurveyStatus, SurveySummary } from '@shared/schemas/sync';
import type { Role } from '@shared/api/roles';
import { runNamed } from '../knex';
import { iso, isoSql, MEMBER_ROLE_SQL, memberParams, type MemberCheck, type Q, currentFormat } from './survey-sql';
import { toConflict, type ConflictRow } from './conflicts';

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
      [...memberParams(member), ...filter, ...filter, q.pageSize, (q.page - 1) * q.pageSize],
  );
  const row = rows[0] as { member_role: Role | null; total: number; items_json: string };
  return { itemsJson: row.items_json, total: Number(row.total), memberRole: member ? row.member_role : null };
}

export async function findSurvey(db: Q, orgId: string, id: string): Promise<(SurveySummary & { doc: Survey }) | undefined> {
  const row = await summaryQuery(db).select('s.doc').where({ 's.id': id, 's.organisation_id': orgId }).first();
  return row ? { ...toSummary(row as SummaryRow), doc: currentFormat((row as { doc: Survey }).doc) } : undefined;
}

/** Latest results' metadata, with the results themselves as their stored JSON text. */
export type RawResults = Omit<StoredResults, 'results'> & { resultsJson: string };

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
      [...memberParams(member), known.docRevision ?? -1, id, orgId, known.resultsRevision ?? -1, engineVersion],
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
