import type { Knex } from 'knex';

// Engine results are written once and read whole (or by a path or two for the review queue). The
// `json` type keeps the text as written, so reading a survey no longer makes PostgreSQL print a
// binary JSONB value back into text on every request.
export async function up(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE survey_results ALTER COLUMN results TYPE json USING results::json');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE survey_results ALTER COLUMN results TYPE jsonb USING results::jsonb');
}
