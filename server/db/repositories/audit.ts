import type { Knex } from 'knex';

type Q = Knex | Knex.Transaction;

export interface AuditRow {
  event: string;
  orgId?: string | null;
  actorId?: string | null;
  subjectId?: string | null;
  email?: string | null;
  ip?: string | null;
  userAgent?: string | null;
  details?: Record<string, unknown>;
}

export async function insertAuditEvent(db: Q, e: AuditRow): Promise<void> {
  await db('audit_events').insert({
    event: e.event,
    organisation_id: e.orgId ?? null,
    actor_id: e.actorId ?? null,
    subject_id: e.subjectId ?? null,
    email: e.email ?? null,
    ip: e.ip ?? null,
    user_agent: e.userAgent ? e.userAgent.slice(0, 300) : null,
    details: JSON.stringify(e.details ?? {}),
  });
}

export async function listAuditEvents(db: Q, filter: { orgId?: string; event?: string; email?: string }, limit = 100) {
  const q = db('audit_events').orderBy('id', 'desc').limit(limit);
  if (filter.orgId) q.where('organisation_id', filter.orgId);
  if (filter.event) q.where('event', filter.event);
  if (filter.email) q.whereRaw('lower(email) = lower(?)', [filter.email]);
  return q.select('event', 'organisation_id', 'actor_id', 'subject_id', 'email', 'details', 'created_at');
}
