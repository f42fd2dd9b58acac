/** SQL for who may change a survey's figures (the rule is shared/review/editing.ts). */
import type { Role } from '@shared/api/roles';
import { runNamed } from '../knex';
import { MEMBER_ROLE_SQL, memberParams, type MemberCheck, type Q } from './survey-sql';

/**
 * Who made each of `surveyIds` (those of the caller's organisation), with the caller's role from
 * the database: the stored membership, never the access token's claim. One round trip.
 */
export async function surveyMakers(q: Q, caller: MemberCheck, surveyIds: readonly string[]): Promise<{ makers: Map<string, string>; memberRole: Role | null }> {
  const { rows } = await runNamed<{ id: string | null; created_by: string | null; member_role: Role | null }>(
    q,
    'bl_survey_makers',
    `SELECT s.id, s.created_by, ${MEMBER_ROLE_SQL} AS member_role
       FROM (SELECT 1) AS one
       LEFT JOIN surveys s ON s.id = ANY(?::uuid[]) AND s.organisation_id = ?::uuid`,
    [...memberParams(caller), [...surveyIds], caller.orgId],
  );
  const makers = new Map(rows.flatMap((r) => (r.id && r.created_by ? [[r.id, r.created_by] as const] : [])));
  return { makers, memberRole: rows[0]?.member_role ?? null };
}
