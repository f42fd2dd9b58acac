/**
 * Survey format version 2: every stored document is brought up to the current format by the same
 * `upgradeSurvey` the app uses on files and on devices (shared/schemas/upgrade.ts), in batches so a
 * large table never sits in memory at once. The update touches `change_xid`, so every device pulls
 * the upgraded document. Revisions are history and keep what was written then.
 */
import type { Knex } from 'knex';
import { SURVEY_SCHEMA_VERSION, upgradeSurvey } from '../shared/schemas/upgrade';

const BATCH = 200;

export async function up(knex: Knex): Promise<void> {
  let after = '00000000-0000-0000-0000-000000000000';
  for (;;) {
    const { rows } = (await knex.raw(
      `SELECT id, doc::text AS doc FROM surveys
        WHERE id > ? AND json_typeof(doc->'schemaVersion') = 'number' AND (doc->>'schemaVersion')::numeric < ?
        ORDER BY id LIMIT ?`,
      [after, SURVEY_SCHEMA_VERSION, BATCH],
    )) as { rows: { id: string; doc: string }[] };
    if (rows.length === 0) return;
    for (const row of rows) {
      const doc = upgradeSurvey(JSON.parse(row.doc));
      await knex.raw('UPDATE surveys SET doc = ?::json WHERE id = ?', [JSON.stringify(doc), row.id]);
    }
    after = rows[rows.length - 1].id;
  }
}

/**
 * Back to version 1. Version 2 only added optional fields, which code of version 1 ignores, so only
 * the number changes; the added fields stay in the document for a later upgrade.
 */
export async function down(knex: Knex): Promise<void> {
  await knex.raw(
    `UPDATE surveys SET doc = jsonb_set(doc::jsonb, '{schemaVersion}', '1')::json
      WHERE json_typeof(doc->'schemaVersion') = 'number' AND (doc->>'schemaVersion')::numeric = 2`,
  );
}
