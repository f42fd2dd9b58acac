/** The 3D model on the review desk: the shared scene, read-only here (tapping selects a boundary's results). */
import { lazy, Suspense } from 'react';
import type { SurveyResults } from '@shared/engine';
import type { Survey } from '@shared/schemas/survey';
import type { UnitSystem } from '@shared/units/units';
import { ModelBoundary } from '@client/features/model3d/components/model-boundary';

const SurveyScene = lazy(() => import('@client/features/model3d/components/survey-scene'));

export function ReviewModel3d({
  survey,
  results,
  system,
  selectedId,
  onSelect,
}: {
  survey: Survey;
  results: SurveyResults | null;
  system: UnitSystem;
  selectedId: string | null;
  onSelect: (id: string) => void;
}) {
  return (
    <ModelBoundary>
      <Suspense fallback={<p className="grid h-[50vh] place-items-center rounded-lg border border-line bg-card text-ink-soft">Loading the 3D model…</p>}>
        {results ? (
          <SurveyScene survey={survey} results={results} system={system} selectedId={selectedId} onSelect={onSelect} />
        ) : (
          <p className="text-ink-soft">No results to draw.</p>
        )}
      </Suspense>
    </ModelBoundary>
  );
}
