/**
 * Loads on one flat plate. The net pressure is linear in elevation between the level planes of
 * either side, and elevation is linear in the plate's v axis (steepest ascent in the plate), so the
 * plate is cut into strips at every level plane and at every zero of the net pressure; over each
 * strip p = α + β v exactly and ∫p dA = αA + βS_v, ∫p u dA = αS_u + βS_uv, ∫p v dA = αS_v + βS_vv
 * (centre of pressure as in White, Fluid Mechanics, §2.5). No sampling anywhere.
 */
import {
  circleStripMomentsInto,
  circleWidthAtV,
  clipHalfPlaneInto,
  polygonMoments,
  polygonMomentsInto,
  polygonWidthAtV,
  splitAtVInto,
} from './plane-integrals';
import type { PressureProfile } from './profile';
import { dot, sub, unit, type V3 } from './vec';

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
export function plateFrame(origin: V3, n: V3, up: V3, out?: PlateFrame): PlateFrame {
  const un = up[0] * n[0] + up[1] * n[1] + up[2] * n[2];
  const hx = up[0] - n[0] * un, hy = up[1] - n[1] * un, hz = up[2] - n[2] * un;
  let k = Math.sqrt(hx * hx + hy * hy + hz * hz);
  let v: V3;
  if (k < EPS_LEVEL) {
    // Level plate: v follows the ship's x axis (or y if the plate is normal to x).
    // (h = x − n (x·n), or y − n (y·n); the arithmetic of sub/scale/unit, without the tuples)
    k = 0;
    let h0 = 1 - n[0] * n[0], h1 = 0 - n[1] * n[0], h2 = 0 - n[2] * n[0];
    if (Math.sqrt(h0 * h0 + h1 * h1 + h2 * h2) < 1e-6) {
      h0 = 0 - n[0] * n[1];
      h1 = 1 - n[1] * n[1];
      h2 = 0 - n[2] * n[1];
    }
    const hl = Math.sqrt(h0 * h0 + h1 * h1 + h2 * h2);
    v = out ? out.v : [0, 0, 0];
    if (hl > 0) set3(v, h0 / hl, h1 / hl, h2 / hl);
    else set3(v, 0, 0, 0);
  } else if (out) {
    // written straight into the scratch frame (its v is overwritten with the same numbers below)
    v = set3(out.v, hx / k, hy / k, hz / k);
  } else {
    v = [hx / k, hy / k, hz / k];
  }
  const ux = v[1] * n[2] - v[2] * n[1], uy = v[2] * n[0] - v[0] * n[2], uz = v[0] * n[1] - v[1] * n[0];
  const e0 = up[0] * origin[0] + up[1] * origin[1] + up[2] * origin[2];
  if (!out) return { origin, n, u: [ux, uy, uz], v, k, e0 };
  set3(out.origin, origin[0], origin[1], origin[2]);
  set3(out.n, n[0], n[1], n[2]);
  set3(out.u, ux, uy, uz);
  set3(out.v, v[0], v[1], v[2]);
  out.k = k;
  out.e0 = e0;
  return out;
}

function set3(a: V3, x: number, y: number, z: number): V3 {
  a[0] = x;
  a[1] = y;
  a[2] = z;
  return a;
}

/**
 * A plate to be built over and over: polygonPlateXYZ and circlePlate write into one instead of
 * allocating, for plates used once and dropped (valid until the next build into it).
 */
export function newScratchPlate(kind: 'polygon' | 'circle'): FlatPlate {
  const frame: PlateFrame = { origin: [0, 0, 0], n: [0, 0, 0], u: [0, 0, 0], v: [0, 0, 0], k: 0, e0: 0 };
  const shape: Shape2D = kind === 'polygon' ? { kind, pts: [] } : { kind, uc: 0, vc: 0, r: 0 };
  return { frame, region: [{ shape, sign: 1 }], vMin: 0, vMax: 0, planarityErrorM: 0 };
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

/** A flat polygonal plate from its 3D vertices. */
export function polygonPlate(pts: readonly V3[], up: V3): FlatPlate {
  const xyz = new Array<number>(3 * pts.length);
  for (let i = 0; i < pts.length; i++) {
    xyz[3 * i] = pts[i][0];
    xyz[3 * i + 1] = pts[i][1];
    xyz[3 * i + 2] = pts[i][2];
  }
  return polygonPlateXYZ(xyz, pts.length, up);
}

/**
 * polygonPlate from a flat list of `count` vertices [x0, y0, z0, x1, ...] (ship axes, m): Newell's
 * normal, the vertex mean as origin, and the outline projected on the plate axes.
 */
export function polygonPlateXYZ(xyz: ArrayLike<number>, count: number, up: V3, out?: FlatPlate): FlatPlate {
  let nx = 0, ny = 0, nz = 0;
  let cx = 0, cy = 0, cz = 0;
  for (let i = 0; i < count; i++) {
    const a = 3 * i, b = 3 * ((i + 1) % count);
    nx += (xyz[a + 1] - xyz[b + 1]) * (xyz[a + 2] + xyz[b + 2]);
    ny += (xyz[a + 2] - xyz[b + 2]) * (xyz[a] + xyz[b]);
    nz += (xyz[a] - xyz[b]) * (xyz[a + 1] + xyz[b + 1]);
    cx += xyz[a];
    cy += xyz[a + 1];
    cz += xyz[a + 2];
  }
  const len = Math.sqrt(nx * nx + ny * ny + nz * nz);
  const inv = 1 / count;
  const nl = len > 0 ? 1 / len : 0;
  const n: V3 = out ? set3(scratchN, nx * nl, ny * nl, nz * nl) : [nx * nl, ny * nl, nz * nl];
  const c: V3 = out ? set3(scratchC, cx * inv, cy * inv, cz * inv) : [cx * inv, cy * inv, cz * inv];
  const frame = plateFrame(c, n, up, out?.frame);
  const U = frame.u, W = frame.v;
  let planarityErrorM = 0;
  let vMin = Infinity, vMax = -Infinity;
  const outShape = out?.region[0].shape;
  const pts2 = outShape?.kind === 'polygon' ? outShape.pts : new Array<number>(2 * count);
  if (pts2.length !== 2 * count) pts2.length = 2 * count;
  for (let i = 0; i < count; i++) {
    const dx = xyz[3 * i] - c[0], dy = xyz[3 * i + 1] - c[1], dz = xyz[3 * i + 2] - c[2];
    planarityErrorM = Math.max(planarityErrorM, Math.abs(dx * n[0] + dy * n[1] + dz * n[2]));
    const v = dx * W[0] + dy * W[1] + dz * W[2];
    pts2[2 * i] = dx * U[0] + dy * U[1] + dz * U[2];
    pts2[2 * i + 1] = v;
    if (v < vMin) vMin = v;
    if (v > vMax) vMax = v;
  }
  if (!out) return { frame, region: [{ shape: { kind: 'polygon', pts: pts2 }, sign: 1 }], vMin, vMax, planarityErrorM };
  out.vMin = vMin;
  out.vMax = vMax;
  out.planarityErrorM = planarityErrorM;
  return out;
}
const scratchN: V3 = [0, 0, 0];
const scratchC: V3 = [0, 0, 0];

/** A flat circular plate. */
export function circlePlate(centre: V3, normal: V3, r: number, up: V3, out?: FlatPlate): FlatPlate {
  const frame = plateFrame(centre, unit(normal), up, out?.frame);
  const shape = out?.region[0].shape;
  if (out && shape?.kind === 'circle') {
    shape.uc = 0;
    shape.vc = 0;
    shape.r = r;
    out.vMin = -r;
    out.vMax = r;
    out.planarityErrorM = 0;
    return out;
  }
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

// Scratch space for the hot loops (the engine is synchronous and never re-entered, so module-level
// buffers are safe); each grows on demand and is never shrunk.
let stripBuf: Float64Array = new Float64Array(5 * 16);
let cutBuf: Float64Array = new Float64Array(32);
let splitBelow: Float64Array = new Float64Array(64);
let splitAboveA: Float64Array = new Float64Array(64);
let splitAboveB: Float64Array = new Float64Array(64);
const splitLens = new Int32Array(2);

function grown(buf: Float64Array, need: number): Float64Array {
  if (buf.length >= need) return buf;
  let n = buf.length;
  while (n < need) n *= 2;
  return new Float64Array(n);
}

/**
 * Moments of every strip of a region between consecutive cuts (cuts ascending, first = vMin,
 * last = vMax), written to out[5i .. 5i+5) as a, su, sv, suv, svv. Returns out, which is the
 * shared strip buffer unless one is given; it is valid until the next call.
 */
export function stripMomentsInto(region: readonly SignedShape[], cuts: readonly number[], out?: Float64Array): Float64Array {
  const nStrips = cuts.length - 1;
  let acc = out;
  if (!acc) {
    stripBuf = grown(stripBuf, 5 * nStrips);
    acc = stripBuf;
  }
  acc.fill(0, 0, 5 * nStrips);
  for (let r = 0; r < region.length; r++) {
    const shape = region[r].shape, sign = region[r].sign;
    if (shape.kind === 'circle') {
      for (let i = 0; i < nStrips; i++) {
        const lo = Math.max(cuts[i], shape.vc - shape.r), hi = Math.min(cuts[i + 1], shape.vc + shape.r);
        if (hi > lo) circleStripMomentsInto(shape.uc, shape.vc, shape.r, lo, hi, acc, 5 * i, sign);
      }
    } else {
      addPolygonStrips(shape.pts, shape.pts.length, sign, cuts, acc);
    }
  }
  return acc;
}

/**
 * Adds sign × the moments of each strip of the polygon pts[0..len) between consecutive cuts into
 * acc[5i .. 5i+5) (a, su, sv, suv, svv), as stripMomentsInto does for each polygon of a region.
 */
export function addPolygonStrips(pts: ArrayLike<number>, len: number, sign: number, cuts: readonly number[], acc: Float64Array): void {
  const nStrips = cuts.length - 1;
  let rest: ArrayLike<number> = pts;
  let restLen = len;
  let useA = true;
  for (let i = 0; i < nStrips && restLen > 0; i++) {
    if (i === nStrips - 1) {
      polygonMomentsInto(rest, restLen, acc, 5 * i, sign);
    } else {
      const need = 2 * restLen + 4;
      splitBelow = grown(splitBelow, need);
      let above: Float64Array;
      if (useA) above = splitAboveA = grown(splitAboveA, need);
      else above = splitAboveB = grown(splitAboveB, need);
      splitAtVInto(rest, restLen, cuts[i + 1], splitBelow, above, splitLens);
      if (splitLens[0] > 0) polygonMomentsInto(splitBelow, splitLens[0], acc, 5 * i, sign);
      rest = above;
      restLen = splitLens[1];
      useA = !useA;
    }
  }
}

/** Region strip moments for the callers that clip a region first (zeroed by zeroRegionStrips). */
let regionStrips: Float64Array = new Float64Array(5 * 16);

/** A zeroed strip-moment accumulator for the plate's cuts, valid until the next call. */
export function zeroRegionStrips(cuts: readonly number[]): Float64Array {
  const n = 5 * (cuts.length - 1);
  regionStrips = grown(regionStrips, n);
  regionStrips.fill(0, 0, n);
  return regionStrips;
}

/** ∫p dA of the net pressure over strip moments accumulated for the plate's cuts, N (as regionNetForce). */
export function stripsNetForce(plate: FlatPlate, net: PressureProfile, cuts: readonly number[], strips: Float64Array): number {
  const fr = plate.frame;
  let force = 0;
  for (let k = 0; k + 1 < cuts.length; k++) {
    const ma = strips[5 * k], msv = strips[5 * k + 2];
    if (ma === 0) continue;
    const jn = intervalAt(net, fr.e0 + fr.k * 0.5 * (cuts[k] + cuts[k + 1]));
    force += (net.a[jn] + net.b[jn] * fr.e0) * ma + net.b[jn] * fr.k * msv;
  }
  return force;
}

/** The area of strip moments accumulated for the plate's cuts, m² (as regionNetForce). */
export function stripsArea(cuts: readonly number[], strips: Float64Array): number {
  let area = 0;
  for (let k = 0; k + 1 < cuts.length; k++) {
    const ma = strips[5 * k];
    if (ma === 0) continue;
    area += ma;
  }
  return area;
}

/** Net chord width of a region at v = c. */
export function regionWidthAtV(region: readonly SignedShape[], c: number): number {
  let w = 0;
  for (let r = 0; r < region.length; r++) {
    const shape = region[r].shape;
    w += region[r].sign * (shape.kind === 'circle' ? circleWidthAtV(shape.vc, shape.r, c) : polygonWidthAtV(shape.pts, c));
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
      if (y1 === y0) {
        if (x0 < lo) lo = x0;
        if (x0 > hi) hi = x0;
        if (x1 < lo) lo = x1;
        if (x1 > hi) hi = x1;
      } else {
        const x = x0 + ((c - y0) / (y1 - y0)) * (x1 - x0);
        if (x < lo) lo = x;
        if (x > hi) hi = x;
      }
    }
  }
  return lo <= hi ? (lo + hi) / 2 : 0;
}

/** Index of the profile interval containing elevation η. */
function intervalAt(p: PressureProfile, eta: number): number {
  const br = p.breaks;
  let k = 0;
  while (k < br.length && eta >= br[k]) k++;
  return k;
}

export interface PartLoad {
  /** ∫p dA over the part, N (sign of the part). */
  forceN: number;
  areaM2: number;
  /** Centre of pressure of the part in plate axes (NaN when the part carries nothing). */
  copU: number;
  copV: number;
}

export interface PlateIntegration {
  areaM2: number;
  /** Area centroid in plate axes. */
  centroidU: number;
  centroidV: number;
  /** Force of each side's own pressure, N (pushing on the plate from that side). */
  sideForceA: number;
  sideForceB: number;
  sideWettedA: number;
  sideWettedB: number;
  sidePeakA: number;
  sidePeakB: number;
  /** ∫(p_A − p_B) dA, N: positive pushes the plate towards side B. */
  netForceN: number;
  /** ∫p u dA and ∫p v dA of the net pressure, N·m. */
  netMomentU: number;
  netMomentV: number;
  positive: PartLoad;
  negative: PartLoad;
  /** Largest and smallest net pressure and where (plate axes). */
  peakMaxPa: number;
  peakMaxU: number;
  peakMaxV: number;
  peakMinPa: number;
  peakMinU: number;
  peakMinV: number;
  /** Cuts in v where strips change (level planes and net zero crossings), ascending, within the plate. */
  cuts: number[];
}

/** Sorts xs[0..n) ascending in place (insertion sort: the lists are a handful of numbers). */
export function sortSmall(xs: Float64Array, n: number): void {
  for (let i = 1; i < n; i++) {
    const x = xs[i];
    let j = i - 1;
    while (j >= 0 && xs[j] > x) {
      xs[j + 1] = xs[j];
      j--;
    }
    xs[j + 1] = x;
  }
}

/**
 * Sorts xs[0..n) and drops values within 1e-12 × max(1, span) of the previous kept one, in place;
 * returns the count kept.
 */
function sortUniqueInPlace(xs: Float64Array, n: number, span: number): number {
  sortSmall(xs, n);
  const tol = 1e-12 * Math.max(1, span);
  let m = 0;
  for (let i = 0; i < n; i++) {
    const x = xs[i];
    if (m === 0 || x - xs[m - 1] > tol) xs[m++] = x;
  }
  return m;
}

/** A blank PlateIntegration, for integratePlate to fill. */
export function newPlateIntegration(): PlateIntegration {
  return {
    areaM2: 0, centroidU: 0, centroidV: 0,
    sideForceA: 0, sideForceB: 0, sideWettedA: 0, sideWettedB: 0, sidePeakA: 0, sidePeakB: 0,
    netForceN: 0, netMomentU: 0, netMomentV: 0,
    positive: { forceN: 0, areaM2: 0, copU: 0, copV: 0 },
    negative: { forceN: 0, areaM2: 0, copU: 0, copV: 0 },
    peakMaxPa: 0, peakMaxU: 0, peakMaxV: 0, peakMinPa: 0, peakMinU: 0, peakMinV: 0,
    cuts: [],
  };
}

/**
 * Exact integration of both sides' and the net pressure over a plate, written into `out` (a fresh
 * record unless one is given to be overwritten, which saves allocation in the per-boundary loop).
 */
export function integratePlate(
  plate: FlatPlate,
  pa: PressureProfile,
  pb: PressureProfile,
  net: PressureProfile,
  out: PlateIntegration = newPlateIntegration(),
): PlateIntegration {
  const { frame, vMin, vMax } = plate;
  const { k, e0 } = frame;
  // cuts: the net profile's breakpoints and the zeros of the net pressure inside each net interval
  const nb = net.breaks.length;
  cutBuf = grown(cutBuf, 2 * nb + 2);
  let nc = 0;
  if (k !== 0) {
    for (let j = 0; j < nb; j++) {
      const v = (net.breaks[j] - e0) / k;
      if (v > vMin && v < vMax) cutBuf[nc++] = v;
    }
  }
  if (k > 0) {
    for (let j = 0; j < net.a.length; j++) {
      const b = net.b[j];
      if (b === 0) continue;
      const e = -net.a[j] / b;
      const lo = j === 0 ? -Infinity : net.breaks[j - 1];
      const hi = j === nb ? Infinity : net.breaks[j];
      if (e > lo && e < hi) {
        const v = (e - e0) / k;
        if (v > vMin && v < vMax) cutBuf[nc++] = v;
      }
    }
  }
  const nInner = sortUniqueInPlace(cutBuf, nc, vMax - vMin);
  // the cuts live in `out`, whose array is rewritten in place (a scratch integration reuses it:
  // no allocation per plate); the stiffener, shore and plating checks read them after this returns
  const nCuts = nInner + 2;
  const cuts = out.cuts;
  if (cuts.length > nCuts) cuts.length = nCuts;
  cuts[0] = vMin;
  for (let i = 0; i < nInner; i++) cuts[i + 1] = cutBuf[i];
  cuts[nCuts - 1] = vMax;
  const nStrips = nInner + 1;
  const m = stripMomentsInto(plate.region, cuts);

  let area = 0, areaSu = 0, areaSv = 0;
  let sideA = 0, sideB = 0, wetA = 0, wetB = 0;
  let F = 0, Mu = 0, Mv = 0;
  let Fp = 0, Mup = 0, Mvp = 0, Ap = 0;
  let Fn = 0, Mun = 0, Mvn = 0, An = 0;
  for (let i = 0; i < nStrips; i++) {
    const o = 5 * i;
    const ma = m[o], msu = m[o + 1], msv = m[o + 2], msuv = m[o + 3], msvv = m[o + 4];
    if (ma === 0) continue;
    area += ma;
    areaSu += msu;
    areaSv += msv;
    const eMid = e0 + k * 0.5 * (cuts[i] + cuts[i + 1]);
    const ja = intervalAt(pa, eMid), jb = intervalAt(pb, eMid), jn = intervalAt(net, eMid);
    // p = a + b(e0 + k v) = α + β v
    const alphaA = pa.a[ja] + pa.b[ja] * e0, betaA = pa.b[ja] * k;
    const alphaB = pb.a[jb] + pb.b[jb] * e0, betaB = pb.b[jb] * k;
    sideA += alphaA * ma + betaA * msv;
    sideB += alphaB * ma + betaB * msv;
    if (eMid < pa.liquidTop) wetA += ma;
    if (eMid < pb.liquidTop) wetB += ma;
    const alpha = net.a[jn] + net.b[jn] * e0, beta = net.b[jn] * k;
    const f = alpha * ma + beta * msv;
    const mu = alpha * msu + beta * msuv;
    const mv = alpha * msv + beta * msvv;
    F += f;
    Mu += mu;
    Mv += mv;
    const pMid = alpha + beta * 0.5 * (cuts[i] + cuts[i + 1]);
    if (pMid > 0) {
      Fp += f; Mup += mu; Mvp += mv; Ap += ma;
    } else if (pMid < 0) {
      Fn += f; Mun += mu; Mvn += mv; An += ma;
    }
  }

  // Extremes of a piecewise-linear function of v lie at the cuts or the plate's ends.
  const outer = plate.region[0].shape;
  let maxPa = -Infinity, maxV = 0, minPa = Infinity, minV = 0;
  let peakA = -Infinity, peakB = -Infinity;
  for (let i = 0; i < nCuts; i++) {
    const v = cuts[i];
    const e = e0 + k * v;
    const p = evalProfile(net, e);
    if (p > maxPa) {
      maxPa = p;
      maxV = v;
    }
    if (p < minPa) {
      minPa = p;
      minV = v;
    }
    peakA = Math.max(peakA, evalProfile(pa, e));
    peakB = Math.max(peakB, evalProfile(pb, e));
  }

  out.areaM2 = area;
  out.centroidU = area > 0 ? areaSu / area : 0;
  out.centroidV = area > 0 ? areaSv / area : 0;
  out.sideForceA = sideA;
  out.sideForceB = sideB;
  out.sideWettedA = wetA;
  out.sideWettedB = wetB;
  out.sidePeakA = peakA;
  out.sidePeakB = peakB;
  out.netForceN = F;
  out.netMomentU = Mu;
  out.netMomentV = Mv;
  setPart(out.positive, Fp, Ap, Mup, Mvp);
  setPart(out.negative, Fn, An, Mun, Mvn);
  out.peakMaxPa = maxPa;
  out.peakMaxU = chordMidU(outer, maxV);
  out.peakMaxV = maxV;
  out.peakMinPa = minPa;
  out.peakMinU = chordMidU(outer, minV);
  out.peakMinV = minV;
  return out;
}

function setPart(p: PartLoad, force: number, area: number, mu: number, mv: number): void {
  p.forceN = force;
  p.areaM2 = area;
  p.copU = force !== 0 ? mu / force : NaN;
  p.copV = force !== 0 ? mv / force : NaN;
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
  const { vMin, vMax, frame, region } = plate;
  const span = vMax - vMin;
  let n = cuts.length;
  let hasCircle = false;
  for (let r = 0; r < region.length; r++) {
    const shape = region[r].shape;
    n += shape.kind === 'polygon' ? shape.pts.length / 2 : 2;
    if (shape.kind === 'circle') hasCircle = true;
  }
  if (hasCircle) n += 31;
  cutBuf = grown(cutBuf, n);
  const vs = cutBuf;
  let m = 0;
  const keep = (v: number): void => {
    if (v >= vMin && v <= vMax) vs[m++] = v;
  };
  for (let i = 0; i < cuts.length; i++) keep(cuts[i]);
  for (let r = 0; r < region.length; r++) {
    const shape = region[r].shape;
    if (shape.kind === 'polygon') {
      for (let i = 1; i < shape.pts.length; i += 2) keep(shape.pts[i]);
    } else {
      keep(shape.vc - shape.r);
      keep(shape.vc + shape.r);
    }
  }
  if (hasCircle) for (let i = 1; i < 32; i++) keep(vMin + (span * i) / 32);
  const count = sortUniqueInPlace(vs, m, span);
  const eps = 1e-9 * Math.max(span, 1e-9);
  const out: LoadDiagramPoint[] = new Array(count);
  for (let i = 0; i < count; i++) {
    const v = vs[i];
    const w = regionWidthAtV(region, v >= vMax ? v - eps : v <= vMin ? v + eps : v);
    out[i] = { sM: v - vMin, pressurePa: evalProfile(net, frame.e0 + frame.k * v), widthM: w };
  }
  return out;
}

/**
 * ∫p dA and the area over `region` (a part of the plate, in its axes), exact: the net pressure is
 * linear in v between consecutive cuts (the plate's cuts from integratePlate).
 */
export function regionNetForce(plate: FlatPlate, region: readonly SignedShape[], net: PressureProfile, cuts: readonly number[]): { forceN: number; areaM2: number } {
  const strips = stripMomentsInto(region, cuts);
  return { forceN: stripsNetForce(plate, net, cuts, strips), areaM2: stripsArea(cuts, strips) };
}

/** Sides of the inscribed polygon that stands for a circle where a region must be clipped (area error < 2.6e-5). */
export const CIRCLE_AS_POLYGON_SIDES = 512;

/** The plate's region as polygons (circles as inscribed 512-gons), for clipping with half-planes. */
export function regionAsPolygons(region: readonly SignedShape[]): { pts: number[]; sign: 1 | -1 }[] {
  return region.map(({ shape, sign }) => {
    if (shape.kind === 'polygon') return { pts: shape.pts, sign };
    return { pts: Array.from(circleOutline(shape)), sign };
  });
}

/** cos and sin of the inscribed polygon's vertex angles (2π i / 512), worked out once. */
const CIRCLE_COS = new Float64Array(CIRCLE_AS_POLYGON_SIDES);
const CIRCLE_SIN = new Float64Array(CIRCLE_AS_POLYGON_SIDES);
for (let i = 0; i < CIRCLE_AS_POLYGON_SIDES; i++) {
  const a = (2 * Math.PI * i) / CIRCLE_AS_POLYGON_SIDES;
  CIRCLE_COS[i] = Math.cos(a);
  CIRCLE_SIN[i] = Math.sin(a);
}
const circleBuf = new Float64Array(2 * CIRCLE_AS_POLYGON_SIDES);

/** A circle's inscribed 512-gon as a flat u, v list (scratch, valid until the next call). */
function circleOutline(c: Extract<Shape2D, { kind: 'circle' }>): Float64Array {
  for (let i = 0; i < CIRCLE_AS_POLYGON_SIDES; i++) {
    circleBuf[2 * i] = c.uc + c.r * CIRCLE_COS[i];
    circleBuf[2 * i + 1] = c.vc + c.r * CIRCLE_SIN[i];
  }
  return circleBuf;
}

/**
 * One shape of a region as a polygon for clipping: a polygon's own points, or a circle's inscribed
 * 512-gon in scratch space (valid until the next call). Its length is shapeOutlineLength(shape).
 */
export function shapeOutline(shape: Shape2D): ArrayLike<number> {
  return shape.kind === 'polygon' ? shape.pts : circleOutline(shape);
}

export function shapeOutlineLength(shape: Shape2D): number {
  return shape.kind === 'polygon' ? shape.pts.length : 2 * CIRCLE_AS_POLYGON_SIDES;
}

/**
 * Clips one shape of a region by half-planes in turn without allocating: start(shape), then
 * clip(a, b, c) keeps the part where a·u + b·v ≤ c (clipHalfPlane); the result is pts[0..len),
 * len 0 once fewer than 3 vertices are left. Two buffers alternate, so a clip never reads what it
 * writes; each caller keeps its own clipper, valid until its next start.
 */
export class RegionClip {
  pts: ArrayLike<number> = [];
  len = 0;
  private bufA: Float64Array = new Float64Array(64);
  private bufB: Float64Array = new Float64Array(64);
  private useA = true;

  start(shape: Shape2D): void {
    this.pts = shapeOutline(shape);
    this.len = shapeOutlineLength(shape);
  }

  clip(a: number, b: number, c: number): void {
    if (this.len === 0) return;
    const need = 2 * this.len + 4;
    let out: Float64Array;
    if (this.useA) out = this.bufA = grown(this.bufA, need);
    else out = this.bufB = grown(this.bufB, need);
    this.len = clipHalfPlaneInto(this.pts, this.len, a, b, c, out);
    this.pts = out;
    this.useA = !this.useA;
  }
}
