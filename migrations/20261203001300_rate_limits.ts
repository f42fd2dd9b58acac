import type { Knex } from 'knex';

// Sign-in and reset counters in PostgreSQL, so every instance of the server counts together
// (rate-limiter-flexible's PostgreSQL store: its own table layout; `expire` is epoch milliseconds).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('rate_limits', (t) => {
    t.string('key', 255).primary();
    t.integer('points').notNullable().defaultTo(0);
    t.bigInteger('expire');
  });
  await knex.schema.raw('CREATE INDEX rate_limits_expire ON rate_limits (expire)');
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('rate_limits');
}
