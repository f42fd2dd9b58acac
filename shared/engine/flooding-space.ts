/**
 * One space on its own, for the loads' per-compartment inflow figures (computeSurvey): the flow
 * through each of its breaches now (by the flooding model's orifice law: upstream fluid, integrated
 * over the opening's height), and the time its running pumps take to uncover their suction against
 * the inflow as it grows while the level falls (the flooding model run forward, other spaces held).
 */
import type { Compartment } from '../schemas/survey';
import { openingShape } from './flooding-build';
import { levelTable } from './flooding-levels';
import {
  DEFAULT_DISCHARGE_COEFFICIENT,
  PUMP_TAIL_S,
  STANDARD_ATMOSPHERE_PA,
  floodDerivative,
  newStack,
  openingFlow,
  stackOf,
  stateSize,
  type FloodFrame,
  type FloodModel,
  type GasModel,
} from './flooding-model';
import { levelOfVolume, volumeAt } from './flooding-levels';
import { dormandPrince } from './flooding-ode';
import { dot, fromPoint } from './vec';

export interface SpaceLayer {
  fluidId: string;
  name: string;
  category: 'water' | 'oil' | 'other';
  densityKgM3: number;
  /** Liquid volume, permeability applied, m³. */
  volumeM3: number;
}

/** How long the pump-out run may look ahead, s (48 h). */
const PUMP_OUT_HORIZON_S = 48 * 3600;

function spaceModel(comp: Compartment, frame: FloodFrame, permeability: number, layers: readonly SpaceLayer[], gasGaugePa: number): { model: FloodModel; y0: Float64Array } {
  const seaKey = `sea-water@${frame.seaDensityKgM3}`;
  const byKey = new Map<string, { key: string; fluidId: string; name: string; category: SpaceLayer['category']; densityKgM3: number; volume: number }>();
  byKey.set(seaKey, { key: seaKey, fluidId: 'sea-water', name: 'Sea water', category: 'water', densityKgM3: frame.seaDensityKgM3, volume: 0 });
  for (const l of layers) {
    const key = `${l.fluidId}@${l.densityKgM3}`;
    const f = byKey.get(key) ?? { key, fluidId: l.fluidId, name: l.name, category: l.category, densityKgM3: l.densityKgM3, volume: 0 };
    f.volume += l.volumeM3;
    byKey.set(key, f);
  }
  const fluids = [...byKey.values()].sort((a, b) => b.densityKgM3 - a.densityKgM3 || a.key.localeCompare(b.key));
  const table = levelTable(comp.geometry, frame.up);
  const liquid = layers.reduce((a, l) => a + l.volumeM3, 0);
  let gas: GasModel = gasGaugePa !== 0 ? { kind: 'held', gaugePa: gasGaugePa } : { kind: 'vented' };
  const vGas = permeability * table.total - liquid;
  if (comp.airTight && vGas > 1e-9 * table.total) gas = { kind: 'trapped', pvPaM3: (gasGaugePa + STANDARD_ATMOSPHERE_PA) * vGas };
  const model: FloodModel = {
    frame,
    fluids: fluids.map(({ volume: _v, ...f }) => f),
    seaSlot: fluids.findIndex((f) => f.key === seaKey),
    spaces: [{ id: comp.id, name: comp.name, permeability: permeability > 0 ? permeability : 1, table, gas, held: false }],
    openings: (comp.breaches ?? []).map((b, i) => ({
      id: b.id,
      name: `breach ${i + 1}`,
      inside: 0,
      outside: -1,
      elevationM: dot(frame.up, fromPoint(b.position)),
      ...openingShape(b.face, b.size, frame.up),
      areaM2: b.areaM2,
      cd: b.dischargeCoefficient ?? DEFAULT_DISCHARGE_COEFFICIENT,
    })),
    pumps: [],
  };
  const y0 = new Float64Array(stateSize(model));
  fluids.forEach((f, i) => (y0[i] = f.volume));
  return { model, y0 };
}

export interface SpaceInflow {
  breaches: { id: string; flowM3S: number }[];
  orificeInflowM3S: number;
  /** Seconds until the running pumps uncover their suction; null when they do not within 48 h. */
  timeToPumpOutS: number | null;
}

/**
 * Breach flows now and the pump-out time of one space. `layers` are its liquids now, `gasGaugePa`
 * its gas pressure (trapped air if the space is air-tight).
 */
export function spaceInflow(comp: Compartment, frame: FloodFrame, permeability: number, layers: readonly SpaceLayer[], gasGaugePa: number): SpaceInflow {
  const { model, y0 } = spaceModel(comp, frame, permeability, layers, gasGaugePa);
  const st = newStack(model);
  stackOf(model, y0, st);
  let orifice = 0;
  const breaches = model.openings.map((op) => {
    let q = 0;
    openingFlow(model, st, op, (_slot, dq) => (q += dq));
    orifice += q;
    return { id: op.id, flowM3S: q };
  });
  const running = (comp.pumps ?? []).filter((p) => p.running !== false && p.capacityM3S > 0);
  if (running.length === 0) return { breaches, orificeInflowM3S: orifice, timeToPumpOutS: null };
  const table = model.spaces[0].table;
  for (const p of running) model.pumps.push({ id: p.id, name: p.name, space: 0, capacityM3S: p.capacityM3S, suctionElevationM: table.bottom + (p.suctionHeightM ?? 0) });
  const suction = Math.max(...model.pumps.map((p) => p.suctionElevationM));
  const tail = PUMP_TAIL_S * Math.max(...model.pumps.map((p) => p.capacityM3S));
  const sp = model.spaces[0];
  const dryLevel = levelOfVolume(table, volumeAt(table, suction) + tail / sp.permeability);
  const top = (y: Float64Array) => {
    let v = 0;
    for (let f = 0; f < model.fluids.length; f++) if (y[f] > 0) v += y[f];
    return v > 0 ? levelOfVolume(table, v / sp.permeability) : table.bottom;
  };
  if (top(y0) <= dryLevel) return { breaches, orificeInflowM3S: orifice, timeToPumpOutS: 0 };
  const rate = Float64Array.from(model.pumps.map((p) => p.capacityM3S));
  const tmp = new Float64Array(y0.length);
  const run = dormandPrince(floodDerivative(model, rate), 0, y0, PUMP_OUT_HORIZON_S, { rtol: 1e-8, atol: 1e-6 }, (a, b, yNew, dense) => {
    if (top(yNew) > dryLevel) return null;
    let lo = a, hi = b;
    for (let k = 0; k < 60 && hi - lo > 1e-6; k++) {
      const mid = 0.5 * (lo + hi);
      dense(mid, tmp);
      if (top(tmp) <= dryLevel) hi = mid;
      else lo = mid;
    }
    return hi;
  });
  return { breaches, orificeInflowM3S: orifice, timeToPumpOutS: run.stoppedByEvent ? run.t : null };
}

/**
 * Layer tops of a space open to the sea, balanced at its opening: the layer read as "open to sea"
 * rises or falls until the pressure inside at the opening (gas, plus every layer above the opening)
 * equals the sea's there, the layers above it keeping the volumes they were entered with (laid on
 * it in turn) and the layers below it their levels. `tops` are the levels as read, the open layer at
 * the outside waterline; `below(η)` is the geometric volume under η. Returns new tops.
 */
export function balanceOpenToSea(
  tops: readonly number[],
  densities: readonly number[],
  open: number,
  gasGaugePa: number,
  openingElevationM: number,
  range: readonly [number, number],
  below: (eta: number) => number,
  frame: FloodFrame,
): number[] {
  const g = frame.g;
  const [eBottom, eTop] = range;
  const total = below(Infinity);
  const invert = (v: number): number => {
    if (v <= 0) return eBottom;
    if (v >= total) return eTop;
    let lo = eBottom, hi = eTop;
    for (let k = 0; k < 100 && hi - lo > 1e-12 * Math.max(1, Math.abs(hi)); k++) {
      const mid = 0.5 * (lo + hi);
      if (below(mid) < v) lo = mid;
      else hi = mid;
    }
    return 0.5 * (lo + hi);
  };
  // volumes of the layers above the open one, as entered
  const above: number[] = [];
  let prev = tops[open];
  for (let j = open + 1; j < tops.length; j++) {
    const t = Math.max(prev, tops[j]);
    above.push(Math.max(0, below(t) - below(prev)));
    prev = t;
  }
  const layout = (eta: number): number[] => {
    const out = tops.slice(0, open);
    out.push(eta);
    let v = below(eta);
    for (const a of above) {
      v += a;
      out.push(a > 0 ? invert(v) : out[out.length - 1]);
    }
    return out;
  };
  const pSea = frame.seaDensityKgM3 * g * Math.max(0, frame.waterlineElevationM - openingElevationM);
  const excess = (eta: number): number => {
    const t = layout(eta);
    let p = gasGaugePa;
    let base = eBottom;
    for (let j = 0; j < t.length; j++) {
      if (t[j] > base && t[j] > openingElevationM) p += densities[j] * g * (t[j] - Math.max(base, openingElevationM));
      base = Math.max(base, t[j]);
    }
    return p - pSea;
  };
  let lo = open > 0 ? Math.max(eBottom, tops[open - 1]) : eBottom;
  let hi = Math.max(eTop, frame.waterlineElevationM);
  if (excess(lo) > 0) return layout(lo);
  if (excess(hi) <= 0) return layout(hi);
  // the highest level that does not push out through the opening
  for (let k = 0; k < 100 && hi - lo > 1e-12 * Math.max(1, Math.abs(hi)); k++) {
    const mid = 0.5 * (lo + hi);
    if (excess(mid) <= 0) lo = mid;
    else hi = mid;
  }
  return layout(lo);
}
