/**
 * Access tokens name their session (the refresh-token family). Every request checks that the session
 * has not been ended (signed out, a password reset, a deactivation, a reused refresh token): one
 * look-up in this small partial index, folded into the membership query.
 */
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw('CREATE INDEX refresh_tokens_revoked_family ON refresh_tokens (family_id) WHERE revoked_at IS NOT NULL');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP INDEX IF EXISTS refresh_tokens_revoked_family');
}
