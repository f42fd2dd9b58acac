/**
 * Exact integrals over plane regions in a plate's 2D axes (u across, v up the steepest slope):
 * area and first and second moments of polygons by Green's theorem (the standard vertex-sum
 * formulas, e.g. Bourke, "Calculating the area and centroid of a polygon", and any statics text),
 * and of circular segments in closed form. Polygons are flat arrays [u0, v0, u1, v1, ...].
 */

/** ∫dA, ∫u dA, ∫v dA, ∫uv dA, ∫v² dA over a region (m², m³, m³, m⁴, m⁴). */
export interface Moments {
  a: number;
  su: number;
  sv: number;
  suv: number;
  svv: number;
}

export const zeroMoments = (): Moments => ({ a: 0, su: 0, sv: 0, suv: 0, svv: 0 });

/** Adds k × m into acc. */
export function addMoments(acc: Moments, m: Moments, k = 1): void {
  acc.a += k * m.a;
  acc.su += k * m.su;
  acc.sv += k * m.sv;
  acc.suv += k * m.suv;
  acc.svv += k * m.svv;
}

/** Moments of a simple or self-touching polygon; positive when counter-clockwise. */
export function polygonMoments(p: readonly number[]): Moments {
  const out = new Float64Array(5);
  polygonMomentsInto(p, p.length, out, 0, 1);
  return { a: out[0], su: out[1], sv: out[2], suv: out[3], svv: out[4] };
}

/**
 * The vertex sums of polygonMoments over the first n numbers of p (a flat u, v list), multiplied by
 * sign and added into out[off..off+5) in the order a, su, sv, suv, svv. Allocation-free core used by
 * the plate integration's hot loop.
 */
export function polygonMomentsInto(p: ArrayLike<number>, n: number, out: Float64Array, off: number, sign: number): void {
  let a = 0, su = 0, sv = 0, suv = 0, svv = 0;
  for (let i = 0; i < n; i += 2) {
    const j = i + 2 < n ? i + 2 : 0;
    const x0 = p[i], y0 = p[i + 1], x1 = p[j], y1 = p[j + 1];
    const c = x0 * y1 - x1 * y0;
    a += c;
    su += (x0 + x1) * c;
    sv += (y0 + y1) * c;
    svv += (y0 * y0 + y0 * y1 + y1 * y1) * c;
    suv += (x0 * y1 + 2 * x0 * y0 + 2 * x1 * y1 + x1 * y0) * c;
  }
  out[off] += sign * (a / 2);
  out[off + 1] += sign * (su / 6);
  out[off + 2] += sign * (sv / 6);
  out[off + 3] += sign * (suv / 24);
  out[off + 4] += sign * (svv / 12);
}

/** Second moment ∫u² dA of a polygon (used by reference checks and plate properties). */
export function polygonSuu(p: readonly number[]): number {
  const n = p.length;
  let s = 0;
  for (let i = 0; i < n; i += 2) {
    const j = i + 2 < n ? i + 2 : 0;
    const x0 = p[i], y0 = p[i + 1], x1 = p[j], y1 = p[j + 1];
    s += (x0 * x0 + x0 * x1 + x1 * x1) * (x0 * y1 - x1 * y0);
  }
  return s / 12;
}

/**
 * Splits a polygon by the line v = c into the parts below and above (Sutherland–Hodgman, one pass).
 * For a non-convex polygon a part may hold zero-area bridges along the cut line; they cancel in
 * every Green's-theorem integral, so moments stay exact.
 */
export function splitAtV(p: readonly number[], c: number): [number[], number[]] {
  const n = p.length;
  const lens = new Int32Array(2);
  const below = new Float64Array(2 * n + 4), above = new Float64Array(2 * n + 4);
  splitAtVInto(p, n, c, below, above, lens);
  return [lens[0] >= 6 ? Array.from(below.subarray(0, lens[0])) : [], lens[1] >= 6 ? Array.from(above.subarray(0, lens[1])) : []];
}

/**
 * splitAtV over the first n numbers of p, writing the parts into below and above (each needs room
 * for 2n + 4 numbers) and their lengths into lens[0] and lens[1]; a part under 3 vertices has
 * length 0.
 */
export function splitAtVInto(p: ArrayLike<number>, n: number, c: number, below: Float64Array, above: Float64Array, lens: Int32Array): void {
  let nb = 0, na = 0;
  for (let i = 0; i < n; i += 2) {
    const j = i + 2 < n ? i + 2 : 0;
    const x0 = p[i], y0 = p[i + 1], x1 = p[j], y1 = p[j + 1];
    const d0 = y0 - c, d1 = y1 - c;
    if (d0 <= 0) {
      below[nb++] = x0;
      below[nb++] = y0;
    }
    if (d0 >= 0) {
      above[na++] = x0;
      above[na++] = y0;
    }
    if ((d0 < 0 && d1 > 0) || (d0 > 0 && d1 < 0)) {
      const t = d0 / (d0 - d1);
      const x = x0 + t * (x1 - x0);
      below[nb++] = x;
      below[nb++] = c;
      above[na++] = x;
      above[na++] = c;
    }
  }
  lens[0] = nb >= 6 ? nb : 0;
  lens[1] = na >= 6 ? na : 0;
}

/** Keeps the part of a polygon where a·u + b·v ≤ c (Sutherland–Hodgman). */
export function clipHalfPlane(p: readonly number[], a: number, b: number, c: number): number[] {
  const out = new Float64Array(2 * p.length + 4);
  const len = clipHalfPlaneInto(p, p.length, a, b, c, out);
  return Array.from(out.subarray(0, len));
}

/**
 * clipHalfPlane over the first n numbers of p, written into out (room for 2n + 4 numbers); returns
 * the length written, 0 when fewer than 3 vertices are left. Allocation-free, for the hot loops.
 */
export function clipHalfPlaneInto(p: ArrayLike<number>, n: number, a: number, b: number, c: number, out: Float64Array): number {
  let m = 0;
  for (let i = 0; i < n; i += 2) {
    const j = i + 2 < n ? i + 2 : 0;
    const x0 = p[i], y0 = p[i + 1], x1 = p[j], y1 = p[j + 1];
    const d0 = a * x0 + b * y0 - c, d1 = a * x1 + b * y1 - c;
    if (d0 <= 0) {
      out[m++] = x0;
      out[m++] = y0;
    }
    if ((d0 < 0 && d1 > 0) || (d0 > 0 && d1 < 0)) {
      const t = d0 / (d0 - d1);
      out[m++] = x0 + t * (x1 - x0);
      out[m++] = y0 + t * (y1 - y0);
    }
  }
  return m >= 6 ? m : 0;
}

/** Total length of the chord(s) of a polygon along the line v = c. */
export function polygonWidthAtV(p: readonly number[], c: number): number {
  // convex outlines cross twice: no allocation on that path
  let x0c = NaN, x1c = NaN;
  let xs: number[] | null = null;
  const n = p.length;
  for (let i = 0; i < n; i += 2) {
    const j = i + 2 < n ? i + 2 : 0;
    const y0 = p[i + 1], y1 = p[j + 1];
    if ((y0 <= c && y1 > c) || (y1 <= c && y0 > c)) {
      const x = p[i] + ((c - y0) / (y1 - y0)) * (p[j] - p[i]);
      if (xs) xs.push(x);
      else if (Number.isNaN(x0c)) x0c = x;
      else if (Number.isNaN(x1c)) x1c = x;
      else xs = [x0c, x1c, x];
    }
  }
  if (!xs) return Number.isNaN(x1c) ? 0 : Math.abs(x1c - x0c);
  xs.sort((q, r) => q - r);
  let w = 0;
  for (let k = 0; k + 1 < xs.length; k += 2) w += xs[k + 1] - xs[k];
  return w;
}

/** Antiderivatives in t = v − v_c of a circle's chord integrals ∫w, ∫t·w, ∫t²·w, w(t) = 2√(r² − t²), into out[0..3). */
function circlePrimitive(r: number, t: number, out: Float64Array): void {
  const tc = Math.max(-r, Math.min(r, t));
  const s = Math.sqrt(Math.max(0, r * r - tc * tc));
  const as = Math.asin(tc / r);
  out[0] = tc * s + r * r * as;
  out[1] = (-2 / 3) * s * s * s;
  out[2] = (tc / 4) * (2 * tc * tc - r * r) * s + (r ** 4 / 4) * as;
}

const prim1 = new Float64Array(3);
const prim2 = new Float64Array(3);

/**
 * Exact moments of the part of a circle (centre (uc, vc), radius r) between v = v1 and v = v2:
 * circular-segment areas and moments in closed form (integrals of the chord 2√(r² − t²)).
 */
export function circleStripMoments(uc: number, vc: number, r: number, v1: number, v2: number): Moments {
  const out = new Float64Array(5);
  circleStripMomentsInto(uc, vc, r, v1, v2, out, 0, 1);
  return { a: out[0], su: out[1], sv: out[2], suv: out[3], svv: out[4] };
}

/** circleStripMoments × sign added into out[off..off+5) (a, su, sv, suv, svv); allocation-free. */
export function circleStripMomentsInto(uc: number, vc: number, r: number, v1: number, v2: number, out: Float64Array, off: number, sign: number): void {
  circlePrimitive(r, v1 - vc, prim1);
  circlePrimitive(r, v2 - vc, prim2);
  const a = prim2[0] - prim1[0];
  const st = prim2[1] - prim1[1];
  const stt = prim2[2] - prim1[2];
  const sv = st + vc * a;
  out[off] += sign * a;
  out[off + 1] += sign * (uc * a);
  out[off + 2] += sign * sv;
  out[off + 3] += sign * (uc * sv);
  out[off + 4] += sign * (stt + 2 * vc * st + vc * vc * a);
}

/** Chord length of a circle at v = c. */
export function circleWidthAtV(vc: number, r: number, c: number): number {
  const t = c - vc;
  return t > -r && t < r ? 2 * Math.sqrt(r * r - t * t) : 0;
}
