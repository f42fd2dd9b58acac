/**
 * Runs in a worker thread of the engine pool (server/services/engine-pool.ts). Two kinds of task:
 * - a stored survey by id (the results scheduler's path): the worker reads the current document
 *   from PostgreSQL itself, computes, and stores the results, so the request loop's thread never
 *   parses, copies or serialises the document or its results (for the largest allowed survey, a
 *   7 MB document and 10 MB of results: seconds of the loop's time on a busy host);
 * - a document handed in (a rare read that finds no results): results out as JSON text.
 */
import { computeSurvey } from '@shared/engine';
import type { Survey } from '@shared/schemas/survey';
import { createDb, type Db } from '../db/knex';
import { docNeedingResults, insertResults } from '../db/repositories/surveys';

export interface EngineOutput {
  resultsJson: string;
  error: string | null;
}

export type EngineTask =
  | { kind: 'doc'; doc: Survey }
  | { kind: 'stored'; databaseUrl: string; surveyId: string; engineVersion: string; minGapMs?: number };

/**
 * What a stored task did: the revision it computed and stored, or null when it had results already
 * or when results were stored less than `minGapMs` ago (then `waitMs` says how long to wait).
 */
export interface StoredOutcome {
  revision: number | null;
  waitMs?: number;
}

function run(doc: Survey): EngineOutput {
  try {
    return { resultsJson: JSON.stringify(computeSurvey(doc)), error: null };
  } catch (err) {
    return { resultsJson: 'null', error: err instanceof Error ? err.message : String(err) };
  }
}

// One small connection pool per worker thread and database, closed with the thread.
const pools = new Map<string, Db>();
const dbFor = (url: string) => pools.get(url) ?? pools.set(url, createDb(url, { min: 0, max: 1 })).get(url)!;

async function computeStored(task: Extract<EngineTask, { kind: 'stored' }>): Promise<StoredOutcome> {
  const db = dbFor(task.databaseUrl);
  const row = await docNeedingResults(db, task.surveyId, task.engineVersion, task.minGapMs);
  if (!row) return { revision: null };
  if ('waitMs' in row) return { revision: null, waitMs: row.waitMs };
  await insertResults(db, { surveyId: task.surveyId, revision: row.revision, engineVersion: task.engineVersion, ...run(row.doc) });
  return { revision: row.revision };
}

export default function compute(task: EngineTask): EngineOutput | Promise<StoredOutcome> {
  return task.kind === 'doc' ? run(task.doc) : computeStored(task);
}
