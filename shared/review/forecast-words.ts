/**
 * A forecast's downflooding points and attitude in plain words, the same on the device, the desk
 * and the master's brief: "Air pipe No. 3 DB goes under at 14 Mar 2025 14:20 ship's time (UTC+03:00)
 * · 14 Mar 2025 11:20 UTC, 3:20 after the readings."
 */
import type { FloodForecast, Governs, LimitRating, SpaceForecast } from '../engine';
import { hmm } from '../api/cautions';
import { formatShipAndUtc } from './time-words';
import { ratingFigureWords } from './rating-words';
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

/** A duration in plain words: "5 h 51 min", "40 min" (rounded to the minute). */
export function durationWords(seconds: number): string {
  const min = Math.max(0, Math.round(seconds / 60));
  const h = Math.floor(min / 60);
  return h === 0 ? `${min} min` : `${h} h ${min % 60} min`;
}

/** A space's pumps against its inflow, in plain words: "Pumps (1321 US gal/min): the pumps gain on the inflow; pumped dry in 5 h 51 min." */
export function pumpsWords(p: NonNullable<SpaceForecast['pumps']>, system: UnitSystem): string {
  const what =
    p.verdict === 'dry'
      ? `the pumps gain on the inflow; pumped dry in ${durationWords(p.dryAtS ?? 0)}.`
      : p.verdict === 'gaining'
        ? 'the pumps gain on the inflow, but the space is not dry within the forecast.'
        : p.verdict === 'holding'
          ? 'the pumps only match the inflow: the level holds, it does not fall.'
          : 'the pumps do not keep up with the inflow: the level rises.';
  return `Pumps (${formatQuantity(p.capacityM3S, 'flow', system, 3).text}): ${what}`;
}

const GOVERNS_WORDS: Record<Exclude<Governs, 'rating'>, string> = { stiffeners: 'stiffeners', plating: 'plating', shores: 'shores' };

/** What governs a boundary when it reaches its limit: "its rating, 17.5 kPa towards side B (Engine room)", "stiffeners", or "—". */
export function limitGovernsWords(l: { governs: Governs | null; rating: LimitRating | null }, system: UnitSystem, sides: { A: string; B: string }): string {
  if (!l.governs) return '—';
  if (l.governs !== 'rating') return GOVERNS_WORDS[l.governs];
  return l.rating ? `its rating, ${ratingFigureWords(l.rating, system, sides)}` : 'its rating';
}
