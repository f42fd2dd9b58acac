/**
 * What the engine worker offers through Comlink: the per-edit results of a survey, worked out off the
 * main thread so typing never waits for a big ship's loads. The answer crosses to the page by
 * structured clone, which keeps every number as computed, except the boundary table's typed-array
 * columns, which are transferred (moved, not copied: the worker keeps no results), so the page
 * copies about half the bytes it did (`npm run bench -- browser-engine` times both copies).
 * `tests/unit/workspace/engine-worker.test.ts` holds the answer equal to the engine run in place.
 */
import { transfer } from 'comlink';
import { computeSurveySummary, type SurveySummary } from '@shared/engine';
import type { Survey } from '@shared/schemas/survey';

/** The buffers of the table's typed-array columns (each column has its own). */
function columnBuffers(summary: SurveySummary): ArrayBuffer[] {
  const buffers: ArrayBuffer[] = [];
  for (const column of Object.values(summary.boundaries)) {
    if (ArrayBuffer.isView(column) && column.buffer instanceof ArrayBuffer && !buffers.includes(column.buffer)) buffers.push(column.buffer);
  }
  return buffers;
}

export const engineApi = {
  summary(survey: Survey): SurveySummary {
    const summary = computeSurveySummary(survey);
    return transfer(summary, columnBuffers(summary));
  },
};

export type EngineApi = typeof engineApi;
