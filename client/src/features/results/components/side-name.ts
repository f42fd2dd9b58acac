import type { SurveyLevelResults } from '@shared/engine/results';

/** Plain name of the space on one side of a boundary. */
export function sideName(results: SurveyLevelResults, side: { kind: 'compartment' | 'sea' | 'air'; compartmentId?: string | null }): string {
  if (side.kind === 'sea') return 'Sea';
  if (side.kind === 'air') return 'Open air';
  return results.compartments.find((c) => c.id === side.compartmentId)?.name ?? 'Unknown space';
}

export const fmtPoint = (p: { x: number; y: number; z: number } | null, f: (v: number) => string): string =>
  p ? `x ${f(p.x)}, y ${f(p.y)}, z ${f(p.z)}` : '—';
