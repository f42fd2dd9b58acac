/**
 * Soundings as evidence of the inflow. Each reading's sounding gives a volume (through the
 * compartment's volume below the level plane); the pumps listed on a reading ran since the reading
 * before, so their capacity × that interval is added back to the volume to get what came in. The
 * gross inflow is the ordinary least-squares slope of those volumes against time (Gauss; any
 * statistics text), with r² and residuals. Only the pumps that ran are added back, once: the net
 * rise already contains their effect, and nothing is subtracted again later.
 */
import type { Compartment } from '../schemas/survey';

export interface LinearFit {
  /** dV/dt, m³/s */
  slope: number;
  /** V at t = 0 of the series, m³ */
  intercept: number;
  /** coefficient of determination; 1 for two points */
  r2: number;
}

/** Ordinary least squares of y on t. */
export function leastSquares(t: readonly number[], y: readonly number[]): LinearFit {
  const n = t.length;
  let st = 0, sy = 0;
  for (let i = 0; i < n; i++) {
    st += t[i];
    sy += y[i];
  }
  const tm = st / n, ym = sy / n;
  let stt = 0, sty = 0, syy = 0;
  for (let i = 0; i < n; i++) {
    stt += (t[i] - tm) ** 2;
    sty += (t[i] - tm) * (y[i] - ym);
    syy += (y[i] - ym) ** 2;
  }
  const slope = stt > 0 ? sty / stt : 0;
  const r2 = syy > 0 && stt > 0 ? (sty * sty) / (stt * syy) : 1;
  return { slope, intercept: ym - slope * tm, r2 };
}

export interface SoundingEvidence {
  /** Inflow from the readings with the pumps that ran added back, m³/s. */
  grossInflowM3S: number;
  /** Slope of the liquid volume as read (the net rise), m³/s. */
  netRiseM3S: number;
  r2: number;
  readings: { time: string; volumeM3: number; pumpedSinceM3: number; residualM3: number }[];
  /** Time of the last reading. */
  lastReadingTime: string;
  /** The readings were not in time order (they are fitted in time order). */
  outOfOrder: boolean;
  /** Pump ids listed on a reading that the compartment does not have (ignored). */
  unknownPumpIds: string[];
  /** Orifice inflow of the compartment's openings now, m³/s, and the ratio measured / orifice. */
  orificeInflowM3S: number;
  ratio: number | null;
  /** The factor the two are compared by, and whether they disagree by more. */
  factor: number;
  disagree: boolean;
}

/** Inflow below which a disagreement is not judged, m³/s (1 m³/h; common practice, no source). */
const NEGLIGIBLE_INFLOW_M3S = 1 / 3600;

/**
 * The sounding log's evidence for one compartment. `volumeAtSounding` gives the liquid volume
 * (permeability applied, m³) for a sounding read on the log's pipe.
 */
export function soundingEvidence(
  comp: Compartment,
  volumeAtSounding: (soundingM: number) => number,
  orificeInflowM3S: number,
  factor = 2,
): SoundingEvidence | null {
  const log = comp.soundingLog;
  if (!log || log.readings.length < 2) return null;
  const indexed = log.readings.map((r, i) => ({ r, i, t: Date.parse(r.time) }));
  const outOfOrder = indexed.some((x, i) => i > 0 && x.t <= indexed[i - 1].t);
  indexed.sort((a, b) => a.t - b.t || a.i - b.i);
  const capacity = new Map((comp.pumps ?? []).map((p) => [p.id, p.capacityM3S]));
  const unknown = new Set<string>();
  const t0 = indexed[0].t;
  const ts: number[] = [], raw: number[] = [], gross: number[] = [], pumpedSince: number[] = [];
  let pumped = 0;
  indexed.forEach(({ r, t }, k) => {
    const v = volumeAtSounding(r.soundingM);
    let q = 0;
    for (const id of r.pumpIds ?? []) {
      const c = capacity.get(id);
      if (c === undefined) unknown.add(id);
      else q += c;
    }
    // the pumps listed ran since the reading before; the first reading has no interval behind it
    const dv = k > 0 ? q * ((t - indexed[k - 1].t) / 1000) : 0;
    pumped += dv;
    ts.push((t - t0) / 1000);
    raw.push(v);
    gross.push(v + pumped);
    pumpedSince.push(dv);
  });
  const fit = leastSquares(ts, gross);
  const net = leastSquares(ts, raw);
  const ratio = orificeInflowM3S > NEGLIGIBLE_INFLOW_M3S ? fit.slope / orificeInflowM3S : null;
  const disagree =
    ratio !== null
      ? ratio > factor || ratio < 1 / factor
      : fit.slope > NEGLIGIBLE_INFLOW_M3S; // water comes in with no opening that explains it
  return {
    grossInflowM3S: fit.slope,
    netRiseM3S: net.slope,
    r2: fit.r2,
    readings: indexed.map(({ r }, k) => ({
      time: r.time,
      volumeM3: raw[k],
      pumpedSinceM3: pumpedSince[k],
      residualM3: gross[k] - (fit.intercept + fit.slope * ts[k]),
    })),
    lastReadingTime: indexed[indexed.length - 1].r.time,
    outOfOrder,
    unknownPumpIds: [...unknown],
    orificeInflowM3S,
    ratio,
    factor,
    disagree,
  };
}
