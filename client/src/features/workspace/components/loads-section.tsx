/**
 * "Loads": everything computed for the survey, with the cautions beside it. The loads use the
 * measured attitude (the readings) unless the surveyor chooses the attitude the ship's response
 * predicts; then every liquid keeps its volume, is levelled again at that attitude, spaces open to
 * the sea stand at its waterline, and the numbers say so at the top.
 */
import { Cautions } from '@client/components/layout/cautions';
import { ShipTotals, EngineWarnings } from '@client/features/results/components/ship-totals';
import { BoundaryResultsTable } from '@client/features/results/components/boundary-results-table';
import { BoundaryDetail } from '@client/features/results/components/boundary-detail';
import { CompartmentTable } from '@client/features/results/components/compartment-table';
import { AttitudeInUse, useShipResponse, type LoadsAttitude } from '@client/features/results/components/ship-response';
import type { SectionProps } from '../utils/types';
import { secondaryBtn } from '@client/components/ui/fields';
import { useSearchParams } from 'react-router';
import { useMemo, useState } from 'react';
import { boundaryRows, computeBoundaryDetail, computeSurveySummary, conditionAtPredictedAttitude } from '@shared/engine';
import type { Survey } from '@shared/schemas/survey';
import { WithheldNotice } from './withheld-notice';

export function LoadsSection({ survey, results: measuredResults, rows: measuredRows, system, selectedId, select }: SectionProps) {
  const [, setParams] = useSearchParams();
  const [mode, setMode] = useState<LoadsAttitude>('measured');
  const { response } = useShipResponse(survey, measuredResults);
  // the survey at the predicted attitude, when it can be worked out (particulars given, every reading in)
  const predicted = useMemo(() => {
    if (!measuredResults || !response) return null;
    const at = conditionAtPredictedAttitude(survey, measuredResults, response);
    if (!at) return null;
    const doc: Survey = { ...survey, conditions: survey.conditions.map((c) => (c.id === at.id ? at : c)) };
    return { doc, response };
  }, [survey, measuredResults, response]);
  const usePredicted = mode === 'predicted' && predicted !== null;
  const shownSurvey = usePredicted ? predicted.doc : survey;
  const { results, rows } = useMemo(() => {
    if (!usePredicted) return { results: measuredResults, rows: measuredRows };
    const r = computeSurveySummary(predicted.doc, { conditionId: measuredResults!.conditionId });
    return { results: r, rows: boundaryRows(r.boundaries) };
  }, [usePredicted, predicted, measuredResults, measuredRows]);
  // the one boundary opened is computed in full (sides, parts, stiffeners, diagram) when opened
  const b = useMemo(() => (results && selectedId ? computeBoundaryDetail(shownSurvey, selectedId, { conditionId: results.conditionId }) : null), [shownSurvey, results, selectedId]);
  if (!results || !measuredResults) return <p className="text-ink-soft">No loads yet.</p>;
  const unavailable = !response ? 'no hydrostatic particulars (enter them under Stability)' : predicted === null ? 'every reading is needed first' : null;
  return (
    <section aria-labelledby="loads-h" className="space-y-5">
      <h2 id="loads-h" className="text-2xl">
        Loads
      </h2>
      <fieldset className="flex flex-wrap gap-x-4 gap-y-1 rounded-md border-2 border-line bg-card p-2" data-testid="loads-attitude-choice">
        <legend className="px-1 text-sm font-bold">Attitude the loads use</legend>
        <label className="flex min-h-touch items-center gap-2">
          <input type="radio" name="loads-attitude" checked={mode === 'measured'} onChange={() => setMode('measured')} /> Measured (the readings)
        </label>
        <label className={`flex min-h-touch items-center gap-2 ${unavailable ? 'text-ink-soft' : ''}`}>
          <input type="radio" name="loads-attitude" checked={mode === 'predicted'} disabled={unavailable !== null} onChange={() => setMode('predicted')} aria-describedby={unavailable ? 'predicted-unavailable' : undefined} />{' '}
          Predicted (the ship’s response)
        </label>
        {unavailable && (
          <span id="predicted-unavailable" className="basis-full text-xs text-ink-soft">
            Predicted attitude not available: {unavailable}.
          </span>
        )}
      </fieldset>
      <AttitudeInUse survey={survey} results={measuredResults} system={system} mode={usePredicted ? 'predicted' : 'measured'} response={response} />
      <WithheldNotice results={results} />
      <ShipTotals results={results} rows={rows} system={system} predicted={usePredicted} />
      <EngineWarnings results={results} />
      <div className="space-y-2">
        <h3 className="text-xl">Boundaries</h3>
        <BoundaryResultsTable results={results} rows={rows} system={system} selectedId={selectedId} onSelect={(id) => select(id === selectedId ? null : id)} />
      </div>
      {b && (
        <div className="rounded-lg border-2 border-hull bg-card p-3">
          <BoundaryDetail boundary={b} results={results} system={system} />
          <button type="button" className={`${secondaryBtn} mt-3`} onClick={() => setParams({ s: 'plates', item: b.id }, { replace: true })}>
            Edit {b.name}
          </button>
        </div>
      )}
      <div className="space-y-2">
        <h3 className="text-xl">Liquids in each space</h3>
        <CompartmentTable results={results} system={system} />
      </div>
      <Cautions />
      <p className="text-xs text-ink-soft">Engine {results.engineVersion}, computed on this device.</p>
    </section>
  );
}
