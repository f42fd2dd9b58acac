/**
 * Surveys on the server: vessels, surveys (the current document and its revision), the immutable
 * revision trail, the engine results of each revision, the changes already processed (so each
 * device edit applies exactly once) and the conflicts waiting for a person.
 *
 * `change_xid` (xid8, set by a trigger to the writing transaction's id) is what `GET /api/sync/pull`
 * pages by: any table that must reach devices through the pull adds the column and the trigger
 * `brineline_touch_change_xid()` defined here.
 */
import type { Knex } from 'knex';

const touch = (table: string) => `
  CREATE TRIGGER ${table}_touch_change_xid BEFORE INSERT OR UPDATE ON ${table}
  FOR EACH ROW EXECUTE FUNCTION brineline_touch_change_xid()`;

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE OR REPLACE FUNCTION brineline_touch_change_xid() RETURNS trigger AS $$
    BEGIN
      NEW.change_xid := pg_current_xact_id();
      RETURN NEW;
    END
    $$ LANGUAGE plpgsql`);

  await knex.schema.createTable('vessels', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE');
    t.text('name').notNullable();
    t.text('imo');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.raw('CREATE UNIQUE INDEX vessels_org_name ON vessels (organisation_id, lower(name))');

  await knex.schema.createTable('surveys', (t) => {
    // Made on the device (crypto.randomUUID), so a survey has its id before it ever syncs.
    t.uuid('id').primary();
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE');
    t.uuid('vessel_id').references('vessels.id').onDelete('SET NULL');
    t.text('vessel_name').notNullable();
    t.text('title').notNullable();
    t.text('status').notNullable().defaultTo('draft').checkIn(['draft', 'submitted', 'in_review', 'accepted', 'returned']);
    t.uuid('created_by').notNullable().references('users.id');
    t.jsonb('doc').notNullable();
    t.integer('revision').notNullable().defaultTo(1);
    /** For every field and entity: { r: revision, d: device } of its last change (see shared/sync/merge.ts). */
    t.jsonb('field_revisions').notNullable().defaultTo('{}');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    /** Time of the active condition's soundings. */
    t.timestamp('soundings_at', { useTz: true });
    t.specificType('change_xid', 'xid8').notNullable().defaultTo(knex.raw('pg_current_xact_id()'));
    t.index(['organisation_id', 'updated_at']);
    t.index(['organisation_id', 'status']);
  });
  await knex.raw('CREATE INDEX surveys_org_change_xid ON surveys (organisation_id, change_xid, id)');
  await knex.raw(touch('surveys'));

  await knex.schema.createTable('survey_revisions', (t) => {
    t.uuid('survey_id').notNullable().references('surveys.id').onDelete('CASCADE');
    t.integer('revision').notNullable();
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE');
    t.uuid('user_id').notNullable().references('users.id');
    t.uuid('device_id');
    t.uuid('change_id');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    /** [{ entity, field, old, new }] */
    t.jsonb('changes').notNullable();
    t.primary(['survey_id', 'revision']);
  });
  // Revisions are history: never rewritten.
  await knex.raw(`
    CREATE OR REPLACE FUNCTION brineline_refuse_update() RETURNS trigger AS $$
    BEGIN
      RAISE EXCEPTION 'survey revisions are immutable';
    END
    $$ LANGUAGE plpgsql`);
  await knex.raw(`CREATE TRIGGER survey_revisions_immutable BEFORE UPDATE ON survey_revisions
    FOR EACH ROW EXECUTE FUNCTION brineline_refuse_update()`);

  await knex.schema.createTable('survey_results', (t) => {
    t.uuid('survey_id').notNullable().references('surveys.id').onDelete('CASCADE');
    t.integer('revision').notNullable();
    t.text('engine_version').notNullable();
    t.jsonb('results');
    t.text('error');
    t.timestamp('computed_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(['survey_id', 'revision', 'engine_version']);
  });

  await knex.schema.createTable('processed_changes', (t) => {
    t.uuid('device_id').notNullable();
    t.integer('seq').notNullable();
    t.uuid('change_id').notNullable().unique();
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE');
    t.uuid('survey_id').notNullable();
    t.uuid('user_id').notNullable().references('users.id');
    t.text('status').notNullable().checkIn(['applied', 'conflict', 'rejected']);
    t.integer('revision');
    t.text('reason');
    t.jsonb('conflict_ids').notNullable().defaultTo('[]');
    t.timestamp('processed_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(['device_id', 'seq']);
  });

  await knex.schema.createTable('survey_conflicts', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE');
    t.uuid('survey_id').notNullable().references('surveys.id').onDelete('CASCADE');
    t.jsonb('target').notNullable();
    t.jsonb('proposed');
    t.jsonb('kept');
    t.integer('base_revision').notNullable();
    t.integer('kept_revision').notNullable();
    t.uuid('kept_by').references('users.id');
    t.uuid('kept_device_id');
    t.uuid('proposed_by').notNullable().references('users.id');
    t.uuid('proposed_device_id').notNullable();
    t.uuid('change_id').notNullable();
    t.text('status').notNullable().defaultTo('open').checkIn(['open', 'resolved']);
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('resolved_at', { useTz: true });
    t.uuid('resolved_by').references('users.id');
    t.uuid('resolution_change_id');
    t.specificType('change_xid', 'xid8').notNullable().defaultTo(knex.raw('pg_current_xact_id()'));
    t.index(['survey_id', 'status']);
  });
  await knex.raw('CREATE INDEX survey_conflicts_org_change_xid ON survey_conflicts (organisation_id, change_xid)');
  await knex.raw(touch('survey_conflicts'));
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('survey_conflicts');
  await knex.schema.dropTableIfExists('processed_changes');
  await knex.schema.dropTableIfExists('survey_results');
  await knex.schema.dropTableIfExists('survey_revisions');
  await knex.schema.dropTableIfExists('surveys');
  await knex.schema.dropTableIfExists('vessels');
  await knex.raw('DROP FUNCTION IF EXISTS brineline_refuse_update()');
  await knex.raw('DROP FUNCTION IF EXISTS brineline_touch_change_xid()');
}
