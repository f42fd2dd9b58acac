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
import { solveBeam, type BeamResult, type EndFixity } from './beam';
import { clipHalfPlane } from './plane-integrals';
import { evalProfile, regionAsPolygons, regionNetForce, type FlatPlate, type SignedShape } from './plate';
import type { PressureProfile } from './profile';
import type { Severity, ShoreResult, StiffenerItem, StiffenerResult } from './results';
import type { PanelInput } from './plating';
import { shoreResult } from './shore-check';
import { dot, fromPoint, sub } from './vec';

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

interface Line {
  /** Across-coordinate of the line, m (plate axes projected on the across direction). */
  t: number;
  /** Along-coordinate of the start and end, m. */
  s0: number;
  s1: number;
  /** Tributary width, m. */
  width: number;
  stations: number[];
  q: number[];
  base: BeamResult;
}

/** Ship point to plate (u, v). */
function toPlate(plate: FlatPlate, p: { x: number; y: number; z: number }): [number, number] {
  const d = sub(fromPoint(p), plate.frame.origin);
  return [dot(d, plate.frame.u), dot(d, plate.frame.v)];
}

/** Moment at x (from the start) of a simply supported beam under the stations' load. */
function ssMoment(st: readonly number[], q: readonly number[], ra: number, x: number): number {
  let m = ra * x;
  const s0 = st[0];
  for (let i = 0; i + 1 < st.length; i++) {
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

/** EI × deflection at x of the beam under its own distributed load (virtual work with the ss unit-load moment). */
function distributedDeflection(line: Line, fixity: EndFixity, x: number): number {
  const st = line.stations, s0 = st[0];
  const L = st[st.length - 1] - s0;
  const ra = fixity === 'fixed' ? solveBeam(st, line.q, 'simply-supported').reactionStartN : line.base.reactionStartN;
  const MA = fixity === 'fixed' ? line.base.endMomentStartNm : 0, MB = fixity === 'fixed' ? line.base.endMomentEndNm : 0;
  const knots = [...st.map((v) => v - s0), x].sort((a, b) => a - b);
  let sum = 0;
  for (let i = 0; i + 1 < knots.length; i++) {
    const a = knots[i], b = knots[i + 1];
    if (b <= a) continue;
    for (let g = 0; g < 3; g++) {
      const s = a + 0.5 * (1 + GX[g]) * (b - a);
      const M = ssMoment(st, line.q, ra, s) + MA * (1 - s / L) + MB * (s / L);
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

/** Solves A r = rhs (small dense system, partial pivoting); null when singular. */
function solveDense(A: number[][], rhs: number[]): number[] | null {
  const n = rhs.length;
  const M = A.map((row, i) => [...row, rhs[i]]);
  const scale = Math.max(1e-300, ...A.map((r, i) => Math.abs(r[i])));
  for (let c = 0; c < n; c++) {
    let p = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(M[r][c]) > Math.abs(M[p][c])) p = r;
    if (Math.abs(M[p][c]) < 1e-12 * scale) return null;
    [M[c], M[p]] = [M[p], M[c]];
    for (let r = c + 1; r < n; r++) {
      const f = M[r][c] / M[c][c];
      for (let k = c; k <= n; k++) M[r][k] -= f * M[c][k];
    }
  }
  const x = new Array<number>(n).fill(0);
  for (let r = n - 1; r >= 0; r--) {
    let v = M[r][n];
    for (let k = r + 1; k < n; k++) v -= M[r][k] * x[k];
    x[r] = v / M[r][r];
  }
  return x;
}

/** Net force on the part of the plate with tLo ≤ t ≤ tHi (t = u pu + v pv), N, exact. */
function stripForce(plate: FlatPlate, net: PressureProfile, cuts: readonly number[], pu: number, pv: number, tLo: number, tHi: number): number {
  if (!(tHi > tLo)) return 0;
  const region: SignedShape[] = [];
  for (const { pts: all, sign } of regionAsPolygons(plate.region)) {
    let pts = clipHalfPlane(all, pu, pv, tHi);
    pts = pts.length > 0 ? clipHalfPlane(pts, -pu, -pv, -tLo) : pts;
    if (pts.length > 0) region.push({ shape: { kind: 'polygon', pts }, sign });
  }
  return regionNetForce(plate, region, net, cuts).forceN;
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

/**
 * Loads on the stiffeners (and the shores with them) of one flat plate. Returns shores null when the
 * stiffeners cannot be built (run normal to the plate, no line inside it): the caller then shares
 * the plate among the shores alone.
 */
export function stiffenedPlateLoads(b: Boundary, plate: FlatPlate, net: PressureProfile, cuts: readonly number[], warn: Warn): StiffenedPlateLoads {
  const st = b.stiffening!;
  const fr = plate.frame;
  const empty = (status: StiffenerResult['status'], note: string): StiffenedPlateLoads => ({
    stiffeners: { endFixity: st.endFixity, spacingM: st.spacingM, items: [], governingIndex: null, maxUtilisation: null, status, note, edgeLoadN: null, offsetFromEdge: '', truncated: false, model: STIFFENED_MODEL_WORDS },
    shores: null,
    layout: null,
  });
  const dShip = fromPoint(st.direction);
  let du = dot(dShip, fr.u), dv = dot(dShip, fr.v);
  const dl = Math.hypot(du, dv);
  if (!(dl > 1e-6 * Math.max(1e-300, Math.hypot(...dShip)))) {
    const note = 'the stiffener run is normal to the plate, so no stiffener lies in it: no stiffener check';
    warn('stiffener-normal', 'danger', b.id, `${b.name}: ${note}. Give a run along the plate.`);
    return empty('normal-to-plate', note);
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
  const first = st.firstOffsetM ?? st.spacingM;
  const tol = 1e-9 * Math.max(1, tMax - tMin);
  const lines: Line[] = [];
  let truncated = false;
  let zeroSpan = 0;
  for (let k = 0; ; k++) {
    const t = tMin + first + k * st.spacingM;
    if (t >= tMax - tol) break;
    if (lines.length >= MAX_STIFFENERS) {
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
    lines.push({ t, s0, s1, width: 0, stations: [], q: [], base: undefined as unknown as BeamResult });
  }
  if (truncated) warn('stiffeners-truncated', 'danger', b.id, `${b.name}: more than ${MAX_STIFFENERS} stiffeners at this spacing; only the first ${MAX_STIFFENERS} are checked (is the spacing in the right unit?)`);
  if (zeroSpan > 0) warn('stiffener-zero-span', 'warning', b.id, `${b.name}: ${zeroSpan} stiffener line${zeroSpan > 1 ? 's have' : ' has'} no span inside the plate; not checked`);
  if (lines.length === 0) {
    const note = 'no stiffener line with a span falls inside the plate at this spacing and first offset: no stiffener check';
    warn('stiffener-none', 'danger', b.id, `${b.name}: ${note}`);
    return empty('none-inside', note);
  }
  // tributary widths: half way to the neighbours, or to the plate edge
  for (let i = 0; i < lines.length; i++) {
    const lo = i === 0 ? (tMin + lines[0].t) / 2 : (lines[i - 1].t + lines[i].t) / 2;
    const hi = i === lines.length - 1 ? (lines[i].t + tMax) / 2 : (lines[i].t + lines[i + 1].t) / 2;
    const L = lines[i];
    L.width = hi - lo;
    const v0 = L.t * pv;
    const stations = [L.s0, L.s1];
    if (dv !== 0) {
      for (const c of cuts) {
        const s = (c - v0) / dv;
        if (s > L.s0 && s < L.s1) stations.push(s);
      }
    }
    stations.sort((x, y) => x - y);
    L.stations = stations;
    L.q = stations.map((s) => L.width * evalProfile(net, fr.e0 + fr.k * (v0 + s * dv)));
    L.base = solveBeam(stations, L.q, st.endFixity);
  }
  const nL = lines.length;
  const edgeStrips =
    stripForce(plate, net, cuts, pu, pv, tMin - 1, (tMin + lines[0].t) / 2) + stripForce(plate, net, cuts, pu, pv, (lines[nL - 1].t + tMax) / 2, tMax + 1);

  // shores: where each bears, and its share to each line
  const shores = b.shores ?? [];
  const onTol = ON_STIFFENER_FRACTION * st.spacingM;
  interface Bearing { bearsOn: ShoreResult['bearsOn']; parts: { line: number; f: number; x: number }[]; edgeF: number; sigma: number }
  const bearings: Bearing[] = shores.map((sh) => {
    const [u, v] = toPlate(plate, sh.position);
    const t = u * pu + v * pv, s = u * du + v * dv;
    const sigma = sh.side === 'B' ? 1 : -1;
    const within = (k: number) => s > lines[k].s0 && s < lines[k].s1;
    let nearest = -1;
    for (let k = 0; k < nL; k++) if (Math.abs(lines[k].t - t) <= onTol && (nearest < 0 || Math.abs(lines[k].t - t) < Math.abs(lines[nearest].t - t))) nearest = k;
    if (nearest >= 0 && within(nearest)) return { bearsOn: 'stiffener', parts: [{ line: nearest, f: 1, x: s - lines[nearest].s0 }], edgeF: 0, sigma };
    let left = -1, right = -1;
    for (let k = 0; k < nL; k++) {
      if (lines[k].t <= t) left = k;
      else if (right < 0) right = k;
    }
    const tl = left >= 0 ? lines[left].t : tMin, tr = right >= 0 ? lines[right].t : tMax;
    const gap = tr - tl;
    const c = gap > 0 ? Math.min(1, Math.max(0, (t - tl) / gap)) : 0;
    const parts: Bearing['parts'] = [];
    let edgeF = 0;
    if (left >= 0 && within(left)) parts.push({ line: left, f: 1 - c, x: s - lines[left].s0 });
    else edgeF += 1 - c;
    if (right >= 0 && within(right)) parts.push({ line: right, f: c, x: s - lines[right].s0 });
    else edgeF += c;
    const live = parts.filter((p) => p.f > 1e-9);
    return { bearsOn: live.length > 0 ? 'panel' : 'edge', parts: live, edgeF, sigma };
  });

  // force method: unknown reactions of the shores in contact
  const active = shores.map((_, j) => bearings[j].parts.length > 0);
  let R = shores.map(() => 0);
  const defl = new Map<string, number>();
  const w0 = (k: number, x: number): number => {
    const key = `${k}:${x}`;
    let v = defl.get(key);
    if (v === undefined) defl.set(key, (v = distributedDeflection(lines[k], st.endFixity, x)));
    return v;
  };
  for (let pass = 0; pass <= shores.length; pass++) {
    const idx = active.map((a, j) => (a ? j : -1)).filter((j) => j >= 0);
    R = shores.map(() => 0);
    if (idx.length === 0) break;
    const A = idx.map((i) =>
      idx.map((j) => {
        let a = 0;
        for (const pi of bearings[i].parts) for (const pj of bearings[j].parts) {
          if (pi.line !== pj.line) continue;
          const L = lines[pi.line].s1 - lines[pi.line].s0;
          a += pi.f * pj.f * pointDeflection(L, st.endFixity, pj.x, pi.x);
        }
        return bearings[i].sigma * bearings[j].sigma * a;
      }),
    );
    const rhs = idx.map((i) => bearings[i].sigma * bearings[i].parts.reduce((acc, p) => acc + p.f * w0(p.line, p.x), 0));
    const sol = solveDense(A, rhs);
    if (!sol) {
      // two shores where one would do (same point): the later one is left out
      active[idx[idx.length - 1]] = false;
      warn('shore-redundant', 'warning', shores[idx[idx.length - 1]].id, `${b.name}: a shore stands where another already holds the plate; it is taken as carrying nothing`);
      continue;
    }
    let worst = -1;
    sol.forEach((r, n) => {
      R[idx[n]] = r;
      if (r < 0 && (worst < 0 || r < sol[worst])) worst = n;
    });
    if (worst < 0) break;
    active[idx[worst]] = false;
  }
  R = R.map((r) => Math.max(0, r));

  // final stiffener beams with the shore reactions as point forces
  const items: StiffenerItem[] = [];
  let best = -1, bestU = 0;
  for (let k = 0; k < nL; k++) {
    const L = lines[k];
    const points: { atM: number; forceN: number }[] = [];
    shores.forEach((_, j) => {
      for (const p of bearings[j].parts) if (p.line === k && R[j] > 0) points.push({ atM: p.x, forceN: -bearings[j].sigma * p.f * R[j] });
    });
    const r = points.length > 0 ? solveBeam(L.stations, L.q, st.endFixity, points) : L.base;
    const required = Math.abs(r.maxMomentNm) / st.allowableStressPa;
    const u = required / st.sectionModulusM3;
    items.push({
      ...r,
      offsetM: L.t - tMin,
      tributaryWidthM: L.width,
      shoreForcesN: points.reduce((a, p) => a - p.forceN, 0),
      requiredModulusM3: required,
      utilisation: u,
    });
    if (best < 0 || u > bestU) {
      best = k;
      bestU = u;
    }
  }
  if (bestU > 1) warn('stiffener-overstressed', 'danger', b.id, `${b.name}: stiffener bending at ${(100 * bestU).toFixed(0)} % of allowable`);
  const edgeLever = shores.reduce((a, _, j) => a + bearings[j].sigma * bearings[j].edgeF * R[j], 0);
  const shoreResults = shores.map((sh, j) => {
    const bg = bearings[j];
    if (bg.bearsOn === 'edge') warn('shore-on-edge', 'info', sh.id, `${b.name}: a shore bears where the plate is held by its edge or a stiffener's end; in this model it carries nothing`);
    return shoreResult(b, sh, R[j], bg.bearsOn, null, warn);
  });
  return {
    stiffeners: {
      endFixity: st.endFixity,
      spacingM: st.spacingM,
      items,
      governingIndex: best,
      maxUtilisation: bestU,
      status: 'ok',
      note: null,
      edgeLoadN: edgeStrips - edgeLever,
      offsetFromEdge: edgeWords({ x: pu * fr.u[0] + pv * fr.v[0], y: pu * fr.u[1] + pv * fr.v[1], z: pu * fr.u[2] + pv * fr.v[2] }),
      truncated,
      model: STIFFENED_MODEL_WORDS,
    },
    shores: shoreResults,
    layout: { pu, pv, du, dv, tMin, tMax, lines: lines.map((l) => ({ t: l.t, s0: l.s0, s1: l.s1 })) },
  };
}
