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
  let s = s0, q = q0;
  const pAt: number[] = [];
  if (points.length > 0) {
    // stations at the point forces, so the march applies each jump in shear at its station
    const S = [...s0], Q = [...q0], P = s0.map(() => 0);
    for (const p of points) {
      const x = s0[0] + p.atM;
      let i = 0;
      while (i < S.length && S[i] < x) i++;
      if (i < S.length && S[i] === x) {
        P[i] += p.forceN;
        continue;
      }
      if (i === 0 || i === S.length) continue;
      const t = (x - S[i - 1]) / (S[i] - S[i - 1]);
      S.splice(i, 0, x);
      Q.splice(i, 0, Q[i - 1] + t * (Q[i] - Q[i - 1]));
      P.splice(i, 0, p.forceN);
    }
    s = S;
    q = Q;
    pAt.push(...P);
  }
  const n = s.length;
  const L = s[n - 1] - s[0];
  let W = 0, Ms = 0, fa = 0, fb = 0;
  for (let i = 0; i + 1 < n; i++) {
    const a = s[i] - s[0], b = s[i + 1] - s[0], h = b - a;
    if (h <= 0) continue;
    const qa = q[i], qb = q[i + 1];
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
  for (let i = 1; i + 1 < pAt.length; i++) {
    if (pAt[i] === 0) continue;
    const a = s[i] - s[0], b = L - a, P = pAt[i];
    Wp += P;
    Ms += P * a;
    if (fixity === 'fixed') {
      fa += P * a * b * b;
      fb += P * a * a * b;
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
    if (i > 0 && pAt.length > 0) V -= pAt[i];
    const a = s[i] - s[0], h = s[i + 1] - s[i];
    if (h <= 0) continue;
    const qa = q[i], m = (q[i + 1] - qa) / h;
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
  return {
    spanM: L,
    totalLoadN: W,
    reactionStartN: V0,
    reactionEndN: -V,
    maxMomentNm: best,
    maxMomentAtM: bestAt,
    endMomentStartNm: M0,
    endMomentEndNm: fixity === 'fixed' ? ML : 0,
  };
}
