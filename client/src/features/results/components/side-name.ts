import type { SurveyResults } from '@shared/engine';

/** Plain name of the space on one side of a boundary. */
export function sideName(results: SurveyResults, side: { kind: 'compartment' | 'sea' | 'air'; compartmentId: string | null }): string {
  if (side.kind === 'sea') return 'Sea';
  if (side.kind === 'air') return 'Open air';
  return results.compartments.find((c) => c.id === side.compartmentId)?.name ?? 'Unknown space';
}
