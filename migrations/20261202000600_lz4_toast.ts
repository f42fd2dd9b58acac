import type { Knex } from 'knex';

// Survey documents and engine results are stored out of line and compressed. LZ4 compresses and
// decompresses several times faster than PostgreSQL's default (pglz) for a small loss of ratio, and
// every push writes a new document and every recomputation a new results value. Values already
// stored keep their compression until they are written again; both read back the same.
const COLUMNS = [
  ['surveys', 'doc'],
  ['survey_results', 'results'],
  ['survey_revisions', 'changes'],
] as const;

export async function up(knex: Knex): Promise<void> {
  for (const [table, column] of COLUMNS) await knex.raw('ALTER TABLE ?? ALTER COLUMN ?? SET COMPRESSION lz4', [table, column]);
}

export async function down(knex: Knex): Promise<void> {
  for (const [table, column] of COLUMNS) await knex.raw('ALTER TABLE ?? ALTER COLUMN ?? SET COMPRESSION pglz', [table, column]);
}
