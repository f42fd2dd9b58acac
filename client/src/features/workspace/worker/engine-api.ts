/**
 * What the engine worker offers through Comlink: the per-edit results of a survey, worked out off the
 * main thread so typing never waits for a big ship's loads. The answer crosses to the page by
 * structured clone (plain objects and typed-array columns), which keeps every number as computed:
 * `tests/unit/workspace/engine-worker.test.ts` holds it equal to the engine run in place.
 */
import { computeSurveySummary, type SurveySummary } from '@shared/engine';
import type { Survey } from '@shared/schemas/survey';

export const engineApi = {
  summary(survey: Survey): SurveySummary {
    return computeSurveySummary(survey);
  },
};

export type EngineApi = typeof engineApi;
