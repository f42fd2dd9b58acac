/**
 * A single-span beam under a continuous piecewise-linear line load q(s) (N/m, positive in the
 * direction of the net pressure), simply supported or fixed at both ends. Statics is exact: shear
 * and moment are integrated segment by segment in closed form (V' = −q, M' = V), and for fixed ends
 * the fixed-end moments are M_A = ∫q s (L−s)² / L² ds and M_B = ∫q s² (L−s) / L² ds (the
 * standard influence-line results, e.g. AISC Steel Construction Manual, Table 3-23), integrated
 * exactly with 3-point Gauss–Legendre (exact for the quartic integrand on each linear segment).
 * Bending moment sign: sagging (tension on the side away from the load) positive.
 * Point forces (e.g. the reactions of intermediate supports, entered as negative loads) add by
 * superposition: simple-support reactions P b / L and P a / L; fixed-end moments P a b² / L² and
 * P a² b / L² with reactions P b² (3a + b) / L³ and P a² (a + 3b) / L³ (AISC Manual Table 3-23,
 * cases 7 and 16).
 */

export type EndFixity = 'simply-supported' | 'fixed';

export interface BeamResult {
  spanM: number;
  /** Total load, N. */
  totalLoadN: number;
  /** End reactions (shear at each end), N. */
  reactionStartN: number;
  reactionEndN: number;
  /** Moment of largest magnitude (signed), N·m, and where (m from the start). */
  maxMomentNm: number;
  maxMomentAtM: number;
  /** End moments (negative = hogging), N·m; 0 for simple supports. */
  endMomentStartNm: number;
  endMomentEndNm: number;
}

const GX = [-Math.sqrt(3 / 5), 0, Math.sqrt(3 / 5)];
const GW = [5 / 9, 8 / 9, 5 / 9];

export interface PointForce {
  /** Distance from the first station, m. */
  atM: number;
  /** Force in the direction of positive q, N (an intermediate support's reaction is negative). */
  forceN: number;
}

/**
 * Solves the beam. s: ascending stations from s[0] to s[0] + L; q: load at each station (linear
 * between); points: concentrated forces along the span.
 */
export function solveBeam(s0: readonly number[], q0: readonly number[], fixity: EndFixity, points: readonly PointForce[] = []): BeamResult {
  const at = new Float64Array(points.length), f = new Float64Array(points.length);
  for (let i = 0; i < points.length; i++) {
    at[i] = points[i].atM;
    f[i] = points[i].forceN;
  }
  const o = solveBeamInto(s0, q0, 0, s0.length, fixity, at, f, points.length, new Float64Array(BEAM_OUT));
  return beamResultOf(o, 0);
}

/** Numbers solveBeamInto writes, in BeamResult's order. */
export const BEAM_OUT = 8;

/** The BeamResult of the numbers solveBeamInto wrote at out[off ..]. */
export function beamResultOf(o: ArrayLike<number>, off: number): BeamResult {
  return {
    spanM: o[off],
    totalLoadN: o[off + 1],
    reactionStartN: o[off + 2],
    reactionEndN: o[off + 3],
    maxMomentNm: o[off + 4],
    maxMomentAtM: o[off + 5],
    endMomentStartNm: o[off + 6],
    endMomentEndNm: o[off + 7],
  };
}

// Scratch for the stations with the point forces put in (the engine is synchronous and never re-entered).
let bs = new Float64Array(32), bq = new Float64Array(32), bp = new Float64Array(32);

/**
 * solveBeam without allocation: stations s0[from .. from + n0), loads q0 (the same indices), and nPts point forces (distance from
 * the first station pointAt, force pointF) in the order given. Writes spanM, totalLoadN,
 * reactionStartN, reactionEndN, maxMomentNm, maxMomentAtM, endMomentStartNm, endMomentEndNm to
 * out[off .. off + 8) and returns out.
 */
export function solveBeamInto(
  s0: ArrayLike<number>,
  q0: ArrayLike<number>,
  from: number,
  n0: number,
  fixity: EndFixity,
  pointAt: ArrayLike<number>,
  pointF: ArrayLike<number>,
  nPts: number,
  out: Float64Array,
  off = 0,
): Float64Array {
  let s: ArrayLike<number> = s0, q: ArrayLike<number> = q0;
  // s and q are read from index z on: `from` in the caller's arrays, 0 in the scratch copies
  let z = from;
  let n = n0;
  const hasPoints = nPts > 0;
  if (hasPoints) {
    // stations at the point forces, so the march applies each jump in shear at its station
    if (bs.length < n0 + nPts) {
      bs = new Float64Array(2 * (n0 + nPts));
      bq = new Float64Array(2 * (n0 + nPts));
      bp = new Float64Array(2 * (n0 + nPts));
    }
    for (let i = 0; i < n0; i++) {
      bs[i] = s0[from + i];
      bq[i] = q0[from + i];
      bp[i] = 0;
    }
    for (let k = 0; k < nPts; k++) {
      const x = s0[from] + pointAt[k];
      let i = 0;
      while (i < n && bs[i] < x) i++;
      if (i < n && bs[i] === x) {
        bp[i] += pointF[k];
        continue;
      }
      if (i === 0 || i === n) continue;
      const t = (x - bs[i - 1]) / (bs[i] - bs[i - 1]);
      const qx = bq[i - 1] + t * (bq[i] - bq[i - 1]);
      for (let j = n; j > i; j--) {
        bs[j] = bs[j - 1];
        bq[j] = bq[j - 1];
        bp[j] = bp[j - 1];
      }
      bs[i] = x;
      bq[i] = qx;
      bp[i] = pointF[k];
      n++;
    }
    s = bs;
    q = bq;
    z = 0;
  }
  const pAt = bp;
  const L = s[z + n - 1] - s[z];
  let W = 0, Ms = 0, fa = 0, fb = 0;
  for (let i = 0; i + 1 < n; i++) {
    const a = s[z + i] - s[z], b = s[z + i + 1] - s[z], h = b - a;
    if (h <= 0) continue;
    const qa = q[z + i], qb = q[z + i + 1];
    W += ((qa + qb) / 2) * h;
    Ms += (h / 6) * (qa * (2 * a + b) + qb * (a + 2 * b));
    if (fixity === 'fixed') {
      for (let g = 0; g < 3; g++) {
        const t = 0.5 * (1 + GX[g]);
        const x = a + t * h;
        const qx = qa + (qb - qa) * t;
        const w = GW[g] * 0.5 * h;
        fa += w * qx * x * (L - x) * (L - x);
        fb += w * qx * x * x * (L - x);
      }
    }
  }
  let Wp = 0;
  if (hasPoints) {
    for (let i = 1; i + 1 < n; i++) {
      if (pAt[i] === 0) continue;
      const a = s[z + i] - s[z], b = L - a, P = pAt[i];
      Wp += P;
      Ms += P * a;
      if (fixity === 'fixed') {
        fa += P * a * b * b;
        fb += P * a * a * b;
      }
    }
  }
  const rbSs = L > 0 ? Ms / L : 0;
  const raSs = W + Wp - rbSs;
  let M0 = 0, ML = 0, V0 = raSs;
  if (fixity === 'fixed' && L > 0) {
    const MA = fa / (L * L), MB = fb / (L * L);
    M0 = -MA;
    ML = -MB;
    V0 = raSs + (MA - MB) / L;
  }
  // march along the span
  let V = V0, M = M0;
  let best = M0, bestAt = 0;
  for (let i = 0; i + 1 < n; i++) {
    if (i > 0 && hasPoints) V -= pAt[i];
    const a = s[z + i] - s[z], h = s[z + i + 1] - s[z + i];
    if (h <= 0) continue;
    const qa = q[z + i], m = (q[z + i + 1] - qa) / h;
    // V(ξ) = V − qa ξ − m ξ²/2 ; roots in (0, h)
    let r1 = NaN, r2 = NaN;
    if (Math.abs(m) > 1e-300) {
      const A = -m / 2, B = -qa, C = V;
      const disc = B * B - 4 * A * C;
      if (disc >= 0) {
        const sq = Math.sqrt(disc);
        const qq = -0.5 * (B + (B >= 0 ? sq : -sq));
        if (A !== 0) r1 = qq / A;
        if (qq !== 0) r2 = C / qq;
      }
    } else if (qa !== 0) {
      r1 = V / qa;
    }
    for (let j = 0; j < 2; j++) {
      const r = j === 0 ? r1 : r2; // (no array per segment)
      if (r > 0 && r < h) {
        const mr = M + V * r - (qa * r * r) / 2 - (m * r * r * r) / 6;
        if (Math.abs(mr) > Math.abs(best)) {
          best = mr;
          bestAt = a + r;
        }
      }
    }
    M = M + V * h - (qa * h * h) / 2 - (m * h * h * h) / 6;
    V = V - qa * h - (m * h * h) / 2;
    if (Math.abs(M) > Math.abs(best)) {
      best = M;
      bestAt = a + h;
    }
  }
  out[off] = L;
  out[off + 1] = W;
  out[off + 2] = V0;
  out[off + 3] = -V;
  out[off + 4] = best;
  out[off + 5] = bestAt;
  out[off + 6] = M0;
  out[off + 7] = fixity === 'fixed' ? ML : 0;
  return out;
}
