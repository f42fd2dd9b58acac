/** "3D": the model, loaded only when this section opens (its own chunk). */
import { lazy, Suspense } from 'react';
import type { SectionProps } from '../utils/types';
import { ModelBoundary } from '@client/features/model3d/components/model-boundary';

const SurveyScene = lazy(() => import('@client/features/model3d/components/survey-scene'));

export function ModelSection({ survey, results, rows, system, selectedId, select, open }: SectionProps & { open: (id: string) => void }) {
  return (
    <section aria-labelledby="model-h" className="space-y-3">
      <h2 id="model-h" className="text-2xl">
        3D model
      </h2>
      <ModelBoundary>
        <Suspense fallback={<p className="grid h-[60vh] place-items-center rounded-lg border border-line bg-card text-ink-soft">Loading the 3D model…</p>}>
          {results ? (
            <SurveyScene survey={survey} results={results} rows={rows} system={system} selectedId={selectedId} onSelect={select} onOpen={open} />
          ) : (
            <p className="text-ink-soft">The model appears once the loads compute.</p>
          )}
        </Suspense>
      </ModelBoundary>
      <p className="text-sm text-ink-soft">Drag to turn, pinch or scroll to zoom; “Fit to view” brings the whole ship back. Tap a space or a boundary to see its name, and open its form from there.</p>
    </section>
  );
}
