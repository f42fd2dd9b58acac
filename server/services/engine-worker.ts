/**
 * Runs in a worker thread of the engine pool (server/services/engine-pool.ts): one survey document
 * in, its results out as JSON text (a string crosses threads as one copy; an 11 MB object graph
 * would be cloned field by field on the request loop's thread).
 */
import { computeSurvey } from '@shared/engine';
import type { Survey } from '@shared/schemas/survey';

export interface EngineOutput {
  resultsJson: string;
  error: string | null;
}

export default function compute(doc: Survey): EngineOutput {
  try {
    return { resultsJson: JSON.stringify(computeSurvey(doc)), error: null };
  } catch (err) {
    return { resultsJson: 'null', error: err instanceof Error ? err.message : String(err) };
  }
}
