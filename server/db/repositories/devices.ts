/** SQL for device owners: a device id belongs to the person who first pushed with it. */
import { runNamed } from '../knex';
import { MEMBER_ROLE_SQL, memberParams, type MemberCheck, type Q } from './survey-sql';

/**
 * Claims each unowned device id for the caller, while the caller is an active member, and returns
 * every id's owner (after the claim) and the caller's role. One round trip. A device id already
 * owned keeps its owner; one claimed concurrently by someone else comes back with that owner.
 */
export async function claimDevices(
  q: Q,
  caller: MemberCheck,
  deviceIds: readonly string[],
): Promise<{ owners: Map<string, string>; memberRole: string | null }> {
  const { rows } = await runNamed<{ id: string | null; user_id: string | null; member_role: string | null }>(
    q,
    'bl_claim_devices',
    `WITH role AS (SELECT ${MEMBER_ROLE_SQL} AS member_role),
          ins AS (
            INSERT INTO devices (id, user_id, organisation_id)
            SELECT d, ?::uuid, ?::uuid FROM unnest(?::uuid[]) AS d
             WHERE (SELECT member_role FROM role) IS NOT NULL
            ON CONFLICT (id) DO NOTHING
            RETURNING id, user_id
          ),
          owners AS (
            SELECT id, user_id FROM ins
            UNION ALL
            SELECT id, user_id FROM devices WHERE id = ANY(?::uuid[]) AND id NOT IN (SELECT id FROM ins)
          )
     SELECT o.id, o.user_id, (SELECT member_role FROM role) AS member_role
       FROM (SELECT 1) AS one LEFT JOIN owners o ON true`,
    [...memberParams(caller), caller.userId, caller.orgId, [...deviceIds], [...deviceIds]],
  );
  const owners = new Map<string, string>();
  for (const r of rows) if (r.id && r.user_id) owners.set(r.id, r.user_id);
  return { owners, memberRole: rows[0]?.member_role ?? null };
}
