/** SQL for survey rows themselves: ids, vessels, inserting a survey and its revisions, stored engine results. */
import type { Survey } from '@shared/schemas/survey';
import type { StoredResults } from '@shared/schemas/sync';
import type { FieldChange, FieldRevisions } from '@shared/sync/merge';
import { runNamed } from '../knex';
import { iso, json, type Q, currentFormat } from './survey-sql';

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

export const revisionRow = (r: RevisionRow) => ({
  survey_id: r.surveyId,
  revision: r.revision,
  organisation_id: r.orgId,
  user_id: r.userId,
  device_id: r.deviceId,
  change_id: r.changeId,
  changes: json(r.changes),
});

export async function insertRevision(db: Q, r: RevisionRow): Promise<void> {
  await db('survey_revisions').insert(revisionRow(r));
}

export async function revisionAuthor(db: Q, surveyId: string, revision: number): Promise<string | null> {
  const row = await db('survey_revisions').where({ survey_id: surveyId, revision }).first('user_id');
  return row?.user_id ?? null;
}

export async function findResults(db: Q, surveyId: string, revision: number, engineVersion: string): Promise<StoredResults | undefined> {
  const row = await db('survey_results')
    .where({ survey_id: surveyId, revision, engine_version: engineVersion })
    .first('revision', 'engine_version', 'results', 'error', 'computed_at');
  return row
    ? { revision: row.revision, engineVersion: row.engine_version, results: row.results, error: row.error, computedAt: iso(row.computed_at)! }
    : undefined;
}

/** The most recent results stored for a survey with this engine version. */
export async function latestResults(db: Q, surveyId: string, engineVersion: string): Promise<StoredResults | undefined> {
  const row = await db('survey_results')
    .where({ survey_id: surveyId, engine_version: engineVersion })
    .orderBy('revision', 'desc')
    .first('revision', 'engine_version', 'results', 'error', 'computed_at');
  return row
    ? { revision: row.revision, engineVersion: row.engine_version, results: row.results, error: row.error, computedAt: iso(row.computed_at)! }
    : undefined;
}

/** The current document when its revision has no results of this engine version yet; undefined otherwise. */
/**
 * The current document of a survey that has no results for its current revision and this engine
 * version, or undefined when it has them. With `minGapMs`, a survey whose results (of any revision)
 * were stored less than that long ago, by this instance or another, is not handed out: the answer
 * says how long to wait instead, so several instances told of the same edits compute a survey about
 * once per gap between them, not once each.
 */
export async function docNeedingResults(
  db: Q,
  id: string,
  engineVersion: string,
  minGapMs = 0,
): Promise<{ doc: Survey; revision: number } | { waitMs: number } | undefined> {
  const { rows } = await runNamed<{ doc: Survey | null; revision: number; since_ms: number | null }>(
    db,
    'bl_doc_needing_results',
    `SELECT CASE WHEN l.since_ms IS NULL OR l.since_ms >= ? THEN s.doc END AS doc, s.revision, l.since_ms
       FROM surveys s
       LEFT JOIN LATERAL (
         SELECT (extract(epoch FROM clock_timestamp() - max(r.computed_at)) * 1000)::float8 AS since_ms
           FROM survey_results r WHERE r.survey_id = s.id AND r.engine_version = ?
       ) l ON true
      WHERE s.id = ?
        AND NOT EXISTS (SELECT 1 FROM survey_results r WHERE r.survey_id = s.id AND r.revision = s.revision AND r.engine_version = ?)`,
    [minGapMs, engineVersion, id, engineVersion],
  );
  const row = rows[0];
  if (!row) return undefined;
  if (!row.doc) return { waitMs: Math.max(1, Math.ceil(minGapMs - (row.since_ms ?? 0))) };
  return { doc: currentFormat(row.doc), revision: row.revision };
}

export async function insertResults(
  db: Q,
  r: { surveyId: string; revision: number; engineVersion: string; /** The results as JSON text. */ resultsJson: string; error: string | null },
): Promise<void> {
  await db('survey_results')
    .insert({ survey_id: r.surveyId, revision: r.revision, engine_version: r.engineVersion, results: r.resultsJson, error: r.error })
    .onConflict(['survey_id', 'revision', 'engine_version'])
    .ignore();
}
