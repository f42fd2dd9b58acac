/** The master's "received and understood" on a brief: who, when, from where, one row per acknowledgement. */
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('brief_acknowledgements', (t) => {
    t.bigIncrements('id');
    t.uuid('brief_link_id').notNullable().references('brief_links.id').onDelete('CASCADE');
    t.text('name').notNullable();
    t.integer('revision').notNullable();
    t.timestamp('acknowledged_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.text('ip');
    t.text('user_agent');
    t.index(['brief_link_id', 'acknowledged_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('brief_acknowledgements');
}
