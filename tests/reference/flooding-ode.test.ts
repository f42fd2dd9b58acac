/**
 * The forecast's stiff integrator (Shampine & Reichelt's Rosenbrock pair, flooding-ode.ts) against
 * the exact solution of a stiff linear system, y(t) = expm(A t) y0, computed by mathjs's matrix
 * exponential (a general-purpose reference library, not the engine). The system is two tanks joined by
 * a large opening (fast exchange, time constant 0.1 s) draining slowly to the sea (time constant
 * 10⁴ s), with the drained volume kept as a running total, so the column sums of A vanish and the
 * total volume is an invariant the method must keep to rounding.
 */
import { describe, expect, it } from 'vitest';
import { expm, matrix, multiply } from 'mathjs';
import { rosenbrock23, type Linearisation } from '@shared/engine';

// y = [tank 1, tank 2, drained total]; flows linear in the volumes (laminar, linearised exchange)
const A = [
  [-10, 10, 0],
  [10, -10 - 1e-4, 0],
  [0, 1e-4, 0],
];

function linear(): Linearisation {
  let lu: number[][] = [];
  return {
    jacobian() {},
    solve(gh, b) {
      // (I − gh A) x = b by Gaussian elimination on the 3 × 3 system (small enough to write out)
      lu = A.map((row, i) => row.map((a, j) => (i === j ? 1 : 0) - gh * a));
      const m = lu.map((r, i) => [...r, b[i]]);
      for (let k = 0; k < 3; k++) {
        let p = k;
        for (let i = k + 1; i < 3; i++) if (Math.abs(m[i][k]) > Math.abs(m[p][k])) p = i;
        [m[k], m[p]] = [m[p], m[k]];
        for (let i = k + 1; i < 3; i++) {
          const l = m[i][k] / m[k][k];
          for (let j = k; j < 4; j++) m[i][j] -= l * m[k][j];
        }
      }
      for (let k = 2; k >= 0; k--) {
        let s = m[k][3];
        for (let j = k + 1; j < 3; j++) s -= m[k][j] * b[j];
        b[k] = s / m[k][k];
      }
    },
  };
}

const f = (_t: number, y: Float64Array, dy: Float64Array) => {
  for (let i = 0; i < 3; i++) dy[i] = A[i][0] * y[0] + A[i][1] * y[1] + A[i][2] * y[2];
};

describe('rosenbrock23 on a stiff linear system', () => {
  const y0 = [100, 0, 0];
  const exact = (t: number) => (multiply(expm(multiply(matrix(A), t)), matrix(y0)).toArray() as number[]);

  it('follows expm(A t)·y0 to its tolerance while stepping far beyond the fast time constant', () => {
    const t1 = 20_000;
    const run = rosenbrock23(f, linear(), 0, y0, t1, { rtol: 1e-8, atol: 1e-8 });
    const want = exact(t1);
    for (let i = 0; i < 3; i++) expect(Math.abs(run.y[i] - want[i])).toBeLessThan(1e-5 * 100);
    // an explicit method is held to steps of about 0.1 s here (2 × 10⁵ steps); the L-stable pair is not
    expect(run.steps).toBeLessThan(5_000);
  });

  it('keeps the total volume (the invariant of the column sums) to rounding, and its dense output matches in between', () => {
    const seen: { t: number; y: number[] }[] = [];
    const out = new Float64Array(3);
    const run = rosenbrock23(f, linear(), 0, y0, 5_000, { rtol: 1e-6, atol: 1e-6 }, (a, b, _y, dense) => {
      const tm = 0.5 * (a + b);
      dense(tm, out);
      seen.push({ t: tm, y: [...out] });
      return null;
    });
    expect(Math.abs(run.y[0] + run.y[1] + run.y[2] - 100)).toBeLessThan(1e-12 * 100);
    // the continuous extension is second order: mid-step values within 1e-3 of the volume scale, after the fast start
    for (const s of seen.filter((x) => x.t > 1)) {
      const want = exact(s.t);
      for (let i = 0; i < 3; i++) expect(Math.abs(s.y[i] - want[i])).toBeLessThan(1e-3 * 100);
    }
  });
});
