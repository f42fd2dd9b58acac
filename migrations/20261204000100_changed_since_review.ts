/**
 * Accepted means accepted. A new status, `changed_since_review`, and two triggers on `surveys` that
 * apply the rule in the database itself, in the same statement as the edit, so no writer (the
 * optimistic push, the locked push, anything added later) can apply an edit and leave the survey
 * "accepted":
 * - BEFORE UPDATE, when the revision grows while the survey is sent, under review or accepted
 *   (CHANGE_SENDS_BACK in shared/review/status.ts): the document as it was — the one sent or
 *   reviewed — is kept in `review_snapshots` under its revision, and the status becomes
 *   `changed_since_review`. The master's brief shows the accepted revision from there.
 * - AFTER UPDATE, when the status became `changed_since_review`: a row in `status_events` (which
 *   reaches devices through the pull), by the author of the first new revision, at that revision.
 * Surveys already changed after their last move (before this rule existed) are moved too.
 */
import type { Knex } from 'knex';

const OLD_STATUSES = ['draft', 'submitted', 'in_review', 'accepted', 'returned'];
const NEW_STATUSES = [...OLD_STATUSES, 'changed_since_review'];
const SENDS_BACK = "('submitted', 'in_review', 'accepted')";

async function setStatusCheck(knex: Knex, statuses: string[]): Promise<void> {
  const { rows } = await knex.raw(
    `SELECT conname FROM pg_constraint WHERE conrelid = 'surveys'::regclass AND contype = 'c' AND pg_get_constraintdef(oid) LIKE '%status%'`,
  );
  for (const r of rows as { conname: string }[]) await knex.raw('ALTER TABLE surveys DROP CONSTRAINT ??', [r.conname]);
  // DDL takes no bind parameters: the statuses are this file's own fixed words.
  await knex.raw(`ALTER TABLE surveys ADD CONSTRAINT surveys_status_check CHECK (status IN (${statuses.map((x) => `'${x}'`).join(', ')}))`);
}

export async function up(knex: Knex): Promise<void> {
  await setStatusCheck(knex, NEW_STATUSES);

  await knex.schema.createTable('review_snapshots', (t) => {
    t.uuid('survey_id').notNullable().references('surveys.id').onDelete('CASCADE');
    t.integer('revision').notNullable();
    // As written whole and never queried inside, like surveys.doc.
    t.json('doc').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(['survey_id', 'revision']);
  });

  // Surveys edited after their last review move, before this rule: moved now (their document of
  // that time is gone, so they get no snapshot; the brief then withholds the figures).
  await knex.raw(`
    WITH last AS (
      SELECT DISTINCT ON (s.id) s.id, s.organisation_id, s.status, s.revision AS now_rev, e.revision AS moved_rev, s.created_by
        FROM surveys s JOIN status_events e ON e.survey_id = s.id AND e.to_status = s.status
       WHERE s.status IN ${SENDS_BACK}
       ORDER BY s.id, e.at DESC
    ), changed AS (
      UPDATE surveys s SET status = 'changed_since_review', updated_at = now()
        FROM last WHERE s.id = last.id AND last.now_rev > last.moved_rev
      RETURNING s.id
    )
    INSERT INTO status_events (survey_id, organisation_id, from_status, to_status, note, actor_id, revision)
    SELECT last.id, last.organisation_id, last.status, 'changed_since_review', NULL,
           coalesce((SELECT user_id FROM survey_revisions r WHERE r.survey_id = last.id AND r.revision = last.moved_rev + 1), last.created_by),
           last.moved_rev + 1
      FROM last JOIN changed ON changed.id = last.id`);

  await knex.raw(`
    CREATE OR REPLACE FUNCTION brineline_change_sends_back() RETURNS trigger AS $$
    BEGIN
      INSERT INTO review_snapshots (survey_id, revision, doc) VALUES (OLD.id, OLD.revision, OLD.doc)
        ON CONFLICT (survey_id, revision) DO NOTHING;
      NEW.status := 'changed_since_review';
      RETURN NEW;
    END
    $$ LANGUAGE plpgsql`);
  await knex.raw(`
    CREATE TRIGGER surveys_change_sends_back BEFORE UPDATE ON surveys
    FOR EACH ROW WHEN (NEW.revision > OLD.revision AND OLD.status IN ${SENDS_BACK})
    EXECUTE FUNCTION brineline_change_sends_back()`);

  // An AFTER trigger sees the whole statement's writes, so the revision row the push inserted
  // beside this update (same statement) names the author.
  await knex.raw(`
    CREATE OR REPLACE FUNCTION brineline_log_sent_back() RETURNS trigger AS $$
    BEGIN
      INSERT INTO status_events (survey_id, organisation_id, from_status, to_status, note, actor_id, revision)
      VALUES (NEW.id, NEW.organisation_id, OLD.status, NEW.status, NULL,
              coalesce((SELECT user_id FROM survey_revisions WHERE survey_id = NEW.id AND revision = OLD.revision + 1), NEW.created_by),
              OLD.revision + 1);
      RETURN NULL;
    END
    $$ LANGUAGE plpgsql`);
  await knex.raw(`
    CREATE TRIGGER surveys_log_sent_back AFTER UPDATE ON surveys
    FOR EACH ROW WHEN (NEW.status = 'changed_since_review' AND OLD.status IS DISTINCT FROM NEW.status)
    EXECUTE FUNCTION brineline_log_sent_back()`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP TRIGGER IF EXISTS surveys_log_sent_back ON surveys');
  await knex.raw('DROP TRIGGER IF EXISTS surveys_change_sends_back ON surveys');
  await knex.raw('DROP FUNCTION IF EXISTS brineline_log_sent_back()');
  await knex.raw('DROP FUNCTION IF EXISTS brineline_change_sends_back()');
  await knex.schema.dropTableIfExists('review_snapshots');
  // Needs review again: the nearest older status that says so.
  await knex('surveys').where({ status: 'changed_since_review' }).update({ status: 'submitted' });
  await setStatusCheck(knex, OLD_STATUSES);
}
