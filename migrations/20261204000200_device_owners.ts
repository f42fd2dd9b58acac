/**
 * A device id belongs to the person who first pushed with it (`devices`), and a change record is
 * keyed by its owner too: (user, device, seq). Before this, (device, seq) was global, so another
 * member pushing with someone's device id and next sequence number made that person's real edit
 * come back "duplicate" and dropped it.
 */
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('devices', (t) => {
    t.uuid('id').primary();
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE');
    t.timestamp('first_push_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  // Devices already seen go to whoever pushed with them first.
  await knex.raw(`
    INSERT INTO devices (id, user_id, organisation_id, first_push_at)
    SELECT DISTINCT ON (device_id) device_id, user_id, organisation_id, processed_at
      FROM processed_changes
     ORDER BY device_id, processed_at, seq`);
  await knex.raw('ALTER TABLE processed_changes DROP CONSTRAINT processed_changes_pkey');
  await knex.raw('ALTER TABLE processed_changes ADD CONSTRAINT processed_changes_pkey PRIMARY KEY (user_id, device_id, seq)');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE processed_changes DROP CONSTRAINT processed_changes_pkey');
  // Rows that only the owner in the key kept apart cannot share the old key: keep the earliest.
  await knex.raw(`
    DELETE FROM processed_changes p USING processed_changes q
     WHERE p.device_id = q.device_id AND p.seq = q.seq AND (p.processed_at, p.user_id) > (q.processed_at, q.user_id)`);
  await knex.raw('ALTER TABLE processed_changes ADD CONSTRAINT processed_changes_pkey PRIMARY KEY (device_id, seq)');
  await knex.schema.dropTableIfExists('devices');
}
