/**
 * The workspace's per-edit results (`computeSurveySummary`) and their boundary rows.
 *
 * A small survey is computed in place, in the render that shows it (a few milliseconds). A big one
 * (more than `IN_PLACE_MAX_BOUNDARIES` boundaries: on a 2,000-boundary ship the engine took well over
 * 50 ms of a throttled phone's main thread) is computed in a Web Worker through Comlink, so typing and
 * scrolling never wait for it; meanwhile the screens keep showing the survey's previous results. Where
 * no worker can start (or it fails), the survey is computed in place as before. Both give the same
 * numbers: the worker runs the same engine and its answer crosses by structured clone.
 */
import { useEffect, useMemo, useState } from 'react';
import { boundaryRows, computeSurveySummary, type BoundarySummary, type SurveySummary } from '@shared/engine';
import type { Survey } from '@shared/schemas/survey';
import { engineWorker, engineWorkerBroken } from '../worker/engine-client';

export interface SurveyResults {
  results: SurveySummary | null;
  rows: BoundarySummary[];
  error: string | null;
}

/** Up to this many boundaries the engine runs in place (well under 50 ms on a throttled phone). */
export const IN_PLACE_MAX_BOUNDARIES = 300;

const NONE: SurveyResults = { results: null, rows: [], error: null };

function failed(err: unknown): SurveyResults {
  return { results: null, rows: [], error: err instanceof Error ? err.message : 'The loads could not be computed.' };
}

function withRows(results: SurveySummary): SurveyResults {
  return { results, rows: boundaryRows(results.boundaries), error: null };
}

function computeInPlace(survey: Survey): SurveyResults {
  try {
    return withRows(computeSurveySummary(survey));
  } catch (err) {
    return failed(err);
  }
}

async function computeOffThread(survey: Survey): Promise<SurveyResults> {
  const e = engineWorker('engine');
  if (!e) return computeInPlace(survey);
  try {
    return withRows(await Promise.race([e.remote.summary(survey), e.broken]));
  } catch (err) {
    // the engine's own refusal (bad geometry…) is shown; a worker that broke is replaced by the main thread
    if (engineWorkerBroken('engine')) return computeInPlace(survey);
    return failed(err);
  }
}

export function useSurveySummary(survey: Survey | undefined): SurveyResults {
  const big = !!survey && survey.boundaries.length > IN_PLACE_MAX_BOUNDARIES;
  const inPlace = useMemo(() => (survey && !big ? computeInPlace(survey) : null), [survey, big]);
  const [offThread, setOffThread] = useState<{ surveyId: string; value: SurveyResults } | null>(null);
  useEffect(() => {
    if (!survey || !big) return;
    let current = true;
    void computeOffThread(survey).then((value) => {
      if (current) setOffThread({ surveyId: survey.id, value });
    });
    return () => {
      current = false;
    };
  }, [survey, big]);
  if (!survey) return NONE;
  if (inPlace) return inPlace;
  // until the worker answers: the previous results of this survey (never another survey's)
  return offThread?.surveyId === survey.id ? offThread.value : NONE;
}
