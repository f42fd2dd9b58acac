/**
 * The flooding forecast of the survey as entered, worked out in its own Web Worker (`engine-client.ts`).
 *
 * The workspace starts it as soon as a survey opens or changes (`warmForecast`), so by the time the
 * surveyor opens Flooding the answer is usually there, and the forecast never holds the page: on a
 * throttled phone a first, cold run of the engine took over a second of the main thread. The answer
 * is kept per survey document (a new document after every edit), so the section and the workspace
 * share one run. Where no worker can start, or it broke, the forecast runs in place as before.
 */
import { useEffect, useState } from 'react';
import { forecastFlooding, type FloodForecast } from '@shared/engine';
import type { Survey } from '@shared/schemas/survey';
import { engineWorker, engineWorkerBroken } from '../worker/engine-client';

export type ForecastResult = { f: FloodForecast; error: null } | { f: null; error: string };

function failed(err: unknown): ForecastResult {
  return { f: null, error: err instanceof Error ? err.message : 'The forecast could not be run.' };
}

function inPlace(survey: Survey): ForecastResult {
  try {
    return { f: forecastFlooding(survey), error: null };
  } catch (err) {
    return failed(err);
  }
}

const runs = new WeakMap<Survey, Promise<ForecastResult>>();

/** Starts (or finds) the forecast of this survey document. */
export function warmForecast(survey: Survey): Promise<ForecastResult> {
  const known = runs.get(survey);
  if (known) return known;
  const run = (async (): Promise<ForecastResult> => {
    const w = engineWorker('forecast');
    if (!w) return inPlace(survey);
    try {
      return { f: await Promise.race([w.remote.forecast(survey), w.broken]), error: null };
    } catch (err) {
      // the engine's own refusal is shown; a worker that broke is replaced by the main thread
      return engineWorkerBroken('forecast') ? inPlace(survey) : failed(err);
    }
  })();
  runs.set(survey, run);
  return run;
}

/** This survey's forecast: null until the first answer; while a newer document is worked out, the last answer of the same survey. */
export function useForecast(survey: Survey): ForecastResult | null {
  const [shown, setShown] = useState<{ surveyId: string; value: ForecastResult } | null>(null);
  useEffect(() => {
    let current = true;
    void warmForecast(survey).then((value) => {
      if (current) setShown({ surveyId: survey.id, value });
    });
    return () => {
      current = false;
    };
  }, [survey]);
  return shown?.surveyId === survey.id ? shown.value : null;
}
