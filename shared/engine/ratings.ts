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
    const actual = rc.kind === 'pressure' ? Math.abs(net.peak.pressurePa) : net.resultantN;
    out.push({ kind: rc.kind, direction: 'either', rated, actual, utilisation: actual / rated });
  }
  const dc = b.directionalCapacity;
  if (dc) {
    const towardsB = dc.kind === 'pressure' ? Math.max(0, net.maxPressurePa) : Math.max(0, net.forceN);
    const towardsA = dc.kind === 'pressure' ? Math.max(0, -net.minPressurePa) : Math.max(0, -net.forceN);
    if (dc.towardsB !== undefined) out.push({ kind: dc.kind, direction: 'towards-B', rated: dc.towardsB, actual: towardsB, utilisation: towardsB / dc.towardsB });
    if (dc.towardsA !== undefined) out.push({ kind: dc.kind, direction: 'towards-A', rated: dc.towardsA, actual: towardsA, utilisation: towardsA / dc.towardsA });
  }
  return out;
}

/** The rating with the highest utilisation, or null. */
export function governingCapacity(list: readonly CapacityResult[]): CapacityResult | null {
  let best: CapacityResult | null = null;
  for (const c of list) if (best === null || c.utilisation > best.utilisation) best = c;
  return best;
}
