/**
 * Accounts: invitations, refresh tokens (hashed, grouped in rotation families), password resets and
 * the audit log of security events. Every secret token is stored only as its SHA-256 hash.
 */
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('invitations', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE');
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.text('email').notNullable();
    t.text('role').notNullable().checkIn(['admin', 'engineer', 'surveyor']);
    t.uuid('invited_by').references('users.id').onDelete('SET NULL');
    t.text('token_hash').notNullable().unique();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('expires_at', { useTz: true }).notNullable();
    t.timestamp('accepted_at', { useTz: true });
    t.timestamp('revoked_at', { useTz: true });
    t.index(['organisation_id', 'user_id']);
  });

  await knex.schema.createTable('refresh_tokens', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE');
    t.uuid('family_id').notNullable();
    t.text('token_hash').notNullable().unique();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('expires_at', { useTz: true }).notNullable();
    /** Set when this token was exchanged for the next one; presenting it again is reuse. */
    t.timestamp('rotated_at', { useTz: true });
    t.timestamp('revoked_at', { useTz: true });
    t.index(['family_id']);
    t.index(['user_id']);
  });

  await knex.schema.createTable('password_resets', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.text('token_hash').notNullable().unique();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('expires_at', { useTz: true }).notNullable();
    t.timestamp('used_at', { useTz: true });
    t.index(['user_id']);
  });

  await knex.schema.createTable('audit_events', (t) => {
    t.bigIncrements('id').primary();
    t.uuid('organisation_id').references('organisations.id').onDelete('CASCADE');
    /** Who did it (null for a signed-out caller). */
    t.uuid('actor_id').references('users.id').onDelete('SET NULL');
    /** Whom it concerned, when that is a person. */
    t.uuid('subject_id').references('users.id').onDelete('SET NULL');
    t.text('event').notNullable();
    t.text('email');
    t.text('ip');
    t.text('user_agent');
    t.jsonb('details').notNullable().defaultTo('{}');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['organisation_id', 'created_at']);
    t.index(['event', 'created_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('audit_events');
  await knex.schema.dropTableIfExists('password_resets');
  await knex.schema.dropTableIfExists('refresh_tokens');
  await knex.schema.dropTableIfExists('invitations');
}
