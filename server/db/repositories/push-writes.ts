/**
 * SQL of a push run: its opening read (the survey, the changes already recorded, the caller's role)
 * and the one statement that writes its revisions, change records and the survey's new state.
 */
import type { Knex } from 'knex';
import type { Role } from '@shared/api/roles';
import type { Survey } from '@shared/schemas/survey';
import type { PushStatus, SurveyStatus } from '@shared/schemas/sync';
import type { FieldRevisions } from '@shared/sync/merge';
import { runNamed } from '../knex';
import { json, MEMBER_ROLE_SQL, memberParams, type MemberCheck, type Q, currentFormat } from './survey-sql';
import { revisionRow, type RevisionRow, type SurveyColumns } from './surveys';

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
  doc: currentFormat(r.doc),
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
  caller: { orgId: string; userId: string },
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
       SELECT ${MEMBER_ROLE_SQL} AS member_role,
              (SELECT row_to_json(s) FROM s) AS survey,
              (SELECT json_agg(json_build_object('device_id', pc.device_id, 'seq', pc.seq, 'change_id', pc.change_id,
                        'organisation_id', pc.organisation_id, 'user_id', pc.user_id, 'status', pc.status, 'revision', pc.revision,
                        'reason', pc.reason, 'conflict_ids', pc.conflict_ids))
                 -- Two index look-ups (by owner, device and sequence, and by change id), never a scan of the history.
                 FROM (SELECT pc.device_id, pc.seq, pc.change_id, pc.organisation_id, pc.user_id, pc.status, pc.revision, pc.reason, pc.conflict_ids
                         FROM processed_changes pc JOIN unnest(?::uuid[], ?::int[]) AS k(device_id, seq)
                           ON pc.user_id = ?::uuid AND pc.device_id = k.device_id AND pc.seq = k.seq
                       UNION
                       SELECT pc.device_id, pc.seq, pc.change_id, pc.organisation_id, pc.user_id, pc.status, pc.revision, pc.reason, pc.conflict_ids
                         FROM processed_changes pc WHERE pc.change_id = ANY(?::uuid[])) AS pc) AS seen`,
      [
        id,
        caller.orgId,
        ...memberParams(member),
        changes.map((c) => c.deviceId),
        changes.map((c) => c.seq),
        caller.userId,
        changes.map((c) => c.id),
      ],
  );
  const row = rows[0] as { member_role: Role | null; survey: SurveyRow | null; seen: ProcessedJsonRow[] | null };
  return {
    memberRole: member ? row.member_role : null,
    survey: row.survey ? toState(row.survey) : undefined,
    seen: processedOf(caller.userId, changes, row.seen ?? []),
  };
}

export interface ProcessedChange {
  orgId: string;
  /** Who pushed it: a change id of someone else's is not a repeat of the caller's. */
  userId: string;
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
  user_id: string;
  status: Exclude<PushStatus, 'duplicate'>;
  revision: number | null;
  reason: string | null;
  conflict_ids: string[] | null;
}

/** Which of `changes` the recorded rows cover (matched by id, or by the caller's device and sequence number). */
function processedOf(userId: string, changes: { id: string; deviceId: string; seq: number }[], rows: ProcessedJsonRow[]): Map<string, ProcessedChange> {
  const out = new Map<string, ProcessedChange>();
  for (const c of changes) {
    const row = rows.find((r) => r.change_id === c.id || (r.user_id === userId && r.device_id === c.deviceId && Number(r.seq) === c.seq));
    if (row) {
      out.set(c.id, {
        orgId: row.organisation_id,
        userId: row.user_id,
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

/** What a run writes (see insertRunWrites). */
export interface RunWrites {
  revisions: RevisionRow[];
  processed: ProcessedRow[];
  /** `docJson` / `revsJson`: the document's and field revisions' JSON text when the caller has it already. */
  survey?: { id: string; columns: SurveyColumns; docJson?: string; revsJson?: string };
  onlyAtRevision?: number;
  /**
   * With `onlyAtRevision`: the review status the run was planned with. A status move does not change
   * the revision, and a run planned from a remembered state must not go ahead after one made by
   * another request or instance.
   */
  onlyAtStatus?: SurveyStatus;
  /** With `onlyAtRevision`: the organisation the survey must belong to. */
  orgId?: string;
  /** With `onlyAtRevision`: write only while this caller is an active member with one of these roles. */
  member?: MemberCheck & { roles: readonly Role[] };
}

/**
 * The statement's text: fixed for each of the two kinds (guarded or not). Rows go as one JSON array
 * per table and the survey update is switched by a flag, so the text is the same for every run: one
 * prepared statement, parsed and planned once per connection.
 */
function runWritesSql(guarded: boolean): string {
  const when = guarded ? ' AND EXISTS (SELECT 1 FROM g)' : '';
  return `WITH g AS (
         SELECT id FROM surveys
          WHERE id = ? AND organisation_id = ? AND revision = ? AND (?::text IS NULL OR status = ?::text)
            AND (?::uuid IS NULL OR EXISTS (SELECT 1 FROM memberships m WHERE m.user_id = ? AND m.organisation_id = ?
                                              AND m.status = 'active' AND m.role = ANY(?::text[])
                                              AND NOT EXISTS (SELECT 1 FROM refresh_tokens t
                                                               WHERE t.family_id = ?::uuid AND t.revoked_at IS NOT NULL)))
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
       SELECT (SELECT count(*) FROM p)::int AS n, (SELECT count(*) FROM g)::int AS guard, ${MEMBER_ROLE_SQL} AS member_role`;
}

/** The statement's parameters, in the order of its text. */
function runWritesParams(w: RunWrites, guarded: boolean): Knex.RawBinding[] {
  const surveyId = w.survey?.id ?? w.processed[0]?.surveyId ?? w.revisions[0]?.surveyId ?? null;
  const c = w.survey?.columns;
  return [
    guarded ? surveyId : null,
    guarded ? (w.orgId ?? null) : null,
    w.onlyAtRevision ?? null,
    w.onlyAtStatus ?? null,
    w.onlyAtStatus ?? null,
    w.member?.userId ?? null,
    w.member?.userId ?? null,
    w.member?.orgId ?? null,
    w.member ? [...w.member.roles] : null,
    w.member?.sessionId ?? null,
    JSON.stringify(w.revisions.map((r) => ({ ...revisionRow(r), changes: r.changes }))),
    c ? (w.survey?.docJson ?? json(c.doc)) : null,
    c?.revision ?? null,
    c ? (w.survey?.revsJson ?? json(c.revs)) : null,
    c?.title ?? null,
    c?.vesselName ?? null,
    c?.vesselId ?? null,
    c?.soundingsAt ?? null,
    w.survey?.id ?? null,
    Boolean(w.survey),
    JSON.stringify(w.processed.map((p) => ({ ...processedRow(p), conflict_ids: p.conflictIds }))),
    ...memberParams(w.member),
  ];
}

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
export async function insertRunWrites(q: Q, w: RunWrites): Promise<{ inserted: number; guardHeld: boolean; memberRole: Role | null }> {
  const guarded = w.onlyAtRevision !== undefined;
  if (!guarded && !w.processed.length && !w.revisions.length && !w.survey) return { inserted: 0, guardHeld: true, memberRole: null };
  const name = guarded ? 'bl_run_writes_at_revision' : 'bl_run_writes';
  const { rows } = await runNamed(q, name, runWritesSql(guarded), runWritesParams(w, guarded));
  const row = rows[0] as { n: number; guard: number; member_role: Role | null };
  return { inserted: Number(row.n), guardHeld: !guarded || Number(row.guard) > 0, memberRole: w.member ? row.member_role : null };
}
