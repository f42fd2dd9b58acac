/**
 * The flooding model: the physics of the forecast, with no survey format and no clock in it.
 *
 * State: the liquid volume (permeability applied, m³) of every fluid in every space, then three
 * running totals: volume in from the sea, out to the sea, and pumped out. Within a space the
 * fluids lie in layers by density, heaviest at the bottom; their surfaces come from the volumes
 * through the exact volume-below-a-plane (flooding-levels.ts). The gas above is vented (0 gauge),
 * held at a gauge pressure (compressed air kept up by a compressor), or trapped: an air-tight space
 * whose air obeys Boyle's law p·V = const (isothermal; absolute pressure over the standard
 * atmosphere's 101,325 Pa, ISO 2533).
 *
 * Flow through an opening follows the orifice law q = C_d w √(2 Δp / ρ) per unit height, with Δp
 * the difference of the two sides' hydrostatic pressures at that height (each side's gas pressure
 * plus its layers above: Pascal's law) and ρ the density of the fluid present at that height on
 * the upstream side (so oil leaves through a breach in an oil layer at oil density; gas passes
 * nothing). An opening with a height is integrated over it: exactly for a rectangle where the head
 * is large, by 8-point Gauss–Legendre after a cosine change of variable (which absorbs the square
 * roots at the ends) for a round opening and near zero head. C_d defaults to 0.6, the usual value
 * for a sharp-edged orifice (common practice). Below HEAD_LINEAR_BELOW_M of head the flow is taken
 * as linear in the head, matched at that head: the √ law's infinite slope at equal levels would
 * otherwise make the equations infinitely stiff, and 10 mm is below what a sounding tape resolves.
 *
 * Pumps draw from the lowest layer at their suction and lose suction as it uncovers: over the last
 * PUMP_TAIL_S seconds' worth of its capacity of liquid above the suction its rate falls away in
 * proportion (the pump takes air). So a pump stops when its suction uncovers, and the equations stay
 * continuous and no stiffer than that time, even where a heeled space's surface shrinks to a corner.
 */
import type { LevelTable } from './flooding-levels';
import { levelOfVolume, surfaceAreaAt, volumeAt } from './flooding-levels';
import type { V3 } from './vec';
import type { Linearisation } from './flooding-ode';
import { bandFactorise, bandPays, bandSolve, denseFactorise, denseSolve, newBandLu, reverseCuthillMcKee, type BandLu } from './sparse-band';

/** Sea-level pressure of the standard atmosphere, Pa (ISO 2533:1975; ICAO Doc 7488). */
export const STANDARD_ATMOSPHERE_PA = 101_325;
/** Discharge coefficient of a sharp-edged orifice (common practice, no single source). */
export const DEFAULT_DISCHARGE_COEFFICIENT = 0.6;
/** Head below which orifice flow is taken as linear in the head, m (see the module comment). */
export const HEAD_LINEAR_BELOW_M = 0.01;
/** A pump loses suction over its last this-many seconds of capacity of liquid above the suction, s (modelling choice, no source). */
export const PUMP_TAIL_S = 60;

export interface FloodFluid {
  /** fluidId plus density: one slot per distinct liquid. */
  key: string;
  fluidId: string;
  name: string;
  category: 'water' | 'oil' | 'other';
  densityKgM3: number;
}

export type GasModel = { kind: 'vented' } | { kind: 'held'; gaugePa: number } | { kind: 'trapped'; pvPaM3: number };

export interface FloodSpace {
  id: string;
  name: string;
  permeability: number;
  table: LevelTable;
  gas: GasModel;
  /** Open to the sea with no breach entered: held in balance with the sea, its exchange booked to the sea. */
  held: boolean;
}

export interface FloodOpening {
  id: string;
  name: string;
  /** Space index; `outside` −1 is the sea. Positive flow runs from outside into inside. */
  inside: number;
  outside: number;
  /** Elevation of the centre, m; half its vertical extent (0: taken at its centre). */
  elevationM: number;
  halfHeightM: number;
  shape: 'point' | 'rectangular' | 'round';
  areaM2: number;
  cd: number;
}

export interface FloodPump {
  id: string;
  name: string;
  space: number;
  capacityM3S: number;
  /** Elevation of the suction, m. */
  suctionElevationM: number;
}

export interface FloodFrame {
  up: V3;
  waterlineElevationM: number;
  seaDensityKgM3: number;
  g: number;
}

export interface FloodModel {
  frame: FloodFrame;
  /** Fluids ordered by density, heaviest first (the order layers lie in, bottom up). */
  fluids: FloodFluid[];
  /** Slot of sea water in `fluids`. */
  seaSlot: number;
  spaces: FloodSpace[];
  openings: FloodOpening[];
  pumps: FloodPump[];
}

/** Index of the running totals after the volumes. */
export const SEA_IN = 0, SEA_OUT = 1, PUMPED = 2;

export const stateSize = (m: FloodModel): number => m.spaces.length * m.fluids.length + 3;

/** Per-space liquid surfaces worked out from a state. */
export interface SpaceStack {
  /** Top elevation of each fluid's layer in fluid order (bottom up), m; an absent fluid has zero thickness. */
  tops: Float64Array;
  /** Top of all liquid (the bottom when dry), m. */
  liquidTop: Float64Array;
  gasPa: Float64Array;
  liquidVolume: Float64Array;
}

export function newStack(m: FloodModel): SpaceStack {
  const n = m.spaces.length;
  return { tops: new Float64Array(n * m.fluids.length), liquidTop: new Float64Array(n), gasPa: new Float64Array(n), liquidVolume: new Float64Array(n) };
}

/** Fills `st` from the volumes in `y`, for the spaces listed in `only` (default all). */
export function stackOf(m: FloodModel, y: Float64Array, st: SpaceStack, only?: Int32Array): void {
  const nF = m.fluids.length;
  const count = only ? only.length : m.spaces.length;
  for (let j = 0; j < count; j++) {
    const s = only ? only[j] : j;
    const sp = m.spaces[s];
    let cum = 0;
    let top = sp.table.bottom;
    for (let f = 0; f < nF; f++) {
      const v = y[s * nF + f];
      if (v > 0) {
        cum += v;
        top = levelOfVolume(sp.table, cum / sp.permeability);
      }
      st.tops[s * nF + f] = top;
    }
    st.liquidTop[s] = top;
    st.liquidVolume[s] = cum;
    st.gasPa[s] = gasPressure(sp, cum);
  }
}

/** Gauge pressure of the gas over `liquidM3` of liquid, Pa. */
export function gasPressure(sp: FloodSpace, liquidM3: number): number {
  const gas = sp.gas;
  if (gas.kind === 'vented') return 0;
  if (gas.kind === 'held') return gas.gaugePa;
  // Boyle: p_abs V = const; the gas has the permeable volume the liquid leaves (never below 0.1 % of it)
  const room = sp.permeability * sp.table.total;
  const vGas = Math.max(room - liquidM3, 1e-3 * room);
  return gas.pvPaM3 / vGas - STANDARD_ATMOSPHERE_PA;
}

/** Hydrostatic pressure in space s at elevation e, Pa gauge. */
export function spacePressure(m: FloodModel, st: SpaceStack, s: number, e: number): number {
  const nF = m.fluids.length;
  let p = st.gasPa[s];
  let bottom = m.spaces[s].table.bottom;
  for (let f = 0; f < nF; f++) {
    const top = st.tops[s * nF + f];
    if (top > bottom && top > e) p += m.fluids[f].densityKgM3 * m.frame.g * (top - Math.max(e, bottom));
    bottom = Math.max(bottom, top);
  }
  return p;
}

/** The fluid slot present in space s at elevation e, or −1 for gas. */
export function spaceFluidAt(m: FloodModel, st: SpaceStack, s: number, e: number): number {
  const nF = m.fluids.length;
  let bottom = m.spaces[s].table.bottom;
  for (let f = 0; f < nF; f++) {
    const top = st.tops[s * nF + f];
    if (top > bottom && top > e) return f;
    bottom = Math.max(bottom, top);
  }
  return -1;
}

function sidePressure(m: FloodModel, st: SpaceStack, side: number, e: number): number {
  if (side >= 0) return spacePressure(m, st, side, e);
  const fr = m.frame;
  return fr.seaDensityKgM3 * fr.g * Math.max(0, fr.waterlineElevationM - e);
}
function sideFluid(m: FloodModel, st: SpaceStack, side: number, e: number): number {
  if (side >= 0) return spaceFluidAt(m, st, side, e);
  return e < m.frame.waterlineElevationM ? m.seaSlot : -1;
}

/** √(2|Δp|/ρ) with the sign of Δp, linear below the head HEAD_LINEAR_BELOW_M. */
function velocity(dp: number, rho: number, g: number): number {
  const pLin = rho * g * HEAD_LINEAR_BELOW_M;
  const a = Math.abs(dp);
  if (a >= pLin) return Math.sign(dp) * Math.sqrt((2 * a) / rho);
  return (dp / pLin) * Math.sqrt((2 * pLin) / rho);
}

// 8-point Gauss–Legendre on [−1, 1] (Abramowitz & Stegun, Table 25.4)
const GL_X = [-0.9602898564975363, -0.7966664774136267, -0.525532409916329, -0.1834346424956498, 0.1834346424956498, 0.525532409916329, 0.7966664774136267, 0.9602898564975363];
const GL_W = [0.1012285362903763, 0.2223810344533745, 0.3137066458778873, 0.362683783378362, 0.362683783378362, 0.3137066458778873, 0.2223810344533745, 0.1012285362903763];

const pieceBreaks = new Float64Array(16);

/**
 * Flow through one opening, split by fluid: `out[slot]` receives q m³/s (positive from outside
 * into inside) for each fluid with liquid upstream; `out` (length: the model's fluid count) is
 * zeroed first. Returns the net flow. Written without closures: it runs for every opening at every
 * derivative evaluation and Jacobian column of the forecast.
 */
export function openingSlotFlows(m: FloodModel, st: SpaceStack, op: FloodOpening, out: Float64Array): number {
  out.fill(0);
  const g = m.frame.g;
  if (op.shape === 'point' || op.halfHeightM <= 0) {
    const e = op.elevationM;
    const dp = sidePressure(m, st, op.outside, e) - sidePressure(m, st, op.inside, e);
    if (dp === 0) return 0;
    const slot = dp > 0 ? sideFluid(m, st, op.outside, e) : sideFluid(m, st, op.inside, e);
    if (slot < 0) return 0;
    const q = op.cd * op.areaM2 * velocity(dp, m.fluids[slot].densityKgM3, g);
    out[slot] += q;
    return q;
  }
  const lo = op.elevationM - op.halfHeightM, hi = op.elevationM + op.halfHeightM;
  // where either side's pressure changes slope, inside the opening (insertion-sorted, no allocation)
  const nF = m.fluids.length;
  let n = 0;
  if (op.inside >= 0) for (let f = 0; f < nF; f++) n = addCut(st.tops[op.inside * nF + f], lo, hi, n);
  if (op.outside < 0) n = addCut(m.frame.waterlineElevationM, lo, hi, n);
  else for (let f = 0; f < nF; f++) n = addCut(st.tops[op.outside * nF + f], lo, hi, n);
  let net = 0;
  let a = lo;
  let da = sidePressure(m, st, op.outside, a) - sidePressure(m, st, op.inside, a);
  for (let k = 0; k <= n; k++) {
    const b = k < n ? pieceBreaks[k] : hi;
    if (b - a <= 1e-12) continue;
    const db = sidePressure(m, st, op.outside, b) - sidePressure(m, st, op.inside, b);
    if ((da > 0 && db < 0) || (da < 0 && db > 0)) {
      const z = a + ((b - a) * da) / (da - db);
      net += piece(m, st, op, a, z, da, 0, out);
      net += piece(m, st, op, z, b, 0, db, out);
    } else net += piece(m, st, op, a, b, da, db, out);
    a = b;
    da = db;
  }
  return net;
}

/** Inserts e into pieceBreaks[0..n) when it lies inside (lo, hi); returns the new count. */
function addCut(e: number, lo: number, hi: number, n: number): number {
  if (!(e > lo && e < hi)) return n;
  let i = n;
  while (i > 0 && pieceBreaks[i - 1] > e) {
    pieceBreaks[i] = pieceBreaks[i - 1];
    i--;
  }
  pieceBreaks[i] = e;
  return n + 1;
}

/**
 * Flow through one opening, split by fluid: calls `take(slot, q)` with q m³/s (positive from
 * outside into inside) for each part with liquid upstream.
 */
export function openingFlow(m: FloodModel, st: SpaceStack, op: FloodOpening, take: (slot: number, q: number) => void): void {
  const out = new Float64Array(m.fluids.length);
  openingSlotFlows(m, st, op, out);
  for (let f = 0; f < out.length; f++) if (out[f] !== 0) take(f, out[f]);
}

/** One piece of an opening, [a, b], over which Δp runs linearly from da to db without changing sign; adds to `out`, returns the flow. */
function piece(m: FloodModel, st: SpaceStack, op: FloodOpening, a: number, b: number, da: number, db: number, out: Float64Array): number {
  const mid = 0.5 * (a + b);
  const dm = 0.5 * (da + db);
  if (dm === 0) return 0;
  const slot = dm > 0 ? sideFluid(m, st, op.outside, mid) : sideFluid(m, st, op.inside, mid);
  if (slot < 0) return 0;
  const rho = m.fluids[slot].densityKgM3;
  const g = m.frame.g;
  const pLin = rho * g * HEAD_LINEAR_BELOW_M;
  const h = op.halfHeightM;
  const ec = op.elevationM;
  const pa = Math.abs(da), pb = Math.abs(db);
  if ((pa < pLin && pb > pLin) || (pa > pLin && pb < pLin)) {
    // the law changes where the head is HEAD_LINEAR_BELOW_M: integrate either side of it apart
    const z = a + ((b - a) * (pLin - pa)) / (pb - pa);
    const dz = Math.sign(dm) * pLin;
    return piece(m, st, op, a, z, da, dz, out) + piece(m, st, op, z, b, dz, db, out);
  }
  let integral: number; // ∫ w(e) v(e) de
  if (b - a >= 2 * h * (1 - 1e-12) && Math.abs(db - da) <= 1e-9 * Math.abs(dm)) {
    // the whole opening under one head (both sides the same liquid over it): the plain orifice law
    const q = op.cd * op.areaM2 * velocity(dm, rho, g);
    out[slot] += q;
    return q;
  }
  if (op.shape === 'rectangular' && Math.max(pa, pb) <= pLin) {
    // linear law: the mean of a linear function
    integral = (op.areaM2 / (2 * h)) * (b - a) * velocity(dm, rho, g);
  } else if (op.shape === 'rectangular') {
    const w = op.areaM2 / (2 * h);
    const meanRoot = Math.abs(pb - pa) < 1e-12 * Math.max(pa, pb) ? Math.sqrt(pa) : ((2 / 3) * (pb ** 1.5 - pa ** 1.5)) / (pb - pa);
    integral = Math.sign(dm) * w * (b - a) * meanRoot * Math.sqrt(2 / rho);
  } else {
    // e = mid − (b − a)/2 cos θ, θ ∈ [0, π]: de = (b − a)/2 sin θ dθ
    integral = 0;
    const half = 0.5 * (b - a);
    for (let i = 0; i < 8; i++) {
      const th = 0.5 * Math.PI * (GL_X[i] + 1);
      const e = mid - half * Math.cos(th);
      const dp = da + ((db - da) * (e - a)) / (b - a);
      const s = e - ec;
      const w = op.shape === 'round' ? (op.areaM2 * 2 * Math.sqrt(Math.max(0, h * h - s * s))) / (Math.PI * h * h) : op.areaM2 / (2 * h);
      integral += GL_W[i] * w * velocity(dp, rho, g) * half * Math.sin(th);
    }
    integral *= 0.5 * Math.PI;
  }
  const q = op.cd * integral;
  out[slot] += q;
  return q;
}

/** What a derivative evaluation adds up, besides dy: per-opening and per-pump flows. */
export interface FlowBreakdown {
  /** Net flow through each opening, outside → inside positive, m³/s. */
  opening: Float64Array;
  /** Each pump's actual rate, m³/s. */
  pump: Float64Array;
}

/** Spaces with an opening or a pump: the only ones whose contents ever change. */
export function movingSpaces(m: FloodModel): Int32Array {
  const touched = new Set<number>();
  for (const op of m.openings) {
    touched.add(op.inside);
    if (op.outside >= 0) touched.add(op.outside);
  }
  for (const p of m.pumps) touched.add(p.space);
  return Int32Array.from([...touched].sort((a, b) => a - b));
}

/**
 * What pump k draws at `rate` m³/s from each fluid of its space, into `out[slot]` (zeroed
 * first): the lowest layers above its suction first, falling away over its last PUMP_TAIL_S
 * seconds of liquid above the suction. Returns the total drawn.
 */
export function pumpSlotFlows(m: FloodModel, st: SpaceStack, k: number, rate: number, out: Float64Array): number {
  out.fill(0);
  if (!(rate > 0)) return 0;
  const nF = m.fluids.length;
  const p = m.pumps[k];
  const s = p.space;
  const sp = m.spaces[s];
  const tail = rate * PUMP_TAIL_S;
  let left = rate;
  let drawn = 0;
  let bottom = sp.table.bottom;
  for (let f = 0; f < nF && left > 0; f++) {
    const top = st.tops[s * nF + f];
    if (top > bottom && top > p.suctionElevationM) {
      // this layer's liquid above the suction
      const above = sp.permeability * (volumeAt(sp.table, top) - volumeAt(sp.table, Math.max(p.suctionElevationM, bottom)));
      const q = left * Math.min(1, above / tail);
      left -= q;
      drawn += q;
      out[f] = q;
    }
    bottom = Math.max(bottom, top);
  }
  return drawn;
}

/** Books pump k drawing q m³/s of fluid `slot`: out of its space (a held space refills from the sea) into the pumped total. */
function bookPump(m: FloodModel, dy: Float64Array, k: number, slot: number, q: number, nF: number, nV: number): void {
  const s = m.pumps[k].space;
  if (m.spaces[s].held) dy[nV + SEA_IN] += q;
  else dy[s * nF + slot] -= q;
  dy[nV + PUMPED] += q;
}

/**
 * dy/dt for the state: `pumpRate[i]` is pump i's capacity while it runs (0 when stopped).
 * `breakdown`, if given, receives the flows.
 */
export function floodDerivative(m: FloodModel, pumpRate: Float64Array, st: SpaceStack = newStack(m)) {
  const nF = m.fluids.length;
  const nV = m.spaces.length * nF;
  // only spaces with an opening or a pump ever change: the others' surfaces are worked out once
  const moving = movingSpaces(m);
  let primed = false;
  const q = new Float64Array(nF);
  return (_t: number, y: Float64Array, dy: Float64Array, breakdown?: FlowBreakdown): void => {
    stackOf(m, y, st, primed ? moving : undefined);
    primed = true;
    dy.fill(0);
    for (let k = 0; k < m.openings.length; k++) {
      const op = m.openings[k];
      const net = openingSlotFlows(m, st, op, q);
      for (let f = 0; f < nF; f++) if (q[f] !== 0) move(m, dy, op.outside, op.inside, f, q[f], nF, nV);
      if (breakdown) breakdown.opening[k] = net;
    }
    for (let k = 0; k < m.pumps.length; k++) {
      const drawn = pumpSlotFlows(m, st, k, pumpRate[k], q);
      for (let f = 0; f < nF; f++) if (q[f] !== 0) bookPump(m, dy, k, f, q[f], nF, nV);
      if (breakdown) breakdown.pump[k] = drawn;
    }
  };
}

/** Moves q m³/s of fluid `slot` from side `from` to side `to` (−1: the sea); a held space trades with the sea. */
function move(m: FloodModel, dy: Float64Array, from: number, to: number, slot: number, q: number, nF: number, nV: number): void {
  const fromSea = from < 0 || m.spaces[from].held;
  const toSea = to < 0 || m.spaces[to].held;
  if (fromSea && toSea) return;
  if (fromSea) {
    if (q >= 0) dy[nV + SEA_IN] += q;
    else dy[nV + SEA_OUT] -= q;
  } else dy[from * nF + slot] -= q;
  if (toSea) {
    if (q >= 0) dy[nV + SEA_OUT] += q;
    else dy[nV + SEA_IN] -= q;
  } else dy[to * nF + slot] += q;
}

/** in − out − stored between two states, m³, and the scale to judge it by. */
export function volumeBalance(m: FloodModel, y0: Float64Array, y: Float64Array): { inM3: number; outM3: number; storedM3: number; balanceM3: number; relative: number } {
  const nV = m.spaces.length * m.fluids.length;
  let stored = 0, total = 0;
  for (let i = 0; i < nV; i++) {
    stored += y[i] - y0[i];
    total += Math.abs(y[i]);
  }
  const inM3 = y[nV + SEA_IN] - y0[nV + SEA_IN];
  const outM3 = y[nV + SEA_OUT] - y0[nV + SEA_OUT] + y[nV + PUMPED] - y0[nV + PUMPED];
  const balance = inM3 - outM3 - stored;
  const scale = Math.max(Math.abs(inM3), Math.abs(outM3), Math.abs(stored), total, 1e-12);
  return { inM3, outM3, storedM3: stored, balanceM3: balance, relative: Math.abs(balance) / scale };
}

/** Rate of rise of the liquid surface of space s, m/s, from the volume rates. */
export function levelRate(m: FloodModel, st: SpaceStack, s: number, dy: Float64Array): number {
  const nF = m.fluids.length;
  let dv = 0;
  for (let f = 0; f < nF; f++) dv += dy[s * nF + f];
  const area = surfaceAreaAt(m.spaces[s].table, st.liquidTop[s]) * m.spaces[s].permeability;
  return area > 0 ? dv / area : 0;
}

/**
 * The model's Jacobian and the solves a linearly implicit integrator needs (flooding-ode.ts
 * rosenbrock23). Spaces joined by openings form groups (the sea and spaces held in balance with it
 * join nothing), and every other space's row is zero, so W = I − γhJ is solved group by group with
 * partial pivoting. A group's spaces are put in reverse Cuthill–McKee order, so a large group (many
 * spaces joined in a chain or a grid) has its nonzeros in a narrow band and is factorised as a band
 * (sparse-band.ts); a small or densely joined one by the dense LU (`dense: true` forces that, for
 * checks). The running totals (in, out, pumped) depend on nothing, so their rows are applied after
 * the groups are solved.
 *
 * J is worked out by forward differences, one space's fluid at a time, through the openings and
 * pumps of that space only. Each difference is booked like the flow itself (out of one side, into
 * the other: move, bookPump), so every column of J sums to zero over the volume balance exactly as
 * the flows do, and the integrator keeps the balance to rounding.
 */
export function floodLinearisation(m: FloodModel, pumpRate: Float64Array, opts: { dense?: boolean } = {}): Linearisation {
  const nF = m.fluids.length;
  const nS = m.spaces.length;
  const nV = nS * nF;
  const st = newStack(m);
  const moving = movingSpaces(m);
  const live = Array.from(moving).filter((s) => !m.spaces[s].held);
  // groups of spaces joined by openings (union–find)
  const parent = new Int32Array(nS).map((_, i) => i);
  const root = (i: number): number => {
    while (parent[i] !== i) i = parent[i] = parent[parent[i]];
    return i;
  };
  const openingsOf: number[][] = Array.from({ length: nS }, () => []);
  const pumpsOf: number[][] = Array.from({ length: nS }, () => []);
  m.openings.forEach((op, k) => {
    openingsOf[op.inside].push(k);
    if (op.outside >= 0) {
      openingsOf[op.outside].push(k);
      if (!m.spaces[op.inside].held && !m.spaces[op.outside].held) parent[root(op.inside)] = root(op.outside);
    }
  });
  m.pumps.forEach((p, k) => pumpsOf[p.space].push(k));
  const byRoot = new Map<number, number[]>();
  for (const s of live) {
    const r = root(s);
    const list = byRoot.get(r);
    if (list) list.push(s);
    else byRoot.set(r, [s]);
  }
  // each group's spaces in reverse Cuthill–McKee order of the openings joining them (narrow band)
  for (const [r, spaces] of byRoot) {
    if (spaces.length < 3) continue;
    const at = new Map(spaces.map((s, a) => [s, a]));
    const nb: number[][] = spaces.map(() => []);
    for (const op of m.openings) {
      const a = at.get(op.inside), b = op.outside >= 0 ? at.get(op.outside) : undefined;
      if (a !== undefined && b !== undefined && a !== b) {
        nb[a].push(b);
        nb[b].push(a);
      }
    }
    byRoot.set(r, Array.from(reverseCuthillMcKee(nb), (a) => spaces[a]));
  }
  interface Group {
    vars: Int32Array;
    /** Per space of the group (in order), the local rows its columns can touch: its own and those of the spaces its openings join, sorted. */
    rows: Int32Array[];
    /** Row-major size × size; only the entries in `rows` are ever written, so the rest stay zero. */
    j: Float64Array;
    /** The totals' rows of J over this group's columns (3 × size). */
    jt: Float64Array;
    lu: Float64Array;
    piv: Int32Array;
    /** Set when the last Jacobian's band makes a band LU pay. */
    band: BandLu | null;
    useBand: boolean;
    gh: number;
    x: Float64Array;
  }
  const groups: Group[] = [];
  const localOf = new Int32Array(nV).fill(-1);
  const groupOf = new Int32Array(nS).fill(-1);
  for (const spaces of byRoot.values()) {
    const size = spaces.length * nF;
    const vars = new Int32Array(size);
    spaces.forEach((s, a) => {
      groupOf[s] = groups.length;
      for (let f = 0; f < nF; f++) {
        vars[a * nF + f] = s * nF + f;
        localOf[s * nF + f] = a * nF + f;
      }
    });
    // a column of space s has nonzeros only in s and the spaces its openings join (move() books nothing else
    // but the totals): the Jacobian's pattern, known before any difference is taken
    const rows = spaces.map((s) => {
      const joined = new Set<number>([s]);
      for (const k of openingsOf[s]) for (const side of [m.openings[k].inside, m.openings[k].outside]) if (side >= 0 && !m.spaces[side].held) joined.add(side);
      const local: number[] = [];
      for (const o of joined) for (let f = 0; f < nF; f++) local.push(localOf[o * nF + f]);
      return Int32Array.from(local.sort((a, b) => a - b));
    });
    // the band of that pattern (every entry that can be nonzero lies inside it, so nothing is ever dropped)
    let kl = 0, ku = 0;
    rows.forEach((r, a) => {
      for (let f = 0; f < nF; f++) {
        const c = a * nF + f;
        kl = Math.max(kl, r[r.length - 1] - c);
        ku = Math.max(ku, c - r[0]);
      }
    });
    const useBand = !opts.dense && bandPays(size, kl, ku);
    groups.push({
      vars,
      rows,
      j: new Float64Array(size * size),
      jt: new Float64Array(3 * size),
      lu: new Float64Array(useBand ? 0 : size * size),
      piv: new Int32Array(size),
      band: useBand ? newBandLu(size, kl, ku) : null,
      useBand,
      gh: NaN,
      x: new Float64Array(size),
    });
  }
  const baseQ = new Float64Array(m.openings.length * nF);
  const baseP = new Float64Array(m.pumps.length * nF);
  const q = new Float64Array(nF);
  const col = new Float64Array(nV + 3);
  const one = new Int32Array(1);
  const saved = new Float64Array(nF);
  const flowsOf = (s: number, sign: number) => {
    for (const k of openingsOf[s]) {
      const op = m.openings[k];
      openingSlotFlows(m, st, op, q);
      for (let f = 0; f < nF; f++) {
        const d = sign * (q[f] - baseQ[k * nF + f]);
        if (d !== 0) move(m, col, op.outside, op.inside, f, d, nF, nV);
      }
    }
    for (const k of pumpsOf[s]) {
      pumpSlotFlows(m, st, k, pumpRate[k], q);
      for (let f = 0; f < nF; f++) {
        const d = sign * (q[f] - baseP[k * nF + f]);
        if (d !== 0) bookPump(m, col, k, f, d, nF, nV);
      }
    }
  };
  return {
    jacobian(_t, y) {
      stackOf(m, y, st, moving);
      for (let k = 0; k < m.openings.length; k++) {
        openingSlotFlows(m, st, m.openings[k], q);
        baseQ.set(q, k * nF);
      }
      for (let k = 0; k < m.pumps.length; k++) {
        pumpSlotFlows(m, st, k, pumpRate[k], q);
        baseP.set(q, k * nF);
      }
      for (const g of groups) {
        g.gh = NaN;
        const size = g.vars.length;
        for (let c = 0; c < size; c++) {
          const v = g.vars[c];
          const s = (v - (v % nF)) / nF;
          const room = m.spaces[s].permeability * m.spaces[s].table.total;
          const yv = y[v];
          const delta = 1.4901161193847656e-8 * Math.max(Math.abs(yv), 1e-3 * room, 1e-9);
          // perturb, and put the space's surfaces back by copying rather than working them out again
          saved.set(st.tops.subarray(s * nF, s * nF + nF));
          const savedTop = st.liquidTop[s], savedGas = st.gasPa[s], savedVolume = st.liquidVolume[s];
          y[v] = yv + delta;
          const dInv = 1 / (y[v] - yv);
          one[0] = s;
          stackOf(m, y, st, one);
          flowsOf(s, dInv);
          y[v] = yv;
          st.tops.set(saved, s * nF);
          st.liquidTop[s] = savedTop;
          st.gasPa[s] = savedGas;
          st.liquidVolume[s] = savedVolume;
          // gather the column from the rows it can touch (the pattern) and the totals, and clear the scratch
          const touched = g.rows[(c - (c % nF)) / nF];
          for (let k = 0; k < touched.length; k++) {
            const r = touched[k];
            const i = g.vars[r];
            g.j[r * size + c] = col[i];
            col[i] = 0;
          }
          for (let r = 0; r < 3; r++) {
            g.jt[r * size + c] = col[nV + r];
            col[nV + r] = 0;
          }
        }
      }
    },
    solve(gh, b) {
      const t0 = b[nV + SEA_IN], t1 = b[nV + SEA_OUT], t2 = b[nV + PUMPED];
      let a0 = 0, a1 = 0, a2 = 0;
      for (const g of groups) {
        const size = g.vars.length;
        if (g.gh !== gh) {
          if (g.useBand) bandFactorise(g.j, gh, g.band!);
          else denseFactorise(g.j, gh, size, g.lu, g.piv);
          g.gh = gh;
        }
        const x = g.x;
        for (let r = 0; r < size; r++) x[r] = b[g.vars[r]];
        if (g.useBand) bandSolve(g.band!, x);
        else denseSolve(g.lu, g.piv, size, x);
        for (let r = 0; r < size; r++) {
          b[g.vars[r]] = x[r];
          a0 += g.jt[r] * x[r];
          a1 += g.jt[size + r] * x[r];
          a2 += g.jt[2 * size + r] * x[r];
        }
      }
      b[nV + SEA_IN] = t0 + gh * a0;
      b[nV + SEA_OUT] = t1 + gh * a1;
      b[nV + PUMPED] = t2 + gh * a2;
    },
  };
}
