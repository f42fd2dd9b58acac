/**
 * A boundary's ratings against its net load. A rating without direction (ratedCapacity) holds
 * whichever way the net pressure pushes; a directional rating (directionalCapacity) holds one way
 * each: towards side B is checked against the greatest net pressure pushing towards B (or the net
 * force when it pushes towards B), towards side A likewise the other way. Pa or N.
 */
import type { Boundary } from '../schemas/survey';
import type { CapacityResult, NetResult } from './results';

export function capacitiesOf(
  b: Pick<Boundary, 'ratedCapacity' | 'directionalCapacity'>,
  net: Pick<NetResult, 'forceN' | 'resultantN' | 'maxPressurePa' | 'minPressurePa'> & { peak: Pick<NetResult['peak'], 'pressurePa'> },
): CapacityResult[] {
  const out: CapacityResult[] = [];
  const rc = b.ratedCapacity;
  if (rc) {
    const rated = rc.kind === 'pressure' ? rc.pressurePa : rc.forceN;
    const actual = eitherWayActual(rc.kind, net.peak.pressurePa, net.resultantN);
    out.push({ kind: rc.kind, direction: 'either', rated, actual, utilisation: actual / rated });
  }
  const dc = b.directionalCapacity;
  if (dc) {
    const towardsB = towardsBActual(dc.kind, net.maxPressurePa, net.forceN);
    const towardsA = towardsAActual(dc.kind, net.minPressurePa, net.forceN);
    if (dc.towardsB !== undefined) out.push({ kind: dc.kind, direction: 'towards-B', rated: dc.towardsB, actual: towardsB, utilisation: towardsB / dc.towardsB });
    if (dc.towardsA !== undefined) out.push({ kind: dc.kind, direction: 'towards-A', rated: dc.towardsA, actual: towardsA, utilisation: towardsA / dc.towardsA });
  }
  return out;
}

type RatingKind = CapacityResult['kind'];
const eitherWayActual = (kind: RatingKind, peakPa: number, resultantN: number): number => (kind === 'pressure' ? Math.abs(peakPa) : resultantN);
const towardsBActual = (kind: RatingKind, maxPa: number, forceN: number): number => (kind === 'pressure' ? Math.max(0, maxPa) : Math.max(0, forceN));
const towardsAActual = (kind: RatingKind, minPa: number, forceN: number): number => (kind === 'pressure' ? Math.max(0, -minPa) : Math.max(0, -forceN));

/** The rating with the highest utilisation, or null. */
export function governingCapacity(list: readonly CapacityResult[]): CapacityResult | null {
  let best: CapacityResult | null = null;
  for (const c of list) if (best === null || c.utilisation > best.utilisation) best = c;
  return best;
}

/** The governing rating as governingLean leaves it (one object, rewritten on every call). */
const leanRating: CapacityResult = { kind: 'pressure', direction: 'either', rated: 0, actual: 0, utilisation: 0 };

function offer(kind: RatingKind, direction: CapacityResult['direction'], rated: number, actual: number, best: CapacityResult | null): CapacityResult | null {
  const u = actual / rated;
  if (best !== null && !(u > best.utilisation)) return best;
  leanRating.kind = kind;
  leanRating.direction = direction;
  leanRating.rated = rated;
  leanRating.actual = actual;
  leanRating.utilisation = u;
  return leanRating;
}

/**
 * governingCapacity(capacitiesOf(b, net)) from the net load's numbers, without building the list
 * (the summary's path): N, N, Pa, Pa, Pa. The answer is a scratch object rewritten by the next
 * call, so read it at once; null when the boundary has no rating.
 */
export function governingRatingLean(b: Pick<Boundary, 'ratedCapacity' | 'directionalCapacity'>, forceN: number, resultantN: number, maxPressurePa: number, minPressurePa: number, peakPa: number): Readonly<CapacityResult> | null {
  let best: CapacityResult | null = null;
  const rc = b.ratedCapacity;
  if (rc) best = offer(rc.kind, 'either', rc.kind === 'pressure' ? rc.pressurePa : rc.forceN, eitherWayActual(rc.kind, peakPa, resultantN), best);
  const dc = b.directionalCapacity;
  if (dc) {
    if (dc.towardsB !== undefined) best = offer(dc.kind, 'towards-B', dc.towardsB, towardsBActual(dc.kind, maxPressurePa, forceN), best);
    if (dc.towardsA !== undefined) best = offer(dc.kind, 'towards-A', dc.towardsA, towardsAActual(dc.kind, minPressurePa, forceN), best);
  }
  return best;
}
