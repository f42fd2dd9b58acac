import type { Knex } from 'knex';

// A survey's document and its field revisions are written whole by every push and read whole (as
// text or parsed in the app); nothing queries inside them except one list of boundary names for the
// review desk, which works on `json` alike. `json` keeps the text as written instead of building a
// binary JSONB value on every write and printing it back on every read, and EXTERNAL storage skips
// compressing a value that is replaced on the next push. Only the current document is kept per
// survey (revisions store what changed), so the extra bytes on disk stay small.
const COLUMNS = ['doc', 'field_revisions'] as const;

export async function up(knex: Knex): Promise<void> {
  for (const column of COLUMNS) {
    await knex.raw('ALTER TABLE surveys ALTER COLUMN ?? DROP DEFAULT', [column]);
    await knex.raw('ALTER TABLE surveys ALTER COLUMN ?? TYPE json USING ??::json', [column, column]);
    await knex.raw('ALTER TABLE surveys ALTER COLUMN ?? SET STORAGE EXTERNAL', [column]);
  }
  await knex.raw(`ALTER TABLE surveys ALTER COLUMN field_revisions SET DEFAULT '{}'::json`);
}

export async function down(knex: Knex): Promise<void> {
  for (const column of COLUMNS) {
    await knex.raw('ALTER TABLE surveys ALTER COLUMN ?? DROP DEFAULT', [column]);
    await knex.raw('ALTER TABLE surveys ALTER COLUMN ?? TYPE jsonb USING ??::jsonb', [column, column]);
    await knex.raw('ALTER TABLE surveys ALTER COLUMN ?? SET STORAGE EXTENDED', [column]);
  }
  await knex.raw(`ALTER TABLE surveys ALTER COLUMN field_revisions SET DEFAULT '{}'::jsonb`);
  await knex.raw('ALTER TABLE surveys ALTER COLUMN doc SET COMPRESSION lz4');
}
