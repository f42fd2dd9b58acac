/** Engine results of a stored survey revision: computed with the same engine the device runs, stored once. */
import { ENGINE_VERSION } from '@shared/engine';
import type { Survey } from '@shared/schemas/survey';
import type { StoredResults } from '@shared/schemas/sync';
import type { Db } from '../db/knex';
import { findResults, insertResults } from '../db/repositories/surveys';
import { computeInPool } from './engine-pool';
import type { EngineOutput } from './engine-worker';

/**
 * Runs the engine on a document in the worker pool, off the request loop; a failure is stored as
 * the result's error, never thrown.
 */
export function runEngine(doc: Survey): Promise<EngineOutput> {
  return computeInPool(doc);
}

/** The stored results of a revision, computed and stored first if missing (e.g. after a crash). */
export async function ensureResults(db: Db, surveyId: string, revision: number, doc: Survey): Promise<StoredResults> {
  const found = await findResults(db, surveyId, revision, ENGINE_VERSION);
  if (found) return found;
  const { resultsJson, error } = await runEngine(doc);
  await insertResults(db, { surveyId, revision, engineVersion: ENGINE_VERSION, resultsJson, error });
  return (await findResults(db, surveyId, revision, ENGINE_VERSION))!;
}
