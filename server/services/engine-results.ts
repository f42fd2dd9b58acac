/** Engine results of a stored survey revision: computed with the same engine the device runs, stored once. */
import { computeSurvey, ENGINE_VERSION } from '@shared/engine';
import type { Survey } from '@shared/schemas/survey';
import type { StoredResults } from '@shared/schemas/sync';
import type { Db } from '../db/knex';
import { findResults, insertResults } from '../db/repositories/surveys';

/** Runs the engine on a document; a failure is stored as the result's error, never thrown. */
export function runEngine(doc: Survey): { results: unknown; error: string | null } {
  try {
    return { results: computeSurvey(doc), error: null };
  } catch (err) {
    return { results: null, error: err instanceof Error ? err.message : String(err) };
  }
}

/** The stored results of a revision, computed and stored first if missing (e.g. after a crash). */
export async function ensureResults(db: Db, surveyId: string, revision: number, doc: Survey): Promise<StoredResults> {
  const found = await findResults(db, surveyId, revision, ENGINE_VERSION);
  if (found) return found;
  const { results, error } = runEngine(doc);
  await insertResults(db, { surveyId, revision, engineVersion: ENGINE_VERSION, results, error });
  return (await findResults(db, surveyId, revision, ENGINE_VERSION))!;
}
