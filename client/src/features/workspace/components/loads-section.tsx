/** "Loads": everything computed for the survey, with the cautions beside it. */
import { Cautions } from '@client/components/layout/cautions';
import { ShipTotals, EngineWarnings } from '@client/features/results/components/ship-totals';
import { BoundaryResultsTable } from '@client/features/results/components/boundary-results-table';
import { BoundaryDetail } from '@client/features/results/components/boundary-detail';
import { CompartmentTable } from '@client/features/results/components/compartment-table';
import { AttitudeInUse } from '@client/features/results/components/ship-response';
import type { SectionProps } from '../utils/types';
import { secondaryBtn } from '@client/components/ui/fields';
import { useSearchParams } from 'react-router';
import { useMemo } from 'react';
import { computeBoundaryDetail } from '@shared/engine';
import { WithheldNotice } from './withheld-notice';

export function LoadsSection({ survey, results, rows, system, selectedId, select }: SectionProps) {
  const [, setParams] = useSearchParams();
  // the one boundary opened is computed in full (sides, parts, stiffeners, diagram) when opened
  const b = useMemo(() => (results && selectedId ? computeBoundaryDetail(survey, selectedId, { conditionId: results.conditionId }) : null), [survey, results, selectedId]);
  if (!results) return <p className="text-ink-soft">No loads yet.</p>;
  return (
    <section aria-labelledby="loads-h" className="space-y-5">
      <h2 id="loads-h" className="text-2xl">
        Loads
      </h2>
      <WithheldNotice results={results} />
      <ShipTotals results={results} rows={rows} system={system} />
      <AttitudeInUse survey={survey} results={results} system={system} />
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
