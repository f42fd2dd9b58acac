/**
 * An adaptive explicit Runge–Kutta integrator: the Dormand–Prince 5(4) pair with its 4th-order
 * continuous extension, as published in J. R. Dormand and P. J. Prince, "A family of embedded
 * Runge–Kutta formulae", J. Comp. Appl. Math. 6 (1980) 19–26, and set out with the step-size
 * control and dense output ("DOPRI5", contd5) in E. Hairer, S. P. Nørsett and G. Wanner, Solving
 * Ordinary Differential Equations I, 2nd ed., Springer 1993, §II.4–II.6.
 *
 * Written here rather than taken from the registry: the npm packages that offer it (odex is
 * Gragg–Bulirsch–Stoer; ode45-cash-karp is Cash–Karp without dense output) give neither the dense
 * output nor a way to stop at an event, and the flooding forecast needs both (a pump stopping at a
 * level; output at exact times). Like every Runge–Kutta method it keeps linear invariants exactly,
 * so a volume balance kept in the state holds to rounding.
 */

/** dy/dt written into `dy`. */
export type Derivative = (t: number, y: Float64Array, dy: Float64Array) => void;

export interface OdeOptions {
  /** Relative and absolute tolerances of the local error (per component). */
  rtol: number;
  atol: number;
  /** First step to try, s (default: from the derivative's size). */
  h0?: number;
  /** Largest step, s. */
  hMax?: number;
  /** Give up after this many steps (default 100,000). */
  maxSteps?: number;
  /**
   * rosenbrock23 only: accepted steps one Jacobian serves (default 1, a fresh one every step). Above 1
   * the Jacobian is kept while steps are accepted and worked out again after a rejected step.
   */
  jacobianSteps?: number;
}

/** y at time t inside the last accepted step (the continuous extension). */
export type DenseOutput = (t: number, out: Float64Array) => void;

/** Called after every accepted step; a time inside it stops the run there. */
export type OdeEvent = (tOld: number, tNew: number, yNew: Float64Array, dense: DenseOutput) => number | null;

export interface OdeRun {
  /** Time reached: t1, or the event time when `event` stopped the run. */
  t: number;
  y: Float64Array<ArrayBuffer>;
  /** Step size that would be tried next. */
  hNext: number;
  steps: number;
  rejected: number;
  evaluations: number;
  stoppedByEvent: boolean;
}

const C2 = 1 / 5, C3 = 3 / 10, C4 = 4 / 5, C5 = 8 / 9;
const A21 = 1 / 5;
const A31 = 3 / 40, A32 = 9 / 40;
const A41 = 44 / 45, A42 = -56 / 15, A43 = 32 / 9;
const A51 = 19372 / 6561, A52 = -25360 / 2187, A53 = 64448 / 6561, A54 = -212 / 729;
const A61 = 9017 / 3168, A62 = -355 / 33, A63 = 46732 / 5247, A64 = 49 / 176, A65 = -5103 / 18656;
const A71 = 35 / 384, A73 = 500 / 1113, A74 = 125 / 192, A75 = -2187 / 6784, A76 = 11 / 84;
const E1 = 71 / 57600, E3 = -71 / 16695, E4 = 71 / 1920, E5 = -17253 / 339200, E6 = 22 / 525, E7 = -1 / 40;
const D1 = -12715105075 / 11282082432, D3 = 87487479700 / 32700410799, D4 = -10690763975 / 1880347072;
const D5 = 701980252875 / 199316789632, D6 = -1453857185 / 822651844, D7 = 69997945 / 29380423;

/**
 * Integrates y' = f(t, y) from t0 to t1 (t1 > t0). After every accepted step `event` (if given) may
 * look at the step through its dense output and return a time inside it at which to stop; the run
 * then ends there with y from the continuous extension.
 */
export function dormandPrince(
  f: Derivative,
  t0: number,
  y0: ArrayLike<number>,
  t1: number,
  opts: OdeOptions,
  event?: OdeEvent,
): OdeRun {
  const n = y0.length;
  const y = Float64Array.from(y0);
  const k1 = new Float64Array(n), k2 = new Float64Array(n), k3 = new Float64Array(n), k4 = new Float64Array(n);
  const k5 = new Float64Array(n), k6 = new Float64Array(n), k7 = new Float64Array(n);
  const yt = new Float64Array(n), y1 = new Float64Array(n);
  const r1 = new Float64Array(n), r2 = new Float64Array(n), r3 = new Float64Array(n), r4 = new Float64Array(n), r5 = new Float64Array(n);
  const maxSteps = opts.maxSteps ?? 100_000;
  const hMax = opts.hMax ?? t1 - t0;
  let t = t0;
  let evaluations = 1;
  f(t, y, k1);
  let h = opts.h0 ?? initialStep(y, k1, opts, hMax);
  let steps = 0, rejected = 0;
  let errOld = 1e-4;
  let tOld = t;
  const dense: DenseOutput = (ts, out) => {
    const hs = t - tOld;
    const th = hs === 0 ? 0 : (ts - tOld) / hs;
    const th1 = 1 - th;
    for (let i = 0; i < n; i++) out[i] = r1[i] + th * (r2[i] + th1 * (r3[i] + th * (r4[i] + th1 * r5[i])));
  };
  while (t < t1) {
    if (steps >= maxSteps) throw new Error(`dormandPrince: more than ${maxSteps} steps between ${t0} s and ${t1} s`);
    if (t + 1.01 * h >= t1) h = t1 - t;
    h = Math.min(h, hMax);
    for (let i = 0; i < n; i++) yt[i] = y[i] + h * A21 * k1[i];
    f(t + C2 * h, yt, k2);
    for (let i = 0; i < n; i++) yt[i] = y[i] + h * (A31 * k1[i] + A32 * k2[i]);
    f(t + C3 * h, yt, k3);
    for (let i = 0; i < n; i++) yt[i] = y[i] + h * (A41 * k1[i] + A42 * k2[i] + A43 * k3[i]);
    f(t + C4 * h, yt, k4);
    for (let i = 0; i < n; i++) yt[i] = y[i] + h * (A51 * k1[i] + A52 * k2[i] + A53 * k3[i] + A54 * k4[i]);
    f(t + C5 * h, yt, k5);
    for (let i = 0; i < n; i++) yt[i] = y[i] + h * (A61 * k1[i] + A62 * k2[i] + A63 * k3[i] + A64 * k4[i] + A65 * k5[i]);
    f(t + h, yt, k6);
    for (let i = 0; i < n; i++) y1[i] = y[i] + h * (A71 * k1[i] + A73 * k3[i] + A74 * k4[i] + A75 * k5[i] + A76 * k6[i]);
    f(t + h, y1, k7);
    evaluations += 6;
    let err = 0;
    for (let i = 0; i < n; i++) {
      const sc = opts.atol + opts.rtol * Math.max(Math.abs(y[i]), Math.abs(y1[i]));
      const e = (h * (E1 * k1[i] + E3 * k3[i] + E4 * k4[i] + E5 * k5[i] + E6 * k6[i] + E7 * k7[i])) / sc;
      err += e * e;
    }
    err = Math.sqrt(err / n);
    if (!(err <= 1)) {
      // rejected: shrink (a NaN error shrinks hard)
      rejected++;
      h *= Number.isFinite(err) ? Math.max(0.2, 0.9 * err ** -0.2) : 0.1;
      if (h < 1e-9 * Math.max(1, Math.abs(t))) throw new Error(`dormandPrince: step size underflow at t = ${t} s`);
      continue;
    }
    steps++;
    // dense output coefficients (Hairer et al., contd5)
    for (let i = 0; i < n; i++) {
      const ydiff = y1[i] - y[i];
      const bspl = h * k1[i] - ydiff;
      r1[i] = y[i];
      r2[i] = ydiff;
      r3[i] = bspl;
      r4[i] = ydiff - h * k7[i] - bspl;
      r5[i] = h * (D1 * k1[i] + D3 * k3[i] + D4 * k4[i] + D5 * k5[i] + D6 * k6[i] + D7 * k7[i]);
    }
    tOld = t;
    t = t + h;
    if (t1 - t < 1e-12 * Math.max(1, Math.abs(t1))) t = t1;
    y.set(y1);
    k1.set(k7);
    // PI step-size control (Hairer et al. §IV.2, as in DOPRI5: β = 0.04)
    const fac = Math.min(10, Math.max(0.2, 0.9 * err ** -0.17 * errOld ** 0.04));
    errOld = Math.max(err, 1e-4);
    h *= err === 0 ? 10 : fac;
    const te = event ? event(tOld, t, y, dense) : null;
    if (te !== null) return finish(te, y, h, steps, rejected, evaluations, dense);
  }
  return { t, y, hNext: h, steps, rejected, evaluations, stoppedByEvent: false };
}

/** The run stopped by an event at te: y from the continuous extension there. */
function finish(te: number, y: Float64Array<ArrayBuffer>, hNext: number, steps: number, rejected: number, evaluations: number, dense: DenseOutput): OdeRun {
  dense(te, y);
  return { t: te, y, hNext, steps, rejected, evaluations, stoppedByEvent: true };
}

/** Starting step from the size of y and y' (Hairer et al. §II.4, a simplified form). */
function initialStep(y: Float64Array, dy: Float64Array, opts: OdeOptions, hMax: number): number {
  let d0 = 0, d1 = 0;
  for (let i = 0; i < y.length; i++) {
    const sc = opts.atol + opts.rtol * Math.abs(y[i]);
    d0 += (y[i] / sc) ** 2;
    d1 += (dy[i] / sc) ** 2;
  }
  d0 = Math.sqrt(d0 / y.length);
  d1 = Math.sqrt(d1 / y.length);
  const h = d0 < 1e-5 || d1 < 1e-5 ? 1e-3 : 0.01 * (d0 / d1);
  return Math.min(Math.max(h, 1e-3), hMax);
}

/**
 * The linear algebra a linearly implicit method needs from the problem: its Jacobian at a point,
 * and solves with the iteration matrix W = I − γ·h·J. Kept with the problem so it can use its
 * structure (the flooding model's is block-sparse: spaces joined by openings).
 */
export interface Linearisation {
  /** Works out J = ∂f/∂y at (t, y), given fy = f(t, y). */
  jacobian(t: number, y: Float64Array, fy: Float64Array): void;
  /** Overwrites b with x solving (I − gh·J) x = b, for the J last worked out. */
  solve(gh: number, b: Float64Array): void;
}

// Shampine & Reichelt's Rosenbrock pair (see rosenbrock23): d = 1/(2 + √2), e32 = 6 + √2.
const RB_D = 1 / (2 + Math.SQRT2);
const RB_E32 = 6 + Math.SQRT2;

/**
 * Integrates y' = f(y) from t0 to t1 (t1 > t0; f may not depend on t) with the L-stable,
 * linearly implicit Rosenbrock pair of L. F. Shampine and M. W. Reichelt, "The MATLAB ODE
 * Suite", SIAM J. Sci. Comput. 18 (1997) 1–22, §3 (the "ode23s" formulas): second order,
 * with a third-order error estimate and a second-order continuous extension, one Jacobian and
 * one factorisation per step, three evaluations of f (the last is the next step's first):
 *
 *   W = I − d h J,  F0 = f(y),  W k1 = F0,  F1 = f(y + h/2 k1),  W (k2 − k1) = F1 − k1,
 *   y1 = y + h k2,  F2 = f(y1),  W k3 = F2 − e32 (k2 − F1) − 2 (k1 − F0),
 *   error = h/6 (k1 − 2 k2 + k3),  y(t + s h) = y + h [s(1−s) k1 + s(s−2d) k2] / (1 − 2d).
 *
 * Being L-stable it steps over the fast, decaying exchanges between nearly balanced spaces
 * (which hold an explicit method to steps of their time constant) at the pace the slow filling
 * and pumping allow. Every stage is a linear combination of f values through W⁻¹, so a linear
 * invariant c·y with c·f ≡ 0 and c·J ≡ 0 is kept to rounding (the flooding model's volume
 * balance). Same events and result as dormandPrince.
 *
 * With `jacobianSteps` > 1 one Jacobian serves several accepted steps (W is still factorised
 * afresh for each step size), and a rejected step brings a fresh one: the stages then use an
 * approximate J, as a W-method does, and the step size control, which compares the second- and
 * third-order results, answers for the error. The balance is kept either way (an older J still has
 * c·J ≡ 0).
 */
export function rosenbrock23(
  f: Derivative,
  lin: Linearisation,
  t0: number, y0: ArrayLike<number>, t1: number, opts: OdeOptions, event?: OdeEvent): OdeRun {
  const n = y0.length;
  const y = Float64Array.from(y0);
  const f0 = new Float64Array(n), f1 = new Float64Array(n), f2 = new Float64Array(n);
  const k1 = new Float64Array(n), k2 = new Float64Array(n), k3 = new Float64Array(n);
  const yt = new Float64Array(n), y1 = new Float64Array(n), yOld = new Float64Array(n);
  const dk1 = new Float64Array(n), dk2 = new Float64Array(n);
  const maxSteps = opts.maxSteps ?? 100_000;
  const hMax = opts.hMax ?? t1 - t0;
  let t = t0;
  let evaluations = 1;
  f(t, y, f0);
  let h = opts.h0 ?? initialStep(y, f0, opts, hMax);
  let steps = 0, rejected = 0;
  let tOld = t;
  let hOld = 0;
  let needJacobian = true;
  let jacobianAge = 0;
  const jacobianSteps = Math.max(1, Math.floor(opts.jacobianSteps ?? 1));
  const dense: DenseOutput = (ts, out) => {
    const s = hOld === 0 ? 0 : (ts - tOld) / hOld;
    const a = (s * (1 - s)) / (1 - 2 * RB_D), b = (s * (s - 2 * RB_D)) / (1 - 2 * RB_D);
    for (let i = 0; i < n; i++) out[i] = yOld[i] + hOld * (a * dk1[i] + b * dk2[i]);
  };
  while (t < t1) {
    if (steps >= maxSteps) throw new Error(`rosenbrock23: more than ${maxSteps} steps between ${t0} s and ${t1} s`);
    if (t + 1.01 * h >= t1) h = t1 - t;
    h = Math.min(h, hMax);
    if (needJacobian) {
      lin.jacobian(t, y, f0);
      needJacobian = false;
      jacobianAge = 0;
    }
    const gh = RB_D * h;
    k1.set(f0);
    lin.solve(gh, k1);
    for (let i = 0; i < n; i++) yt[i] = y[i] + 0.5 * h * k1[i];
    f(t + 0.5 * h, yt, f1);
    for (let i = 0; i < n; i++) k2[i] = f1[i] - k1[i];
    lin.solve(gh, k2);
    for (let i = 0; i < n; i++) {
      k2[i] += k1[i];
      y1[i] = y[i] + h * k2[i];
    }
    f(t + h, y1, f2);
    for (let i = 0; i < n; i++) k3[i] = f2[i] - RB_E32 * (k2[i] - f1[i]) - 2 * (k1[i] - f0[i]);
    lin.solve(gh, k3);
    evaluations += 2;
    let err = 0;
    for (let i = 0; i < n; i++) {
      const sc = opts.atol + opts.rtol * Math.max(Math.abs(y[i]), Math.abs(y1[i]));
      const e = ((h / 6) * (k1[i] - 2 * k2[i] + k3[i])) / sc;
      err += e * e;
    }
    err = Math.sqrt(err / n);
    if (!(err <= 1)) {
      rejected++;
      // a rejection with an older Jacobian: work it out afresh before shrinking further on its account
      if (jacobianAge > 0) needJacobian = true;
      h *= Number.isFinite(err) ? Math.max(0.1, 0.8 * err ** (-1 / 3)) : 0.1;
      if (h < 1e-9 * Math.max(1, Math.abs(t))) throw new Error(`rosenbrock23: step size underflow at t = ${t} s`);
      continue;
    }
    steps++;
    yOld.set(y);
    dk1.set(k1);
    dk2.set(k2);
    tOld = t;
    hOld = h;
    t = t + h;
    if (t1 - t < 1e-12 * Math.max(1, Math.abs(t1))) t = t1;
    y.set(y1);
    f0.set(f2);
    if (++jacobianAge >= jacobianSteps) needJacobian = true;
    // the error is O(h³): grow by at most 5
    h *= err === 0 ? 5 : Math.min(5, 0.8 * err ** (-1 / 3));
    const te = event ? event(tOld, t, y, dense) : null;
    if (te !== null) return finish(te, y, h, steps, rejected, evaluations, dense);
  }
  return { t, y, hNext: h, steps, rejected, evaluations, stoppedByEvent: false };
}
