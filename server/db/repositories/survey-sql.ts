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

/** The caller's active role, from the two parameters (user id, organisation id); NULL parameters: no check. */
export const MEMBER_ROLE_SQL = `(SELECT role FROM memberships WHERE user_id = ? AND organisation_id = ? AND status = 'active')`;

/** Whose membership a read checks in its own query (see `checksMembership` in server/http/route.ts). */
export interface MemberCheck {
  userId: string;
  orgId: string;
}
