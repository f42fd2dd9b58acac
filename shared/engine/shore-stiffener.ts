/**
 * Stiffeners and shores on one stiffened flat plate, with every part of the plate's load going to
 * exactly one place:
 * - the plating spans between the stiffeners: each stiffener carries the strip of plate from half
 *   way to the stiffener (or plate edge) on one side to half way to the next (q = strip width × p
 *   at the stiffener's line), and bears at its ends on the plate's supported edges;
 * - the strips between the outer stiffeners' half-way lines and the plate's edges go straight to
 *   those edges;
 * - a shore whose head lies on a stiffener (within a tenth of the spacing of its line) is a rigid
 *   intermediate support of that stiffener; a shore between stiffeners bears on the plating, which
 *   passes its reaction to the two stiffeners (or stiffener and plate edge) either side by the
 *   lever rule, the plating taken as rigid across the gap;
 * - the shore reactions follow from compatibility (no deflection where a shore bears), solved
 *   exactly by the force method: flexibility coefficients by virtual work, ∫ M m̄ ds / EI, the
 *   integrands piecewise polynomials of degree ≤ 5 integrated exactly with 3-point Gauss–Legendre
 *   (e.g. Hibbeler, Structural Analysis, ch. 10). Shores take compression only: one that would be
 *   pulled is dropped and the rest solved again. Every stiffener has the same section, so EI cancels.
 */
import type { Boundary } from '../schemas/survey';
import { edgeWords } from '../units/point-words';
import { BEAM_OUT, beamResultOf, solveBeamInto, type EndFixity } from './beam';
import { addPolygonStrips, evalProfile, RegionClip, stripsNetForce, zeroRegionStrips, type FlatPlate } from './plate';
import type { PressureProfile } from './profile';
import type { Severity, ShoreResult, StiffenerItem, StiffenerResult } from './results';
import type { PanelInput } from './plating';
import { shoreResult, shoreUtilisation } from './shore-check';

type Warn = (code: string, s: Severity, id: string | null, m: string) => void;

/** More stiffener lines than this are not built (a warning says so). */
export const MAX_STIFFENERS = 1000;
/** A shore's head within this fraction of the spacing of a stiffener's line bears on the stiffener. */
export const ON_STIFFENER_FRACTION = 0.1;

export const STIFFENED_MODEL_WORDS =
  'Plating spans between stiffeners; each stiffener carries the plate half way to its neighbours (or to the plate edge) and bears at its ends on the plate\'s supported edges; the outermost strips go straight to the edges. ' +
  'A shore on a stiffener is a rigid intermediate support of it; a shore between stiffeners passes its reaction to the stiffeners either side by the lever rule. Shores push only; each load is counted once.';

const GX = [-Math.sqrt(3 / 5), 0, Math.sqrt(3 / 5)];
const GW = [5 / 9, 8 / 9, 5 / 9];

// ---- scratch (the engine is synchronous and never re-entered): every array grows, never shrinks
function grownF(a: Float64Array<ArrayBuffer>, need: number): Float64Array<ArrayBuffer> {
  if (a.length >= need) return a;
  const b = new Float64Array(Math.max(need, 2 * a.length));
  b.set(a);
  return b;
}
function grownI(a: Int32Array<ArrayBuffer>, need: number): Int32Array<ArrayBuffer> {
  if (a.length >= need) return a;
  const b = new Int32Array(Math.max(need, 2 * a.length));
  b.set(a);
  return b;
}

/**
 * The model of the plate last solved (solveStiffened): the stiffener lines (across-coordinate t,
 * span s0..s1, tributary width), each line's stations and loads (line k's are st[stOff[k] ..
 * stOff[k + 1])), its beam without shores, its final beam, check and shore forces, and each shore's
 * bearing (up to two parts: line, lever fraction, distance from the line's start) and reaction.
 */
const S = {
  nL: 0,
  lineT: new Float64Array(16),
  lineS0: new Float64Array(16),
  lineS1: new Float64Array(16),
  lineW: new Float64Array(16),
  /** Reaction at the start of the line's beam as simply supported (fixed ends only), NaN until needed. */
  lineSsRa: new Float64Array(16),
  stOff: new Int32Array(17),
  st: new Float64Array(64),
  q: new Float64Array(64),
  base: new Float64Array(16 * BEAM_OUT),
  item: new Float64Array(16 * BEAM_OUT),
  itemRequired: new Float64Array(16),
  itemU: new Float64Array(16),
  itemShoreForces: new Float64Array(16),
  nShores: 0,
  /** 0 panel, 1 stiffener, 2 edge. */
  bearsOn: new Int32Array(8),
  nParts: new Int32Array(8),
  partLine: new Int32Array(16),
  partF: new Float64Array(16),
  partX: new Float64Array(16),
  partW0: new Float64Array(16),
  edgeF: new Float64Array(8),
  sigma: new Float64Array(8),
  active: new Int32Array(8),
  R: new Float64Array(8),
  idx: new Int32Array(8),
  A: new Float64Array(64),
  rhs: new Float64Array(64),
  aug: new Float64Array(72),
  sol: new Float64Array(8),
  pointAt: new Float64Array(8),
  pointF: new Float64Array(8),
  knots: new Float64Array(64),
  tMin: 0,
  tMax: 0,
  pu: 0,
  pv: 0,
  du: 0,
  dv: 0,
  truncated: false,
  best: -1,
  bestU: 0,
  edgeStrips: 0,
  edgeLever: 0,
};

const BEARS_ON: readonly ShoreResult['bearsOn'][] = ['panel', 'stiffener', 'edge'];

function ensureLines(n: number): void {
  if (S.lineT.length >= n) return;
  const m = 2 * n;
  S.lineT = grownF(S.lineT, m);
  S.lineS0 = grownF(S.lineS0, m);
  S.lineS1 = grownF(S.lineS1, m);
  S.lineW = grownF(S.lineW, m);
  S.lineSsRa = grownF(S.lineSsRa, m);
  S.stOff = grownI(S.stOff, m + 1);
  S.base = grownF(S.base, m * BEAM_OUT);
  S.item = grownF(S.item, m * BEAM_OUT);
  S.itemRequired = grownF(S.itemRequired, m);
  S.itemU = grownF(S.itemU, m);
  S.itemShoreForces = grownF(S.itemShoreForces, m);
}

function ensureShores(n: number): void {
  if (S.bearsOn.length < n) {
    const m = 2 * n;
    S.bearsOn = grownI(S.bearsOn, m);
    S.nParts = grownI(S.nParts, m);
    S.partLine = grownI(S.partLine, 2 * m);
    S.partF = grownF(S.partF, 2 * m);
    S.partX = grownF(S.partX, 2 * m);
    S.partW0 = grownF(S.partW0, 2 * m);
    S.edgeF = grownF(S.edgeF, m);
    S.sigma = grownF(S.sigma, m);
    S.active = grownI(S.active, m);
    S.R = grownF(S.R, m);
    S.idx = grownI(S.idx, m);
    S.sol = grownF(S.sol, m);
    S.pointAt = grownF(S.pointAt, 2 * m);
    S.pointF = grownF(S.pointF, 2 * m);
  }
  S.A = grownF(S.A, n * n);
  S.rhs = grownF(S.rhs, n);
  S.aug = grownF(S.aug, n * (n + 1));
}

/** Moment at x (from the start) of line k as a simply supported beam under its stations' load, with start reaction ra. */
function ssMoment(k: number, ra: number, x: number): number {
  const st = S.st, q = S.q, lo = S.stOff[k], hi = S.stOff[k + 1];
  let m = ra * x;
  const s0 = st[lo];
  for (let i = lo; i + 1 < hi; i++) {
    const a = st[i] - s0, b = Math.min(st[i + 1] - s0, x);
    if (b <= a) break;
    const h = st[i + 1] - st[i];
    // ∫_a^b q(ξ)(x − ξ) dξ, q linear: quadratic integrand, 3-point Gauss exact
    for (let g = 0; g < 3; g++) {
      const xi = a + 0.5 * (1 + GX[g]) * (b - a);
      const qx = q[i] + ((q[i + 1] - q[i]) * (xi - a)) / h;
      m -= GW[g] * 0.5 * (b - a) * qx * (x - xi);
    }
  }
  return m;
}

const ssOut = new Float64Array(BEAM_OUT);

/** EI × deflection at x of line k's beam under its own distributed load (virtual work with the ss unit-load moment). */
function distributedDeflection(k: number, fixity: EndFixity, x: number): number {
  const st = S.st, lo = S.stOff[k], hi = S.stOff[k + 1], n = hi - lo;
  const s0 = st[lo];
  const L = st[hi - 1] - s0;
  const base = k * BEAM_OUT;
  let ra: number;
  if (fixity === 'fixed') {
    if (Number.isNaN(S.lineSsRa[k])) S.lineSsRa[k] = solveBeamInto(st, S.q, lo, n, 'simply-supported', ssOut, ssOut, 0, ssOut)[2];
    ra = S.lineSsRa[k];
  } else {
    ra = S.base[base + 2];
  }
  const MA = fixity === 'fixed' ? S.base[base + 6] : 0, MB = fixity === 'fixed' ? S.base[base + 7] : 0;
  // the knots: the stations from the start and x, ascending
  S.knots = grownF(S.knots, n + 1);
  const knots = S.knots;
  let nk = 0, placed = false;
  for (let i = lo; i < hi; i++) {
    const v = st[i] - s0;
    if (!placed && x < v) {
      knots[nk++] = x;
      placed = true;
    }
    knots[nk++] = v;
  }
  if (!placed) knots[nk++] = x;
  let sum = 0;
  for (let i = 0; i + 1 < nk; i++) {
    const a = knots[i], b = knots[i + 1];
    if (b <= a) continue;
    for (let g = 0; g < 3; g++) {
      const s = a + 0.5 * (1 + GX[g]) * (b - a);
      const M = ssMoment(k, ra, s) + MA * (1 - s / L) + MB * (s / L);
      const mbar = s <= x ? (s * (L - x)) / L : (x * (L - s)) / L;
      sum += GW[g] * 0.5 * (b - a) * M * mbar;
    }
  }
  return sum;
}

/** EI × deflection at x from a unit load at a, span L (AISC Manual Table 3-23, cases 7 and 16). */
export function pointDeflection(L: number, fixity: EndFixity, a: number, x: number): number {
  if (x > a) return pointDeflection(L, fixity, L - a, L - x);
  const b = L - a;
  if (fixity === 'simply-supported') return (b * x * (L * L - b * b - x * x)) / (6 * L);
  return (b * b * x * x * (3 * a * L - 3 * a * x - b * x)) / (6 * L * L * L);
}

/**
 * Solves A r = rhs for the first n unknowns (A row-major n × n, small and dense, partial pivoting)
 * into S.sol; false when singular.
 */
function solveDense(n: number): boolean {
  const A = S.A, rhs = S.rhs, M = S.aug, w = n + 1;
  let scale = 1e-300;
  for (let i = 0; i < n; i++) {
    M[i * w + n] = rhs[i];
    for (let j = 0; j < n; j++) M[i * w + j] = A[i * n + j];
    scale = Math.max(scale, Math.abs(A[i * n + i]));
  }
  for (let c = 0; c < n; c++) {
    let p = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(M[r * w + c]) > Math.abs(M[p * w + c])) p = r;
    if (Math.abs(M[p * w + c]) < 1e-12 * scale) return false;
    if (p !== c) {
      for (let k = 0; k < w; k++) {
        const t = M[c * w + k];
        M[c * w + k] = M[p * w + k];
        M[p * w + k] = t;
      }
    }
    for (let r = c + 1; r < n; r++) {
      const f = M[r * w + c] / M[c * w + c];
      for (let k = c; k <= n; k++) M[r * w + k] -= f * M[c * w + k];
    }
  }
  const x = S.sol;
  for (let r = n - 1; r >= 0; r--) {
    let v = M[r * w + n];
    for (let k = r + 1; k < n; k++) v -= M[r * w + k] * x[k];
    x[r] = v / M[r * w + r];
  }
  return true;
}

const bandClip = new RegionClip();

/** Net force on the part of the plate with tLo ≤ t ≤ tHi (t = u pu + v pv), N, exact. */
function stripForce(plate: FlatPlate, net: PressureProfile, cuts: readonly number[], pu: number, pv: number, tLo: number, tHi: number): number {
  if (!(tHi > tLo)) return 0;
  const strips = zeroRegionStrips(cuts);
  for (let r = 0; r < plate.region.length; r++) {
    bandClip.start(plate.region[r].shape);
    bandClip.clip(pu, pv, tHi);
    bandClip.clip(-pu, -pv, -tLo);
    if (bandClip.len > 0) addPolygonStrips(bandClip.pts, bandClip.len, plate.region[r].sign, cuts, strips);
  }
  return stripsNetForce(plate, net, cuts, strips);
}

/** Where the stiffener lines lie on the plate: across direction (pu, pv), along (du, dv), plate axes. */
export interface StiffenerLayout {
  pu: number;
  pv: number;
  du: number;
  dv: number;
  tMin: number;
  tMax: number;
  lines: { t: number; s0: number; s1: number }[];
}

/** The layout of an unstiffened plate: no lines, "along" the plate's v axis. */
export function plainLayout(plate: FlatPlate): StiffenerLayout {
  const o = plate.region[0].shape;
  let uMin = Infinity, uMax = -Infinity;
  if (o.kind === 'circle') {
    uMin = o.uc - o.r;
    uMax = o.uc + o.r;
  } else {
    for (let i = 0; i < o.pts.length; i += 2) {
      uMin = Math.min(uMin, o.pts[i]);
      uMax = Math.max(uMax, o.pts[i]);
    }
  }
  return { pu: 1, pv: 0, du: 0, dv: 1, tMin: uMin, tMax: uMax, lines: [] };
}

/** The plating panels between stiffener lines (and the plate's edges), with the net pressure at their corners. */
export function platingPanels(plate: FlatPlate, net: PressureProfile, cuts: readonly number[], lay: StiffenerLayout): PanelInput[] {
  const fr = plate.frame;
  const T = [lay.tMin, ...lay.lines.map((l) => l.t), lay.tMax];
  const out: PanelInput[] = [];
  for (let i = 0; i + 1 < T.length; i++) {
    const near = [lay.lines[i - 1], lay.lines[i]].filter((l) => l !== undefined);
    let s0 = Infinity, s1 = -Infinity;
    if (near.length > 0) {
      for (const l of near) {
        s0 = Math.min(s0, l.s0);
        s1 = Math.max(s1, l.s1);
      }
    } else {
      s0 = plate.vMin;
      s1 = plate.vMax;
    }
    const corner = (t: number, s: number): [number, number] => {
      const v = t * lay.pv + s * lay.dv;
      return [evalProfile(net, fr.e0 + fr.k * v), v];
    };
    const c00 = corner(T[i], s0), c10 = corner(T[i], s1), c01 = corner(T[i + 1], s0), c11 = corner(T[i + 1], s1);
    const vs = [c00[1], c10[1], c01[1], c11[1]];
    const vLo = Math.min(...vs), vHi = Math.max(...vs);
    let kinked = false;
    for (let k = 1; k + 1 < cuts.length; k++) if (cuts[k] > vLo + 1e-9 && cuts[k] < vHi - 1e-9) kinked = true;
    out.push({ offsetM: (T[i] + T[i + 1]) / 2 - lay.tMin, alongM: s1 - s0, acrossM: T[i + 1] - T[i], p00: c00[0], p10: c10[0], p01: c01[0], p11: c11[0], kinked });
  }
  return out;
}

export interface StiffenedPlateLoads {
  layout: StiffenerLayout | null;
  stiffeners: StiffenerResult;
  /** Shore results in the order of b.shores, or null when there are no stiffeners to carry them. */
  shores: ShoreResult[] | null;
}

type Status = StiffenerResult['status'];

const NORMAL_NOTE = 'the stiffener run is normal to the plate, so no stiffener lies in it: no stiffener check';
const NONE_NOTE = 'no stiffener line with a span falls inside the plate at this spacing and first offset: no stiffener check';

/**
 * The stiffener and shore model of one flat plate, solved into S (every number of the result, no
 * objects), with its warnings up to the stiffener check; the shores' own checks are the caller's.
 * Returns the status: anything but 'ok' means no stiffener could be built.
 */
function solveStiffened(b: Boundary, plate: FlatPlate, net: PressureProfile, cuts: readonly number[], warn: Warn): Status {
  const st = b.stiffening!;
  const fr = plate.frame;
  const dir = st.direction;
  let du = dir.x * fr.u[0] + dir.y * fr.u[1] + dir.z * fr.u[2], dv = dir.x * fr.v[0] + dir.y * fr.v[1] + dir.z * fr.v[2];
  const dl = Math.hypot(du, dv);
  if (!(dl > 1e-6 * Math.max(1e-300, Math.hypot(dir.x, dir.y, dir.z)))) {
    warn('stiffener-normal', 'danger', b.id, `${b.name}: ${NORMAL_NOTE}. Give a run along the plate.`);
    return 'normal-to-plate';
  }
  du /= dl;
  dv /= dl;
  const pu = -dv, pv = du; // across the stiffeners
  const outer = plate.region[0].shape;
  let tMin = Infinity, tMax = -Infinity;
  if (outer.kind === 'circle') {
    const tc = outer.uc * pu + outer.vc * pv;
    tMin = tc - outer.r;
    tMax = tc + outer.r;
  } else {
    for (let i = 0; i < outer.pts.length; i += 2) {
      const t = outer.pts[i] * pu + outer.pts[i + 1] * pv;
      tMin = Math.min(tMin, t);
      tMax = Math.max(tMax, t);
    }
  }
  S.pu = pu;
  S.pv = pv;
  S.du = du;
  S.dv = dv;
  S.tMin = tMin;
  S.tMax = tMax;
  const first = st.firstOffsetM ?? st.spacingM;
  const tol = 1e-9 * Math.max(1, tMax - tMin);
  let nL = 0;
  let truncated = false;
  let zeroSpan = 0;
  for (let k = 0; ; k++) {
    const t = tMin + first + k * st.spacingM;
    if (t >= tMax - tol) break;
    if (nL >= MAX_STIFFENERS) {
      truncated = true;
      break;
    }
    let s0 = Infinity, s1 = -Infinity;
    if (outer.kind === 'circle') {
      const dc = t - (outer.uc * pu + outer.vc * pv);
      const h = Math.sqrt(Math.max(0, outer.r * outer.r - dc * dc));
      const sc = outer.uc * du + outer.vc * dv;
      s0 = sc - h;
      s1 = sc + h;
    } else {
      const p = outer.pts;
      for (let i = 0; i < p.length; i += 2) {
        const j = i + 2 < p.length ? i + 2 : 0;
        const fa = p[i] * pu + p[i + 1] * pv - t, fb = p[j] * pu + p[j + 1] * pv - t;
        if ((fa <= 0 && fb >= 0) || (fa >= 0 && fb <= 0)) {
          const w = fa === fb ? 0 : fa / (fa - fb);
          const x = p[i] + w * (p[j] - p[i]), y = p[i + 1] + w * (p[j + 1] - p[i + 1]);
          const s = x * du + y * dv;
          s0 = Math.min(s0, s);
          s1 = Math.max(s1, s);
        }
      }
    }
    if (st.spanM !== undefined && s1 > s0) s1 = s0 + st.spanM;
    if (!(s1 - s0 > 1e-9 * Math.max(1, tMax - tMin))) {
      zeroSpan++;
      continue;
    }
    ensureLines(nL + 1);
    S.lineT[nL] = t;
    S.lineS0[nL] = s0;
    S.lineS1[nL] = s1;
    nL++;
  }
  S.nL = nL;
  S.truncated = truncated;
  if (truncated) warn('stiffeners-truncated', 'danger', b.id, `${b.name}: more than ${MAX_STIFFENERS} stiffeners at this spacing; only the first ${MAX_STIFFENERS} are checked (is the spacing in the right unit?)`);
  if (zeroSpan > 0) warn('stiffener-zero-span', 'warning', b.id, `${b.name}: ${zeroSpan} stiffener line${zeroSpan > 1 ? 's have' : ' has'} no span inside the plate; not checked`);
  if (nL === 0) {
    warn('stiffener-none', 'danger', b.id, `${b.name}: ${NONE_NOTE}`);
    return 'none-inside';
  }
  const T = S.lineT;
  // tributary widths: half way to the neighbours, or to the plate edge; each line's stations and loads
  S.st = grownF(S.st, nL * (cuts.length + 2));
  S.q = grownF(S.q, nL * (cuts.length + 2));
  let off = 0;
  for (let i = 0; i < nL; i++) {
    const lo = i === 0 ? (tMin + T[0]) / 2 : (T[i - 1] + T[i]) / 2;
    const hi = i === nL - 1 ? (T[i] + tMax) / 2 : (T[i] + T[i + 1]) / 2;
    const width = hi - lo;
    S.lineW[i] = width;
    S.lineSsRa[i] = NaN;
    const v0 = T[i] * pv;
    const l0 = S.lineS0[i], l1 = S.lineS1[i];
    const st0 = off;
    S.st[off++] = l0;
    S.st[off++] = l1;
    if (dv !== 0) {
      for (let c = 0; c < cuts.length; c++) {
        const s = (cuts[c] - v0) / dv;
        if (s > l0 && s < l1) S.st[off++] = s;
      }
    }
    // ascending (insertion sort: a handful of stations, stable like Array.prototype.sort)
    for (let a = st0 + 1; a < off; a++) {
      const x = S.st[a];
      let j = a - 1;
      while (j >= st0 && S.st[j] > x) {
        S.st[j + 1] = S.st[j];
        j--;
      }
      S.st[j + 1] = x;
    }
    for (let a = st0; a < off; a++) S.q[a] = width * evalProfile(net, fr.e0 + fr.k * (v0 + S.st[a] * dv));
    S.stOff[i] = st0;
    S.stOff[i + 1] = off;
    solveBeamInto(S.st, S.q, st0, off - st0, st.endFixity, S.pointAt, S.pointF, 0, S.base, i * BEAM_OUT);
  }
  S.edgeStrips = stripForce(plate, net, cuts, pu, pv, tMin - 1, (tMin + T[0]) / 2) + stripForce(plate, net, cuts, pu, pv, (T[nL - 1] + tMax) / 2, tMax + 1);

  // shores: where each bears, and its share to each line
  const shores = b.shores ?? [];
  const nS = shores.length;
  S.nShores = nS;
  ensureShores(nS);
  const onTol = ON_STIFFENER_FRACTION * st.spacingM;
  const o = fr.origin, U = fr.u, V = fr.v;
  for (let j = 0; j < nS; j++) {
    const sh = shores[j];
    const dx = sh.position.x - o[0], dy = sh.position.y - o[1], dz = sh.position.z - o[2];
    const u = dx * U[0] + dy * U[1] + dz * U[2], v = dx * V[0] + dy * V[1] + dz * V[2];
    const t = u * pu + v * pv, s = u * du + v * dv;
    S.sigma[j] = sh.side === 'B' ? 1 : -1;
    S.edgeF[j] = 0;
    S.nParts[j] = 0;
    let nearest = -1;
    for (let k = 0; k < nL; k++) if (Math.abs(T[k] - t) <= onTol && (nearest < 0 || Math.abs(T[k] - t) < Math.abs(T[nearest] - t))) nearest = k;
    if (nearest >= 0 && s > S.lineS0[nearest] && s < S.lineS1[nearest]) {
      S.bearsOn[j] = 1;
      addPart(j, nearest, 1, s - S.lineS0[nearest]);
      continue;
    }
    let left = -1, right = -1;
    for (let k = 0; k < nL; k++) {
      if (T[k] <= t) left = k;
      else if (right < 0) right = k;
    }
    const tl = left >= 0 ? T[left] : tMin, tr = right >= 0 ? T[right] : tMax;
    const gap = tr - tl;
    const c = gap > 0 ? Math.min(1, Math.max(0, (t - tl) / gap)) : 0;
    let edgeF = 0;
    // a part of no share (f ≤ 1e-9) is dropped
    if (left >= 0 && s > S.lineS0[left] && s < S.lineS1[left]) {
      if (1 - c > 1e-9) addPart(j, left, 1 - c, s - S.lineS0[left]);
    } else edgeF += 1 - c;
    if (right >= 0 && s > S.lineS0[right] && s < S.lineS1[right]) {
      if (c > 1e-9) addPart(j, right, c, s - S.lineS0[right]);
    } else edgeF += c;
    S.edgeF[j] = edgeF;
    S.bearsOn[j] = S.nParts[j] > 0 ? 0 : 2;
  }
  for (let j = 0; j < nS; j++) for (let p = 2 * j; p < 2 * j + S.nParts[j]; p++) S.partW0[p] = distributedDeflection(S.partLine[p], st.endFixity, S.partX[p]);

  // force method: unknown reactions of the shores in contact
  const R = S.R, active = S.active, idx = S.idx, A = S.A, rhs = S.rhs, sol = S.sol;
  for (let j = 0; j < nS; j++) {
    active[j] = S.nParts[j] > 0 ? 1 : 0;
    R[j] = 0;
  }
  for (let pass = 0; pass <= nS; pass++) {
    let n = 0;
    for (let j = 0; j < nS; j++) if (active[j]) idx[n++] = j;
    R.fill(0, 0, nS);
    if (n === 0) break;
    for (let a = 0; a < n; a++) {
      const i = idx[a];
      for (let c = 0; c < n; c++) {
        const j = idx[c];
        let f = 0;
        for (let pi = 2 * i; pi < 2 * i + S.nParts[i]; pi++) {
          for (let pj = 2 * j; pj < 2 * j + S.nParts[j]; pj++) {
            if (S.partLine[pi] !== S.partLine[pj]) continue;
            const line = S.partLine[pi];
            const L = S.lineS1[line] - S.lineS0[line];
            f += S.partF[pi] * S.partF[pj] * pointDeflection(L, st.endFixity, S.partX[pj], S.partX[pi]);
          }
        }
        A[a * n + c] = S.sigma[i] * S.sigma[j] * f;
      }
      let w = 0;
      for (let p = 2 * i; p < 2 * i + S.nParts[i]; p++) w = w + S.partF[p] * S.partW0[p];
      rhs[a] = S.sigma[i] * w;
    }
    if (!solveDense(n)) {
      // two shores where one would do (same point): the later one is left out
      active[idx[n - 1]] = 0;
      warn('shore-redundant', 'warning', shores[idx[n - 1]].id, `${b.name}: a shore stands where another already holds the plate; it is taken as carrying nothing`);
      continue;
    }
    let worst = -1;
    for (let c = 0; c < n; c++) {
      const r = sol[c];
      R[idx[c]] = r;
      if (r < 0 && (worst < 0 || r < sol[worst])) worst = c;
    }
    if (worst < 0) break;
    active[idx[worst]] = 0;
  }
  for (let j = 0; j < nS; j++) R[j] = Math.max(0, R[j]);

  // final stiffener beams with the shore reactions as point forces
  let best = -1, bestU = 0;
  for (let k = 0; k < nL; k++) {
    let np = 0;
    let shoreForces = 0;
    for (let j = 0; j < nS; j++) {
      for (let p = 2 * j; p < 2 * j + S.nParts[j]; p++) {
        if (S.partLine[p] === k && R[j] > 0) {
          S.pointAt[np] = S.partX[p];
          S.pointF[np] = -S.sigma[j] * S.partF[p] * R[j];
          shoreForces = shoreForces - S.pointF[np];
          np++;
        }
      }
    }
    const lo = S.stOff[k], hi = S.stOff[k + 1];
    if (np > 0) solveBeamInto(S.st, S.q, lo, hi - lo, st.endFixity, S.pointAt, S.pointF, np, S.item, k * BEAM_OUT);
    else for (let m = k * BEAM_OUT; m < (k + 1) * BEAM_OUT; m++) S.item[m] = S.base[m];
    const required = Math.abs(S.item[k * BEAM_OUT + 4]) / st.allowableStressPa;
    const u = required / st.sectionModulusM3;
    S.itemRequired[k] = required;
    S.itemU[k] = u;
    S.itemShoreForces[k] = shoreForces;
    if (best < 0 || u > bestU) {
      best = k;
      bestU = u;
    }
  }
  S.best = best;
  S.bestU = bestU;
  if (bestU > 1) warn('stiffener-overstressed', 'danger', b.id, `${b.name}: stiffener bending at ${(100 * bestU).toFixed(0)} % of allowable`);
  let edgeLever = 0;
  for (let j = 0; j < nS; j++) edgeLever = edgeLever + S.sigma[j] * S.edgeF[j] * R[j];
  S.edgeLever = edgeLever;
  return 'ok';
}

function addPart(j: number, line: number, f: number, x: number): void {
  const p = 2 * j + S.nParts[j]++;
  S.partLine[p] = line;
  S.partF[p] = f;
  S.partX[p] = x;
}

/** The layout of the plate last solved, for the plating check. */
function solvedLayout(): StiffenerLayout {
  const lines: StiffenerLayout['lines'] = new Array(S.nL);
  for (let k = 0; k < S.nL; k++) lines[k] = { t: S.lineT[k], s0: S.lineS0[k], s1: S.lineS1[k] };
  return { pu: S.pu, pv: S.pv, du: S.du, dv: S.dv, tMin: S.tMin, tMax: S.tMax, lines };
}

function emptyLoads(b: Boundary, status: Status): StiffenedPlateLoads {
  const st = b.stiffening!;
  const note = status === 'normal-to-plate' ? NORMAL_NOTE : NONE_NOTE;
  return {
    stiffeners: { endFixity: st.endFixity, spacingM: st.spacingM, items: [], governingIndex: null, maxUtilisation: null, status, note, edgeLoadN: null, offsetFromEdge: '', truncated: false, model: STIFFENED_MODEL_WORDS },
    shores: null,
    layout: null,
  };
}

/**
 * Loads on the stiffeners (and the shores with them) of one flat plate. Returns shores null when the
 * stiffeners cannot be built (run normal to the plate, no line inside it): the caller then shares
 * the plate among the shores alone.
 */
export function stiffenedPlateLoads(b: Boundary, plate: FlatPlate, net: PressureProfile, cuts: readonly number[], warn: Warn): StiffenedPlateLoads {
  const status = solveStiffened(b, plate, net, cuts, warn);
  if (status !== 'ok') return emptyLoads(b, status);
  const st = b.stiffening!;
  const fr = plate.frame;
  const items: StiffenerItem[] = new Array(S.nL);
  for (let k = 0; k < S.nL; k++) {
    const r = beamResultOf(S.item, k * BEAM_OUT);
    items[k] = {
      spanM: r.spanM,
      totalLoadN: r.totalLoadN,
      reactionStartN: r.reactionStartN,
      reactionEndN: r.reactionEndN,
      maxMomentNm: r.maxMomentNm,
      maxMomentAtM: r.maxMomentAtM,
      endMomentStartNm: r.endMomentStartNm,
      endMomentEndNm: r.endMomentEndNm,
      offsetM: S.lineT[k] - S.tMin,
      tributaryWidthM: S.lineW[k],
      shoreForcesN: S.itemShoreForces[k],
      requiredModulusM3: S.itemRequired[k],
      utilisation: S.itemU[k],
    };
  }
  const shores = b.shores ?? [];
  const shoreResults = shores.map((sh, j) => {
    const on = BEARS_ON[S.bearsOn[j]];
    if (on === 'edge') warn('shore-on-edge', 'info', sh.id, `${b.name}: a shore bears where the plate is held by its edge or a stiffener's end; in this model it carries nothing`);
    return shoreResult(b, sh, S.R[j], on, null, warn);
  });
  const { pu, pv } = S;
  return {
    stiffeners: {
      endFixity: st.endFixity,
      spacingM: st.spacingM,
      items,
      governingIndex: S.best,
      maxUtilisation: S.bestU,
      status: 'ok',
      note: null,
      edgeLoadN: S.edgeStrips - S.edgeLever,
      offsetFromEdge: edgeWords({ x: pu * fr.u[0] + pv * fr.v[0], y: pu * fr.u[1] + pv * fr.v[1], z: pu * fr.u[2] + pv * fr.v[2] }),
      truncated: S.truncated,
      model: STIFFENED_MODEL_WORDS,
    },
    shores: shoreResults,
    layout: solvedLayout(),
  };
}

/** What the summary needs of a stiffened plate (stiffenedPlateLean). */
export interface LeanStiffened {
  /** The stiffeners' largest utilisation, or null when none could be built. */
  maxUtilisation: number | null;
  /** False when the stiffeners cannot be built: the caller shares the plate among the shores alone. */
  carriesShores: boolean;
  layout: StiffenerLayout | null;
}

const lean: LeanStiffened = { maxUtilisation: null, carriesShores: false, layout: null };

/**
 * The summary's view of stiffenedPlateLoads, with the same warnings in the same order: the
 * stiffeners' largest utilisation, and each shore's utilisation written to shoreU (in the order of
 * b.shores) when the stiffeners carry them. The layout is built only when `withLayout` (the
 * plating check needs it). The returned record is reused by the next call.
 */
export function stiffenedPlateLean(b: Boundary, plate: FlatPlate, net: PressureProfile, cuts: readonly number[], warn: Warn, shoreU: Float64Array, withLayout: boolean): LeanStiffened {
  const status = solveStiffened(b, plate, net, cuts, warn);
  lean.layout = null;
  if (status !== 'ok') {
    lean.maxUtilisation = null;
    lean.carriesShores = false;
    return lean;
  }
  const shores = b.shores ?? [];
  for (let j = 0; j < shores.length; j++) {
    const sh = shores[j];
    if (S.bearsOn[j] === 2) warn('shore-on-edge', 'info', sh.id, `${b.name}: a shore bears where the plate is held by its edge or a stiffener's end; in this model it carries nothing`);
    shoreU[j] = shoreUtilisation(b, sh, S.R[j], warn);
  }
  lean.maxUtilisation = S.bestU;
  lean.carriesShores = true;
  if (withLayout) lean.layout = solvedLayout();
  return lean;
}
