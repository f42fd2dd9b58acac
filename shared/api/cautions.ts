/** The cautions that stand beside every computed result and on the master's brief: one text, two places. */
export const CAUTIONS: readonly string[] = [
  'These figures are estimates for planning, not a structural approval.',
  'Structural decisions rest with a competent naval architect, the vessel’s classification society, and the flag and local authorities.',
  'Never enter a flooded or closed space without gas testing and an entry permit.',
  'Pumping or moving liquid changes both the ship’s stability and the loads on its boundaries.',
];

/** Beside every figure of the ship's response (heel, trim, GM) and on the brief. */
export const STABILITY_CAUTION =
  'Stability decisions rest with the naval architect and the ship’s approved stability information; these heel, trim and GM figures are estimates for planning.';

/**
 * The forecast's own caution, beside every forecast and on the brief: how old its readings are is
 * said with it (`readingsAge`).
 */
export const FORECAST_CAUTION =
  'A forecast is an estimate from the readings it rests on, run forward under the openings, pumps and plan entered. New soundings replace it.';

/** "h:mm" from seconds. */
export function hmm(seconds: number): string {
  const min = Math.max(0, Math.round(seconds / 60));
  return `${Math.floor(min / 60)}:${String(min % 60).padStart(2, '0')}`;
}
