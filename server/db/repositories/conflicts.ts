/** SQL for conflicts: storing, settling and reading them. */
import type { Knex } from 'knex';
import type { Conflict, ConflictTarget } from '@shared/schemas/sync';
import { iso, json, type Q } from './survey-sql';

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

export interface ConflictRow {
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

export const toConflict = (r: ConflictRow): Conflict => ({
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

export interface ConflictInsert {
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
}

export async function insertConflict(db: Q, c: ConflictInsert): Promise<void> {
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

/** Locks the organisation's conflicts with these ids (FOR UPDATE), for a run that settles them. */
export async function lockConflicts(
  trx: Knex.Transaction,
  orgId: string,
  ids: string[],
): Promise<Map<string, { surveyId: string; status: 'open' | 'resolved'; target: ConflictTarget }>> {
  const out = new Map<string, { surveyId: string; status: 'open' | 'resolved'; target: ConflictTarget }>();
  if (ids.length === 0) return out;
  const rows = await trx('survey_conflicts').where({ organisation_id: orgId }).whereIn('id', ids).orderBy('id').forUpdate().select('id', 'survey_id', 'status', 'target');
  for (const r of rows) out.set(r.id, { surveyId: r.survey_id, status: r.status, target: r.target });
  return out;
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
