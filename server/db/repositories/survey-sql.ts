/** Helpers the survey repositories share: the query type, JSON parameters, timestamps, the membership check. */
import type { Knex } from 'knex';
import type { Survey } from '@shared/schemas/survey';
import { upgradeSurvey } from '@shared/schemas/upgrade';

export type Q = Knex | Knex.Transaction;

/** jsonb parameters go as JSON text: node-postgres would turn a JS array into a PostgreSQL array. */
export const json = (v: unknown) => JSON.stringify(v ?? null);

/**
 * A stored document in the current format. The migration of 2026-12-03 upgraded every stored
 * document; this covers one written meanwhile by an older server. The same object when current.
 */
export const currentFormat = (doc: Survey): Survey => upgradeSurvey(doc) as Survey;
export const iso = (d: Date | string | null | undefined) => (d == null ? null : new Date(d).toISOString());

/** A timestamp as JSON text in the form `iso()` gives (milliseconds, truncated like node-postgres does). */
export const isoSql = (col: string) => `to_char(${col} AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"')`;

/**
 * The caller's active role while their session (refresh-token family) has not been ended, from the
 * three parameters of `memberParams` (user id, organisation id, session id); NULL user: no check.
 * The session look-up is one probe of a partial index (refresh_tokens_revoked_family), usually empty.
 */
export const MEMBER_ROLE_SQL = `(SELECT role FROM memberships WHERE user_id = ? AND organisation_id = ? AND status = 'active'
   AND NOT EXISTS (SELECT 1 FROM refresh_tokens WHERE family_id = ?::uuid AND revoked_at IS NOT NULL))`;

/** Whose membership a read checks in its own query (see `checksMembership` in server/http/route.ts). */
export interface MemberCheck {
  userId: string;
  orgId: string;
  /** The session the access token names; ended sessions have no role. */
  sessionId?: string;
}

/** MEMBER_ROLE_SQL's parameters, in its order (all NULL without a member: no check). */
export const memberParams = (m: MemberCheck | undefined): (string | null)[] => [m?.userId ?? null, m?.orgId ?? null, m?.sessionId ?? null];
