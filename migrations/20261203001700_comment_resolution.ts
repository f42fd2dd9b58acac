/**
 * A reviewer closes a comment thread: the thread's first comment records when and by whom. The row's
 * update touches change_xid (trigger from the surveys migration), so the pull carries it to devices.
 */
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('review_comments', (t) => {
    t.timestamp('resolved_at', { useTz: true });
    t.uuid('resolved_by').references('users.id');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('review_comments', (t) => {
    t.dropColumn('resolved_by');
    t.dropColumn('resolved_at');
  });
}
