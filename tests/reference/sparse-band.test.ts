/**
 * The band solver of large joined groups of spaces (shared/engine/sparse-band.ts) against mathjs's
 * general LU solve (lusolve, a reference library from npm) and the dense LU it replaces, on the
 * pattern the flooding Jacobian has: spaces joined in a chain and in a grid, two fluids each, put
 * in reverse Cuthill–McKee order; then a whole forecast of 60 joined spaces, band against dense.
 */
import { describe, expect, it } from 'vitest';
import { lusolve, matrix } from 'mathjs';
import { bandFactorise, bandSolve, bandwidths, denseFactorise, denseSolve, forecastFlooding, newBandLu, reverseCuthillMcKee } from '@shared/engine';
import type { Compartment, Survey } from '@shared/schemas/survey';
import { baseSurvey, boxCompartment, contents, tid } from '../unit/engine/fixtures';
import { prng } from '../support/prng';

/** Neighbour lists of an r × c grid of spaces (chain: r = 1), numbered row by row, then shuffled. */
function grid(r: number, c: number, rnd: () => number): number[][] {
  const n = r * c;
  const label = Array.from({ length: n }, (_, i) => i).sort(() => rnd() - 0.5);
  const nb: number[][] = Array.from({ length: n }, () => []);
  const join = (a: number, b: number) => (nb[label[a]].push(label[b]), nb[label[b]].push(label[a]));
  for (let i = 0; i < r; i++) for (let j = 0; j < c; j++) {
    if (j + 1 < c) join(i * c + j, i * c + j + 1);
    if (i + 1 < r) join(i * c + j, (i + 1) * c + j);
  }
  return nb;
}

/** A Jacobian-like matrix over the spaces in `order`, nF fluids each: dense blocks where spaces are joined, columns summing to zero as flows do. */
function jacobian(nb: number[][], order: Int32Array, nF: number, rnd: () => number): Float64Array {
  const pos = new Int32Array(order.length);
  order.forEach((s, k) => (pos[s] = k));
  const n = order.length * nF;
  const a = new Float64Array(n * n);
  for (let s = 0; s < nb.length; s++) for (const t of nb[s]) for (let f = 0; f < nF; f++) for (let g = 0; g < nF; g++) {
    // flow out of s into t when s's fluid f rises: −q on s, +q on t (and some pivoting needed: a large off-diagonal)
    const q = (0.1 + rnd()) * (rnd() < 0.1 ? 50 : 1);
    const col = pos[s] * nF + f;
    a[(pos[s] * nF + g) * n + col] -= q / nF;
    a[(pos[t] * nF + g) * n + col] += q / nF;
  }
  return a;
}

const gh = 3.7;

describe('band LU in reverse Cuthill–McKee order', () => {
  for (const [name, r, c] of [['chain of 200', 1, 200], ['grid of 20 × 10', 20, 10], ['grid of 6 × 6', 6, 6]] as const) {
    it(`${name} spaces: the same answer as mathjs lusolve and the dense LU`, () => {
      const rnd = prng(r * 1000 + c);
      const nb = grid(r, c, rnd);
      const order = reverseCuthillMcKee(nb);
      expect([...order].sort((x, y) => x - y)).toEqual(Array.from({ length: r * c }, (_, i) => i));
      const nF = 2;
      const a = jacobian(nb, order, nF, rnd);
      const n = r * c * nF;
      const { kl, ku } = bandwidths(a, n);
      // the ordering brings the band down to about the shorter side of the grid (George & Liu): a chain a space or two, a grid about its width
      expect(Math.max(kl, ku)).toBeLessThan((Math.min(r, c) + 2) * nF);
      const b = Float64Array.from({ length: n }, () => rnd() - 0.5);
      const band = newBandLu(n, kl, ku);
      bandFactorise(a, gh, band);
      const xb = Float64Array.from(b);
      bandSolve(band, xb);
      const lu = new Float64Array(n * n), piv = new Int32Array(n);
      denseFactorise(a, gh, n, lu, piv);
      const xd = Float64Array.from(b);
      denseSolve(lu, piv, n, xd);
      // mathjs: W = I − gh·A as a plain matrix
      const w = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (i === j ? 1 : 0) - gh * a[i * n + j]));
      const xm = (lusolve(matrix(w), Array.from(b)).toArray() as number[][]).map((row) => row[0]);
      const scale = Math.max(...xm.map(Math.abs));
      for (let i = 0; i < n; i++) {
        expect(Math.abs(xb[i] - xm[i])).toBeLessThan(1e-10 * scale);
        expect(Math.abs(xb[i] - xd[i])).toBeLessThan(1e-10 * scale);
      }
    });
  }

  it('a forecast of 60 spaces joined in a chain is the same with the band solver as with the dense one', () => {
    const s: Survey = baseSurvey({ aft: 6, fwd: 6 });
    const comps: Compartment[] = [];
    for (let i = 0; i < 60; i++) comps.push(boxCompartment([i * 3, -5, 0], [i * 3 + 3, 5, 10], { permeability: 0.9, name: `S${i}` }));
    comps.forEach((c, i) => {
      if (i + 1 < comps.length) c.openings = [{ id: tid(), toCompartmentId: comps[i + 1].id, position: { x: i * 3 + 3, y: 0, z: 1 }, areaM2: 0.01 }];
    });
    comps[0].breaches = [{ id: tid(), position: { x: 1.5, y: -5, z: 1 }, areaM2: 0.05, face: 'starboard' }];
    s.compartments.push(...comps);
    s.conditions[0].contents.push(contents(comps[30].id, [{ fluidId: 'sea-water', z: 4 }]), contents(comps[40].id, [{ fluidId: 'diesel', z: 2 }]));
    const band = forecastFlooding(s, { horizonH: 6, outputSteps: 6 });
    const dense = forecastFlooding(s, { horizonH: 6, outputSteps: 6, denseLinearAlgebra: true });
    band.spaces.forEach((sp, k) => sp.levelM.forEach((l, i) => expect(Math.abs(l - dense.spaces[k].levelM[i])).toBeLessThan(1e-6)));
    expect(band.balance.relative).toBeLessThan(1e-9);
  }, 120_000);
});
