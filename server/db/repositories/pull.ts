/** SQL of a pull: the snapshot's oldest running transaction and the surveys written since a cursor. */
import type { Knex } from 'knex';
import type { SyncedSurvey } from '@shared/schemas/sync';
import { iso, currentFormat } from './survey-sql';

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
    doc: currentFormat(r.doc),
    createdBy: { id: r.created_by_id, name: r.created_by_name },
    updatedAt: iso(r.updated_at)!,
    xid: r.xid,
  }));
}
