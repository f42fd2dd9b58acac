/**
 * Loads on one flat plate. The net pressure is linear in elevation between the level planes of
 * either side, and elevation is linear in the plate's v axis (steepest ascent in the plate), so the
 * plate is cut into strips at every level plane and at every zero of the net pressure; over each
 * strip p = α + β v exactly and ∫p dA = αA + βS_v, ∫p u dA = αS_u + βS_uv, ∫p v dA = αS_v + βS_vv
 * (centre of pressure as in White, Fluid Mechanics, §2.5). No sampling anywhere.
 */
import {
  addMoments,
  circleStripMoments,
  circleWidthAtV,
  polygonMoments,
  polygonWidthAtV,
  splitAtV,
  zeroMoments,
  type Moments,
} from './plane-integrals';
import type { PressureProfile } from './profile';
import { add, cross, dot, norm, scale, sub, unit, type V3 } from './vec';

export type Shape2D = { kind: 'polygon'; pts: number[] } | { kind: 'circle'; uc: number; vc: number; r: number };
export interface SignedShape {
  shape: Shape2D;
  sign: 1 | -1;
}

/** Plate axes: origin, unit normal n (towards side B), u across, v up the steepest slope (u × v = n). */
export interface PlateFrame {
  origin: V3;
  n: V3;
  u: V3;
  v: V3;
  /** d(elevation)/dv: sine of the plate's slope from horizontal; 0 for a level plate. */
  k: number;
  /** Elevation of the origin, m. */
  e0: number;
}

export interface FlatPlate {
  frame: PlateFrame;
  region: SignedShape[];
  vMin: number;
  vMax: number;
  /** Largest distance of an input vertex from the plate's plane, m. */
  planarityErrorM: number;
}

const EPS_LEVEL = 1e-12;

/** Plate axes for a plane with unit normal n through origin, given earth-up. */
export function plateFrame(origin: V3, n: V3, up: V3): PlateFrame {
  const un = dot(up, n);
  let h: V3 = sub(up, scale(n, un));
  let k = norm(h);
  if (k < EPS_LEVEL) {
    // Level plate: v follows the ship's x axis (or y if the plate is normal to x).
    k = 0;
    const x: V3 = [1, 0, 0];
    h = sub(x, scale(n, dot(x, n)));
    if (norm(h) < 1e-6) h = sub([0, 1, 0], scale(n, n[1]));
  }
  const v = unit(h);
  const u = cross(v, n);
  return { origin, n, u, v, k, e0: dot(up, origin) };
}

/** Newell's normal (unnormalised, length = 2 × area) of a 3D polygon. */
export function newellNormal(pts: readonly V3[]): V3 {
  let x = 0, y = 0, z = 0;
  for (let i = 0; i < pts.length; i++) {
    const a = pts[i], b = pts[(i + 1) % pts.length];
    x += (a[1] - b[1]) * (a[2] + b[2]);
    y += (a[2] - b[2]) * (a[0] + b[0]);
    z += (a[0] - b[0]) * (a[1] + b[1]);
  }
  return [x, y, z];
}

function projectPts(frame: PlateFrame, pts: readonly V3[]): number[] {
  const out: number[] = [];
  for (const p of pts) {
    const d = sub(p, frame.origin);
    out.push(dot(d, frame.u), dot(d, frame.v));
  }
  return out;
}

function shapeVRange(s: Shape2D): [number, number] {
  if (s.kind === 'circle') return [s.vc - s.r, s.vc + s.r];
  let lo = Infinity, hi = -Infinity;
  for (let i = 1; i < s.pts.length; i += 2) {
    if (s.pts[i] < lo) lo = s.pts[i];
    if (s.pts[i] > hi) hi = s.pts[i];
  }
  return [lo, hi];
}

/** A flat polygonal plate from its 3D vertices. */
export function polygonPlate(pts: readonly V3[], up: V3): FlatPlate {
  const nn = newellNormal(pts);
  const n = unit(nn);
  let c: V3 = [0, 0, 0];
  for (const p of pts) c = add(c, p);
  c = scale(c, 1 / pts.length);
  const frame = plateFrame(c, n, up);
  let planarityErrorM = 0;
  for (const p of pts) planarityErrorM = Math.max(planarityErrorM, Math.abs(dot(sub(p, c), n)));
  const shape: Shape2D = { kind: 'polygon', pts: projectPts(frame, pts) };
  const [vMin, vMax] = shapeVRange(shape);
  return { frame, region: [{ shape, sign: 1 }], vMin, vMax, planarityErrorM };
}

/** A flat circular plate. */
export function circlePlate(centre: V3, normal: V3, r: number, up: V3): FlatPlate {
  const frame = plateFrame(centre, unit(normal), up);
  return { frame, region: [{ shape: { kind: 'circle', uc: 0, vc: 0, r }, sign: 1 }], vMin: -r, vMax: r, planarityErrorM: 0 };
}

/** Expresses a child plate's outline in the parent's axes, or explains why it cannot be cut out exactly. */
export function childAsHole(parent: FlatPlate, child: FlatPlate, childPts: readonly V3[] | null, tol: number): Shape2D | string {
  const pf = parent.frame;
  if (Math.abs(Math.abs(dot(pf.n, child.frame.n)) - 1) > 1e-6) return 'is not parallel to its parent';
  if (Math.abs(dot(sub(child.frame.origin, pf.origin), pf.n)) > tol) return 'does not lie in its parent\'s plane';
  const outer = parent.region[0].shape;
  let hole: Shape2D;
  const testPts: number[] = [];
  if (childPts) {
    let pts = projectPts(pf, childPts);
    if (polygonMoments(pts).a < 0) {
      const rev: number[] = [];
      for (let i = pts.length - 2; i >= 0; i -= 2) rev.push(pts[i], pts[i + 1]);
      pts = rev;
    }
    hole = { kind: 'polygon', pts };
    testPts.push(...pts);
  } else {
    const c = child.region[0].shape;
    if (c.kind !== 'circle') return 'has an unsupported outline';
    const d = sub(child.frame.origin, pf.origin);
    const uc = dot(d, pf.u), vc = dot(d, pf.v);
    hole = { kind: 'circle', uc, vc, r: c.r };
    for (let i = 0; i < 16; i++) {
      const t = (i * Math.PI) / 8;
      testPts.push(uc + c.r * Math.cos(t), vc + c.r * Math.sin(t));
    }
  }
  for (let i = 0; i < testPts.length; i += 2) {
    if (!insideShape(outer, testPts[i], testPts[i + 1], tol)) return 'is not inside its parent\'s outline';
  }
  return hole;
}

function insideShape(s: Shape2D, x: number, y: number, tol: number): boolean {
  if (s.kind === 'circle') return Math.hypot(x - s.uc, y - s.vc) <= s.r + tol;
  const p = s.pts;
  let inside = false;
  for (let i = 0, j = p.length - 2; i < p.length; j = i, i += 2) {
    const xi = p[i], yi = p[i + 1], xj = p[j], yj = p[j + 1];
    // on an edge counts as inside
    const ex = xj - xi, ey = yj - yi;
    const len2 = ex * ex + ey * ey;
    if (len2 > 0) {
      const t = Math.max(0, Math.min(1, ((x - xi) * ex + (y - yi) * ey) / len2));
      if (Math.hypot(xi + t * ex - x, yi + t * ey - y) <= tol) return true;
    }
    if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside;
}

/** Moments of every strip of a region between consecutive cuts (cuts ascending, first = vMin, last = vMax). */
export function stripMoments(region: readonly SignedShape[], cuts: readonly number[]): Moments[] {
  const nStrips = cuts.length - 1;
  const out: Moments[] = [];
  for (let i = 0; i < nStrips; i++) out.push(zeroMoments());
  for (const { shape, sign } of region) {
    if (shape.kind === 'circle') {
      for (let i = 0; i < nStrips; i++) {
        const lo = Math.max(cuts[i], shape.vc - shape.r), hi = Math.min(cuts[i + 1], shape.vc + shape.r);
        if (hi > lo) addMoments(out[i], circleStripMoments(shape.uc, shape.vc, shape.r, lo, hi), sign);
      }
    } else {
      let rest: number[] = shape.pts;
      for (let i = 0; i < nStrips && rest.length > 0; i++) {
        if (i === nStrips - 1) {
          addMoments(out[i], polygonMoments(rest), sign);
        } else {
          const [below, above] = splitAtV(rest, cuts[i + 1]);
          if (below.length > 0) addMoments(out[i], polygonMoments(below), sign);
          rest = above;
        }
      }
    }
  }
  return out;
}

/** Net chord width of a region at v = c. */
export function regionWidthAtV(region: readonly SignedShape[], c: number): number {
  let w = 0;
  for (const { shape, sign } of region) {
    w += sign * (shape.kind === 'circle' ? circleWidthAtV(shape.vc, shape.r, c) : polygonWidthAtV(shape.pts, c));
  }
  return Math.max(0, w);
}

/** Midpoint u of the outer outline's chord at v = c (for reporting where a pressure acts). */
function chordMidU(s: Shape2D, c: number): number {
  if (s.kind === 'circle') return s.uc;
  const p = s.pts;
  let lo = Infinity, hi = -Infinity;
  for (let i = 0; i < p.length; i += 2) {
    const j = i + 2 < p.length ? i + 2 : 0;
    const y0 = p[i + 1], y1 = p[j + 1];
    if ((y0 <= c && y1 >= c) || (y1 <= c && y0 >= c)) {
      const x0 = p[i], x1 = p[j];
      const xs = y1 === y0 ? [x0, x1] : [x0 + ((c - y0) / (y1 - y0)) * (x1 - x0)];
      for (const x of xs) {
        if (x < lo) lo = x;
        if (x > hi) hi = x;
      }
    }
  }
  return lo <= hi ? (lo + hi) / 2 : 0;
}

/** Index of the profile interval containing elevation η. */
function intervalAt(p: PressureProfile, eta: number): number {
  let k = 0;
  while (k < p.breaks.length && eta >= p.breaks[k]) k++;
  return k;
}

export interface PartLoad {
  /** ∫p dA over the part, N (sign of the part). */
  forceN: number;
  areaM2: number;
  /** Centre of pressure of the part in plate axes, or null if the part carries nothing. */
  cop: [number, number] | null;
}

export interface PlateIntegration {
  areaM2: number;
  /** Area centroid in plate axes. */
  centroidU: number;
  centroidV: number;
  /** Force of each side's own pressure, N (pushing on the plate from that side). */
  sideForceN: [number, number];
  sideWettedM2: [number, number];
  sidePeakPa: [number, number];
  /** ∫(p_A − p_B) dA, N: positive pushes the plate towards side B. */
  netForceN: number;
  /** ∫p u dA and ∫p v dA of the net pressure, N·m. */
  netMomentU: number;
  netMomentV: number;
  positive: PartLoad;
  negative: PartLoad;
  peakMax: { pressurePa: number; u: number; v: number };
  peakMin: { pressurePa: number; u: number; v: number };
  /** Cuts in v where strips change (level planes and net zero crossings), ascending, within the plate. */
  cuts: number[];
}

/** v positions of a profile's breakpoints inside (vMin, vMax). */
function profileCutsV(p: PressureProfile, frame: PlateFrame, vMin: number, vMax: number, into: number[]): void {
  if (frame.k === 0) return;
  for (const e of p.breaks) {
    const v = (e - frame.e0) / frame.k;
    if (v > vMin && v < vMax) into.push(v);
  }
}

function sortedUnique(xs: number[], span: number): number[] {
  xs.sort((a, b) => a - b);
  const out: number[] = [];
  const tol = 1e-12 * Math.max(1, span);
  for (const x of xs) if (out.length === 0 || x - out[out.length - 1] > tol) out.push(x);
  return out;
}

/** Exact integration of both sides' and the net pressure over a plate. */
export function integratePlate(plate: FlatPlate, pa: PressureProfile, pb: PressureProfile, net: PressureProfile): PlateIntegration {
  const { frame, vMin, vMax } = plate;
  const { k, e0 } = frame;
  const cutList: number[] = [];
  profileCutsV(net, frame, vMin, vMax, cutList);
  // zero crossings of the net pressure inside each net interval
  if (k > 0) {
    for (let j = 0; j < net.a.length; j++) {
      const b = net.b[j];
      if (b === 0) continue;
      const e = -net.a[j] / b;
      const lo = j === 0 ? -Infinity : net.breaks[j - 1];
      const hi = j === net.breaks.length ? Infinity : net.breaks[j];
      if (e > lo && e < hi) {
        const v = (e - e0) / k;
        if (v > vMin && v < vMax) cutList.push(v);
      }
    }
  }
  const inner = sortedUnique(cutList, vMax - vMin);
  const cuts = [vMin, ...inner, vMax];
  const strips = stripMoments(plate.region, cuts);

  let area = 0, areaSu = 0, areaSv = 0;
  const sideForce: [number, number] = [0, 0];
  const wet: [number, number] = [0, 0];
  let F = 0, Mu = 0, Mv = 0;
  let Fp = 0, Mup = 0, Mvp = 0, Ap = 0;
  let Fn = 0, Mun = 0, Mvn = 0, An = 0;
  for (let i = 0; i < strips.length; i++) {
    const m = strips[i];
    if (m.a === 0) continue;
    area += m.a;
    areaSu += m.su;
    areaSv += m.sv;
    const eMid = e0 + k * 0.5 * (cuts[i] + cuts[i + 1]);
    const ja = intervalAt(pa, eMid), jb = intervalAt(pb, eMid), jn = intervalAt(net, eMid);
    // p = a + b(e0 + k v) = α + β v
    const alphaA = pa.a[ja] + pa.b[ja] * e0, betaA = pa.b[ja] * k;
    const alphaB = pb.a[jb] + pb.b[jb] * e0, betaB = pb.b[jb] * k;
    sideForce[0] += alphaA * m.a + betaA * m.sv;
    sideForce[1] += alphaB * m.a + betaB * m.sv;
    if (eMid < pa.liquidTop) wet[0] += m.a;
    if (eMid < pb.liquidTop) wet[1] += m.a;
    const alpha = net.a[jn] + net.b[jn] * e0, beta = net.b[jn] * k;
    const f = alpha * m.a + beta * m.sv;
    const mu = alpha * m.su + beta * m.suv;
    const mv = alpha * m.sv + beta * m.svv;
    F += f;
    Mu += mu;
    Mv += mv;
    const pMid = alpha + beta * 0.5 * (cuts[i] + cuts[i + 1]);
    if (pMid > 0) {
      Fp += f; Mup += mu; Mvp += mv; Ap += m.a;
    } else if (pMid < 0) {
      Fn += f; Mun += mu; Mvn += mv; An += m.a;
    }
  }

  // Extremes of a piecewise-linear function of v lie at the cuts or the plate's ends.
  const outer = plate.region[0].shape;
  const peakMax = { pressurePa: -Infinity, u: 0, v: 0 };
  const peakMin = { pressurePa: Infinity, u: 0, v: 0 };
  const sidePeak: [number, number] = [-Infinity, -Infinity];
  for (const v of cuts) {
    const e = e0 + k * v;
    const p = evalProfile(net, e);
    if (p > peakMax.pressurePa) Object.assign(peakMax, { pressurePa: p, v });
    if (p < peakMin.pressurePa) Object.assign(peakMin, { pressurePa: p, v });
    sidePeak[0] = Math.max(sidePeak[0], evalProfile(pa, e));
    sidePeak[1] = Math.max(sidePeak[1], evalProfile(pb, e));
  }
  peakMax.u = chordMidU(outer, peakMax.v);
  peakMin.u = chordMidU(outer, peakMin.v);

  return {
    areaM2: area,
    centroidU: area > 0 ? areaSu / area : 0,
    centroidV: area > 0 ? areaSv / area : 0,
    sideForceN: sideForce,
    sideWettedM2: wet,
    sidePeakPa: sidePeak,
    netForceN: F,
    netMomentU: Mu,
    netMomentV: Mv,
    positive: { forceN: Fp, areaM2: Ap, cop: Fp !== 0 ? [Mup / Fp, Mvp / Fp] : null },
    negative: { forceN: Fn, areaM2: An, cop: Fn !== 0 ? [Mun / Fn, Mvn / Fn] : null },
    peakMax,
    peakMin,
    cuts,
  };
}

/** Pressure of a profile at elevation η. */
export function evalProfile(p: PressureProfile, eta: number): number {
  const j = intervalAt(p, eta);
  return p.a[j] + p.b[j] * eta;
}

/** Plate-axes point (u, v) to ship axes. */
export function plateToShip(frame: PlateFrame, u: number, v: number): V3 {
  const o = frame.origin;
  return [o[0] + u * frame.u[0] + v * frame.v[0], o[1] + u * frame.u[1] + v * frame.v[1], o[2] + u * frame.u[2] + v * frame.v[2]];
}

export interface LoadDiagramPoint {
  /** Distance up the plate from its lowest edge, along the steepest slope, m. */
  sM: number;
  pressurePa: number;
  widthM: number;
}

/**
 * Load diagram along the plate's v axis: the net pressure and the plate's width at each kink of
 * either (exact between points for polygons, where both are linear), plus even samples for circles.
 */
export function loadDiagram(plate: FlatPlate, net: PressureProfile, cuts: readonly number[]): LoadDiagramPoint[] {
  const { vMin, vMax, frame } = plate;
  const span = vMax - vMin;
  const vs: number[] = cuts.slice();
  let hasCircle = false;
  for (const { shape } of plate.region) {
    if (shape.kind === 'polygon') {
      for (let i = 1; i < shape.pts.length; i += 2) vs.push(shape.pts[i]);
    } else {
      hasCircle = true;
      vs.push(shape.vc - shape.r, shape.vc + shape.r);
    }
  }
  if (hasCircle) for (let i = 1; i < 32; i++) vs.push(vMin + (span * i) / 32);
  const inRange: number[] = [];
  for (const v of vs) if (v >= vMin && v <= vMax) inRange.push(v);
  const pts = sortedUnique(inRange, span);
  const eps = 1e-9 * Math.max(span, 1e-9);
  const out: LoadDiagramPoint[] = new Array(pts.length);
  for (let i = 0; i < pts.length; i++) {
    const v = pts[i];
    const w = regionWidthAtV(plate.region, v >= vMax ? v - eps : v <= vMin ? v + eps : v);
    out[i] = { sM: v - vMin, pressurePa: evalProfile(net, frame.e0 + frame.k * v), widthM: w };
  }
  return out;
}
