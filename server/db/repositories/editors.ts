/** SQL for who may change a survey's figures (the rule is shared/review/editing.ts). */
import { runNamed } from '../knex';
import { MEMBER_ROLE_SQL, memberParams, type MemberCheck, type Q } from './survey-sql';

/**
 * Of `surveyIds`, those of the caller's organisation that the caller only reviews (an engineer who
 * did not make them: shared/review/editing.ts), with the caller's role from the database. One round
 * trip; asked only of a caller whose token says engineer.
 */
export async function surveysReviewedBy(q: Q, caller: MemberCheck, surveyIds: readonly string[]): Promise<{ reviewed: string[]; memberRole: string | null }> {
  const { rows } = await runNamed<{ id: string | null; member_role: string | null }>(
    q,
    'bl_surveys_reviewed_by',
    `WITH role AS (SELECT ${MEMBER_ROLE_SQL} AS member_role)
     SELECT s.id, (SELECT member_role FROM role) AS member_role
       FROM (SELECT 1) AS one
       LEFT JOIN surveys s ON s.id = ANY(?::uuid[]) AND s.organisation_id = ?::uuid AND s.created_by <> ?::uuid
                          AND (SELECT member_role FROM role) = 'engineer'`,
    [...memberParams(caller), [...surveyIds], caller.orgId, caller.userId],
  );
  return { reviewed: rows.flatMap((r) => (r.id ? [r.id] : [])), memberRole: rows[0]?.member_role ?? null };
}
