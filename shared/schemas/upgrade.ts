/**
 * Older survey documents brought up to the current survey format, step by step (v1 → v2 → …).
 * Applied wherever a document that may be old is read: an imported file, the device store, the
 * server's stored documents (migrations/20261203001500_survey_format_v2.ts), a survey a device
 * pushes, the command-line calculator. Nothing here imports zod or the schema, so the device
 * store can use it without loading validation (see the bundle budget in DEVELOPERS.md).
 *
 * To add a step: raise SURVEY_SCHEMA_VERSION, add `STEPS[old]`, which takes a document of version
 * `old` and returns one of version `old + 1` (never changing its input in place), a Dexie version
 * whose upgrade calls `upgradeStoredSurveys` (client/src/offline/db.ts), and a Knex migration whose
 * `up` is that of migrations/20261203001500_survey_format_v2.ts (it upgrades to the current version).
 */

/** The version of the survey format this code writes and reads. */
export const SURVEY_SCHEMA_VERSION = 2;

type Doc = Record<string, unknown>;

const STEPS: Record<number, (doc: Doc) => Doc> = {
  /**
   * v2 adds optional fields only (hydrostatic particulars and downflooding points per condition,
   * and the other optional additions of the same release), so a v1 document is a valid v2 document
   * as it stands. The version still changes: an app that only knows v1 would otherwise drop the
   * new fields without a word when it reads a v2 document (the schema strips unknown keys);
   * instead it refuses the document and asks for an update.
   */
  1: (doc) => ({ ...doc, schemaVersion: 2 }),
};

const isDoc = (v: unknown): v is Doc => typeof v === 'object' && v !== null && !Array.isArray(v);

/**
 * The document in the current format. Anything that is not an older survey document (not an
 * object, no integer version, the current or a newer version) comes back as it was, the very same
 * value, for the schema to accept or to refuse with its own message. Never changes its input.
 */
export function upgradeSurvey(doc: unknown): unknown {
  if (!isDoc(doc)) return doc;
  let version = doc.schemaVersion;
  if (typeof version !== 'number' || !Number.isInteger(version) || version < 1 || version >= SURVEY_SCHEMA_VERSION) return doc;
  let out: Doc = doc;
  while (version < SURVEY_SCHEMA_VERSION) {
    const step = STEPS[version];
    if (!step) return out;
    out = step(out);
    version += 1;
  }
  return out;
}

/** Whether a document is of an older format version that upgradeSurvey would change. */
export function needsUpgrade(doc: unknown): boolean {
  return upgradeSurvey(doc) !== doc;
}
