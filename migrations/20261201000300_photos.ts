/** Photos: metadata here, bytes in object storage under a generated key. The id is made on the device. */
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('photos', (t) => {
    t.uuid('id').primary();
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE');
    t.uuid('survey_id').notNullable().references('surveys.id').onDelete('CASCADE');
    t.text('entity_kind').notNullable().checkIn(['survey', 'condition', 'compartment', 'boundary']);
    t.uuid('entity_id').notNullable();
    t.text('caption').notNullable().defaultTo('');
    t.text('content_type').notNullable();
    t.integer('size_bytes').notNullable();
    t.text('sha256').notNullable();
    t.text('storage_key').notNullable().unique();
    t.uuid('uploaded_by').notNullable().references('users.id');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['organisation_id', 'survey_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('photos');
}
