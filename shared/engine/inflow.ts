/**
 * Pump-out time against a constant inflow: V / (Q_pumps − Q_in). Used only where nothing gives the
 * inflow's dependence on the level (a measured rate with no breach entered); with a breach the
 * flooding model's run gives the time (flooding-space.ts), since the inflow grows as the level falls.
 */

/**
 * Time to pump out `volumeM3` with pumps of total capacity `pumpM3S` against a constant
 * `inflowM3S`, seconds, or null when the pumps cannot gain on the inflow.
 */
export function timeToPumpOut(volumeM3: number, pumpM3S: number, inflowM3S: number): number | null {
  const net = pumpM3S - Math.max(0, inflowM3S);
  if (volumeM3 <= 0) return 0;
  return net > 0 ? volumeM3 / net : null;
}
