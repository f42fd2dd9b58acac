/**
 * A boundary's rating in words, with its unit and the side it holds towards by name ("45.0 kPa
 * towards side B (Engine room)"), so no rating is shown as a bare figure or a bare "its rating".
 * The results table, the boundary detail, the calculation report and the master's brief use it.
 */
import { governingCheck, type BoundaryResult, type CapacityResult } from '../engine';
import { formatQuantity, type UnitSystem } from '../units/units';

/** "either way", "towards side B (Engine room)". */
export function ratingWayWords(direction: CapacityResult['direction'], sides: { A: string; B: string }): string {
  if (direction === 'either') return 'either way';
  return direction === 'towards-B' ? `towards side B (${sides.B})` : `towards side A (${sides.A})`;
}

/** "45.0 kPa towards side B (Engine room)": the rated value (Pa or N, SI) in the user's units, a no-break space before its unit. */
export function ratingFigureWords(r: Pick<CapacityResult, 'kind' | 'direction' | 'rated'>, units: UnitSystem, sides: { A: string; B: string }, digits = 3): string {
  const q = formatQuantity(r.rated, r.kind === 'pressure' ? 'pressure' : 'force', units, digits);
  return `${q.text.replace(' ', '\u00a0')} ${ratingWayWords(r.direction, sides)}`;
}

/**
 * What governs a boundary's utilisation, in words ("its rating, 45.0 kPa towards side B (Engine
 * room)", "shore 2, of its design capacity (…)"), for the brief's line above its checks.
 */
export function governingCheckWords(b: BoundaryResult, units: UnitSystem, sides: { A: string; B: string }): { utilisation: number; what: string } | null {
  const gov = governingCheck(b);
  if (!gov) return null;
  return { utilisation: gov.utilisation, what: gov.rating ? `its rating, ${ratingFigureWords(gov.rating, units, sides)}` : gov.what };
}
