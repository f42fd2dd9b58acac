/**
 * A forecast's downflooding points and attitude in plain words, the same on the device, the desk
 * and the master's brief: "Air pipe No. 3 DB goes under at 14 Mar 2025 14:20 ship's time (UTC+03:00)
 * · 14 Mar 2025 11:20 UTC, 3:20 after the readings."
 */
import type { FloodForecast } from '../engine';
import { hmm } from '../api/cautions';
import { formatShipAndUtc } from './time-words';
import { formatQuantity, formatVolumeBalance, type UnitSystem } from '../units/units';

/** One sentence per downflooding point that is or goes under within the forecast, earliest first; or one saying none does (empty without points). */
export function downfloodingSentences(f: Pick<FloodForecast, 'downflooding' | 'readingsTime' | 'horizonS'>, shipTimeOffsetMin: number | undefined): string[] {
  if (f.downflooding.length === 0) return [];
  const under = f.downflooding.filter((d) => d.underAtS !== null);
  if (under.length === 0) return [`No downflooding point goes under within the next ${(f.horizonS / 3600).toFixed(0)} hours.`];
  return under.map((d) =>
    d.underAtS === 0
      ? `${d.name} is under water now.`
      : `${d.name} goes under at ${formatShipAndUtc(new Date(Date.parse(f.readingsTime) + d.underAtS! * 1000).toISOString(), shipTimeOffsetMin)}, ${hmm(d.underAtS!)} (h:mm) after the readings.`,
  );
}

/** Which attitude the forecast's levels and loads use, in a few words (a heading for the note). */
export function forecastAttitudeWords(f: Pick<FloodForecast, 'attitude'>): string {
  return f.attitude.mode === 'follows-response' ? 'Attitude follows the ship’s response' : 'Attitude held as read';
}

/**
 * A net flow into a space with its way said ("1137 US gal/min out"); below 1e-6 m³/s (3.6 litres an
 * hour, under the solver's tolerance) it is no flow, never "3.24e-7".
 */
export function flowWords(m3s: number, system: UnitSystem): string {
  if (!(Math.abs(m3s) >= 1e-6)) return 'none';
  return `${formatQuantity(Math.abs(m3s), 'flow', system, 3).text} ${m3s > 0 ? 'in' : 'out'}`;
}

/** The run's volume balance as a plain figure with its unit (the device, the desk, the brief and the report say it alike). */
export function volumeBalanceSentence(f: Pick<FloodForecast, 'balance'>, system: UnitSystem): string {
  return `Volume balance over the run (in − out − stored): ${formatVolumeBalance(f.balance.balanceM3, system)}.`;
}
