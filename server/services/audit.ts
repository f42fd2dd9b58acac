/**
 * The audit log of security events: sign-ins (and failed ones), refresh-token reuse and answers taken as lost, role changes,
 * invitations, password resets, deactivations. Writing it never breaks the request it records.
 */
import type { Request } from 'express';
import type { Logger } from 'pino';
import type { Db } from '../db/knex';
import { insertAuditEvent, type AuditRow } from '../db/repositories/audit';

export type AuditEvent =
  | 'sign_in'
  | 'sign_in_failed'
  | 'sign_out'
  | 'refresh_token_reused'
  | 'refresh_answer_lost'
  | 'invitation_sent'
  | 'invitation_accepted'
  | 'role_changed'
  | 'member_deactivated'
  | 'member_reactivated'
  | 'password_reset_requested'
  | 'password_reset';

/** Where a request came from, for the log. */
export interface RequestMeta {
  ip?: string;
  userAgent?: string;
}

export const requestMeta = (req: Request): RequestMeta => ({ ip: req.ip, userAgent: req.get('user-agent') });

export type Audit = (event: AuditEvent, meta: RequestMeta, row: Omit<AuditRow, 'event' | 'ip' | 'userAgent'>) => Promise<void>;

export function createAudit(db: Db, logger: Logger): Audit {
  return async (event, meta, row) => {
    try {
      await insertAuditEvent(db, { ...row, event, ip: meta.ip, userAgent: meta.userAgent });
    } catch (err) {
      logger.error({ err, event }, 'could not write the audit log');
    }
  };
}
