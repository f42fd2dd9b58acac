/**
 * The review desk and the master's brief: status history, comments, verdicts, operating limits,
 * brief links (only the sha256 of each token is stored) and a log of every brief opening.
 * Comments, verdicts, limits and status events reach the surveyor's device through the sync pull,
 * so they carry `change_xid` with the trigger from 20261201000200_surveys.
 */
import type { Knex } from 'knex';

const PULLED = ['status_events', 'review_comments', 'review_verdicts', 'operating_limits'] as const;

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('status_events', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.specificType('change_xid', 'xid8').notNullable().defaultTo(knex.raw('pg_current_xact_id()'));
    t.uuid('survey_id').notNullable().references('surveys.id').onDelete('CASCADE');
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE');
    t.text('from_status').notNullable();
    t.text('to_status').notNullable();
    t.text('note');
    t.uuid('actor_id').notNullable().references('users.id');
    t.integer('revision').notNullable();
    t.timestamp('at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['survey_id', 'at']);
  });

  await knex.schema.createTable('review_comments', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.specificType('change_xid', 'xid8').notNullable().defaultTo(knex.raw('pg_current_xact_id()'));
    t.uuid('survey_id').notNullable().references('surveys.id').onDelete('CASCADE');
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE');
    t.text('target_kind').notNullable().checkIn(['survey', 'vessel', 'condition', 'compartment', 'boundary', 'photo']);
    t.text('target_id').notNullable();
    t.uuid('parent_id').references('review_comments.id').onDelete('CASCADE');
    t.text('body').notNullable();
    t.uuid('author_id').notNullable().references('users.id');
    t.integer('revision').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['survey_id', 'created_at']);
  });

  await knex.schema.createTable('review_verdicts', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.specificType('change_xid', 'xid8').notNullable().defaultTo(knex.raw('pg_current_xact_id()'));
    t.uuid('survey_id').notNullable().references('surveys.id').onDelete('CASCADE');
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE');
    t.text('scope').notNullable().checkIn(['survey', 'boundary']);
    /** The boundary's id, or '' for the survey's own verdict, so one unique index covers both. */
    t.text('boundary_id').notNullable().defaultTo('');
    t.text('verdict').notNullable();
    t.text('note');
    t.uuid('set_by').notNullable().references('users.id');
    t.integer('revision').notNullable();
    t.timestamp('set_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['survey_id', 'scope', 'boundary_id']);
  });

  await knex.schema.createTable('operating_limits', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.specificType('change_xid', 'xid8').notNullable().defaultTo(knex.raw('pg_current_xact_id()'));
    t.uuid('survey_id').notNullable().references('surveys.id').onDelete('CASCADE');
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE');
    t.jsonb('rule').notNullable();
    t.text('text');
    t.uuid('created_by').notNullable().references('users.id');
    t.integer('revision').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('removed_at', { useTz: true });
    t.uuid('removed_by').references('users.id');
    t.index(['survey_id']);
  });

  for (const table of PULLED) {
    await knex.raw(`CREATE INDEX ${table}_org_change_xid ON ${table} (organisation_id, change_xid)`);
    await knex.raw(`CREATE TRIGGER ${table}_touch_change_xid BEFORE INSERT OR UPDATE ON ${table}
      FOR EACH ROW EXECUTE FUNCTION brineline_touch_change_xid()`);
  }

  await knex.schema.createTable('brief_links', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('survey_id').notNullable().references('surveys.id').onDelete('CASCADE');
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE');
    /** sha256 of the token, hex. The token itself is never stored. */
    t.text('token_hash').notNullable().unique();
    t.text('recipient_email').notNullable();
    t.text('units').notNullable().checkIn(['si', 'us']);
    t.integer('revision').notNullable();
    t.timestamp('expires_at', { useTz: true }).notNullable();
    t.uuid('created_by').notNullable().references('users.id');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('revoked_at', { useTz: true });
    t.uuid('revoked_by').references('users.id');
    t.index(['survey_id']);
  });

  await knex.schema.createTable('brief_openings', (t) => {
    t.bigIncrements('id');
    t.uuid('brief_link_id').notNullable().references('brief_links.id').onDelete('CASCADE');
    t.timestamp('opened_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.text('ip');
    t.text('user_agent');
    t.index(['brief_link_id', 'opened_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('brief_openings');
  await knex.schema.dropTableIfExists('brief_links');
  await knex.schema.dropTableIfExists('operating_limits');
  await knex.schema.dropTableIfExists('review_verdicts');
  await knex.schema.dropTableIfExists('review_comments');
  await knex.schema.dropTableIfExists('status_events');
}
