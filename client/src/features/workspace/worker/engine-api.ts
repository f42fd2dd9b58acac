/**
 * What the engine worker offers through Comlink: the per-edit results of a survey and its flooding
 * forecast, worked out off the main thread so typing never waits for a big ship's loads. The answer crosses to the page by
 * structured clone (plain objects and typed-array columns), which keeps every number as computed:
 * `tests/unit/workspace/engine-worker.test.ts` holds it equal to the engine run in place.
 */
import { computeSurveySummary, forecastFlooding, type FloodForecast, type SurveySummary } from '@shared/engine';
import type { Survey } from '@shared/schemas/survey';

export const engineApi = {
  summary(survey: Survey): SurveySummary {
    return computeSurveySummary(survey);
  },
  /** The flooding forecast as entered (`use-forecast.ts` starts it when the survey opens). */
  forecast(survey: Survey): FloodForecast {
    return forecastFlooding(survey);
  },
};

export type EngineApi = typeof engineApi;
