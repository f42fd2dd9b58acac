/**
 * Property test: the engine's exact plate integrals against an independent brute-force quadrature
 * written here (subdivided triangles with the centroid rule for polygons, a polar midpoint grid for
 * circles; pressure from Pascal's law evaluated point by point). Random plates, layers, gas
 * pressures, heels and trims from a seeded PRNG, so the test is deterministic. Tolerance 1e-4
 * relative to ∫|p| dA.
 */
import { describe, expect, it } from 'vitest';
import { computeSurvey } from '@shared/engine';
import type { Boundary } from '@shared/schemas/survey';
import { baseSurvey, boxCompartment, contents } from '../unit/engine/fixtures';
import { pascalPressure } from '../support/pascal';
import { prng } from '../support/prng';

type P3 = [number, number, number];

interface Side {
  layers: { top: number; rho: number }[]; // tops as elevations, bottom-up
  gas: number;
}

/** Pascal's law directly: gas pressure plus every liquid above the point. */
const pressure = (side: Side, e: number, g: number): number => pascalPressure(side.layers, side.gas, e, g);

const G = 9.80665;

interface Brute {
  force: number;
  abs: number;
  moment: P3; // ∫ p (r − c) dA as a vector, about c
  absArm: number; // ∫ |p| |r − c| dA
}

function bruteTriangles(tris: [P3, P3, P3][], field: (r: P3) => number, c: P3, n: number): Brute {
  let force = 0, abs = 0, armAbs = 0;
  const M: P3 = [0, 0, 0];
  for (const [A, B, C] of tris) {
    const ab: P3 = [B[0] - A[0], B[1] - A[1], B[2] - A[2]];
    const ac: P3 = [C[0] - A[0], C[1] - A[1], C[2] - A[2]];
    const cr: P3 = [ab[1] * ac[2] - ab[2] * ac[1], ab[2] * ac[0] - ab[0] * ac[2], ab[0] * ac[1] - ab[1] * ac[0]];
    const dA = Math.hypot(...cr) / 2 / (n * n);
    const at = (i: number, j: number): P3 => [A[0] + (i * ab[0] + j * ac[0]) / n, A[1] + (i * ab[1] + j * ac[1]) / n, A[2] + (i * ab[2] + j * ac[2]) / n];
    const add = (p: P3, q: P3, r: P3) => {
      const m: P3 = [(p[0] + q[0] + r[0]) / 3, (p[1] + q[1] + r[1]) / 3, (p[2] + q[2] + r[2]) / 3];
      const f = field(m) * dA;
      force += f;
      abs += Math.abs(f);
      const d: P3 = [m[0] - c[0], m[1] - c[1], m[2] - c[2]];
      M[0] += f * d[0];
      M[1] += f * d[1];
      M[2] += f * d[2];
      armAbs += Math.abs(f) * Math.hypot(...d);
    };
    for (let i = 0; i < n; i++) {
      for (let j = 0; i + j < n; j++) {
        add(at(i, j), at(i + 1, j), at(i, j + 1));
        if (i + j < n - 1) add(at(i + 1, j), at(i + 1, j + 1), at(i, j + 1));
      }
    }
  }
  return { force, abs, moment: M, absArm: armAbs };
}

function randomCase(rand: () => number) {
  const heel = (rand() - 0.5) * 30;
  const aft = 4 + rand() * 4, fwd = 4 + rand() * 4;
  const s = baseSurvey({ aft, fwd, heelDeg: heel });
  // independent earth-up from the documented convention
  const tanT = (aft - fwd) / 100, tanH = Math.tan((heel * Math.PI) / 180);
  const nrm = Math.hypot(tanT, tanH, 1);
  const up: P3 = [tanT / nrm, tanH / nrm, 1 / nrm];
  const elev = (p: P3) => p[0] * up[0] + p[1] * up[1] + p[2] * up[2];
  const centre: P3 = [30 + rand() * 40, (rand() - 0.5) * 10, 3 + rand() * 6];

  const makeSide = (): { side: Boundary['sideA']; model: Side } => {
    const kind = rand();
    if (kind < 0.2) return { side: { kind: 'air' }, model: { layers: [], gas: 0 } };
    if (kind < 0.4) {
      return { side: { kind: 'sea' }, model: { layers: [{ top: elev([0, 0, aft]), rho: 1025 }], gas: 0 } };
    }
    const c = boxCompartment([-200, -200, -200], [200, 200, 200]);
    s.compartments.push(c);
    const n = 1 + Math.floor(rand() * 3);
    const zs = Array.from({ length: n }, () => centre[2] + (rand() - 0.5) * 8).sort((a, b) => a - b);
    const rhos = zs.map(() => 700 + rand() * 400);
    const gas = rand() < 0.5 ? 0 : (rand() - 0.5) * 40e3;
    s.conditions[0].contents.push(contents(c.id, zs.map((z, i) => ({ fluidId: 'sea-water', z, densityKgM3: rhos[i] })), gas));
    return {
      side: { kind: 'compartment', compartmentId: c.id },
      model: { layers: zs.map((z, i) => ({ top: elev([0, 0, z]), rho: rhos[i] })), gas },
    };
  };
  const A = makeSide(), B = makeSide();
  // random orthonormal plate axes
  const rnd3 = (): P3 => [rand() - 0.5, rand() - 0.5, rand() - 0.5];
  const unitv = (v: P3): P3 => {
    const l = Math.hypot(...v);
    return [v[0] / l, v[1] / l, v[2] / l];
  };
  const e1 = unitv(rnd3());
  let e2 = rnd3();
  const d = e2[0] * e1[0] + e2[1] * e1[1] + e2[2] * e1[2];
  e2 = unitv([e2[0] - d * e1[0], e2[1] - d * e1[1], e2[2] - d * e1[2]]);
  const field = (r: P3) => pressure(A.model, elev(r), G) - pressure(B.model, elev(r), G);
  return { s, A, B, e1, e2, centre, field };
}

// The brute-force sums take a few seconds of CPU; on a busy shared machine that can be many more, so
// these tests get a generous timeout (speed is measured in the benchmarks, not here).
const BRUTE_FORCE_TIMEOUT_MS = 120_000;

describe('exact plate integration vs brute-force quadrature (seeded random cases)', () => {
  it('random convex polygons, both sides, heel and trim: force and moment to 1e-4', () => {
    const rand = prng(20250314);
    for (let k = 0; k < 16; k++) {
      const { s, A, B, e1, e2, centre, field } = randomCase(rand);
      const nv = 3 + Math.floor(rand() * 6);
      const angles = Array.from({ length: nv }, () => rand() * 2 * Math.PI).sort((a, b) => a - b);
      const ra = 1 + rand() * 4, rb = 1 + rand() * 4;
      const verts: P3[] = angles.map((t) => {
        const a = ra * Math.cos(t), b = rb * Math.sin(t);
        return [centre[0] + a * e1[0] + b * e2[0], centre[1] + a * e1[1] + b * e2[1], centre[2] + a * e1[2] + b * e2[2]];
      });
      s.boundaries.push({
        id: '00000000-0000-4000-8000-00000000abcd',
        name: 'random',
        kind: 'bulkhead',
        geometry: { kind: 'polygon', vertices: verts.map(([x, y, z]) => ({ x, y, z })) },
        sideA: A.side,
        sideB: B.side,
      });
      const r = computeSurvey(s).boundaries[0];
      const tris: [P3, P3, P3][] = [];
      for (let i = 1; i + 1 < nv; i++) tris.push([verts[0], verts[i], verts[i + 1]]);
      const bf = bruteTriangles(tris, field, centre, 300);
      if (bf.abs === 0) {
        expect(r.net.resultantN).toBe(0);
        continue;
      }
      // normal from e1 × e2 (vertex order is counter-clockwise about it)
      const n: P3 = [e1[1] * e2[2] - e1[2] * e2[1], e1[2] * e2[0] - e1[0] * e2[2], e1[0] * e2[1] - e1[1] * e2[0]];
      const fv = r.net.forceVector;
      const fAlongN = fv.x * n[0] + fv.y * n[1] + fv.z * n[2];
      expect(Math.abs(fAlongN - bf.force) / bf.abs).toBeLessThan(1e-4);
      if (r.net.centreOfPressure) {
        const cop = r.net.centreOfPressure;
        const mE: P3 = [(cop.x - centre[0]) * r.net.forceN, (cop.y - centre[1]) * r.net.forceN, (cop.z - centre[2]) * r.net.forceN];
        const err = Math.hypot(mE[0] - bf.moment[0], mE[1] - bf.moment[1], mE[2] - bf.moment[2]);
        expect(err / bf.absArm).toBeLessThan(1e-4);
      }
      // positive and negative parts add up to the net
      expect(r.net.positive.forceN + r.net.negative.forceN).toBeCloseTo(r.net.forceN, 3);
    }
  }, BRUTE_FORCE_TIMEOUT_MS);

  it('random circles: force and moment to 1e-4 (polar midpoint grid)', () => {
    const rand = prng(7);
    for (let k = 0; k < 10; k++) {
      const { s, A, B, e1, e2, centre, field } = randomCase(rand);
      const R = 0.3 + rand() * 3;
      const n: P3 = [e1[1] * e2[2] - e1[2] * e2[1], e1[2] * e2[0] - e1[0] * e2[2], e1[0] * e2[1] - e1[1] * e2[0]];
      s.boundaries.push({
        id: '00000000-0000-4000-8000-00000000abce',
        name: 'random circle',
        kind: 'manhole',
        geometry: { kind: 'circle', centre: { x: centre[0], y: centre[1], z: centre[2] }, normal: { x: n[0], y: n[1], z: n[2] }, radiusM: R },
        sideA: A.side,
        sideB: B.side,
      });
      const r = computeSurvey(s).boundaries[0];
      const NR = 500, NT = 800;
      let force = 0, abs = 0, absArm = 0;
      const M: P3 = [0, 0, 0];
      for (let i = 0; i < NR; i++) {
        const rr = ((i + 0.5) * R) / NR;
        for (let j = 0; j < NT; j++) {
          const t = ((j + 0.5) * 2 * Math.PI) / NT;
          const a = rr * Math.cos(t), b = rr * Math.sin(t);
          const d: P3 = [a * e1[0] + b * e2[0], a * e1[1] + b * e2[1], a * e1[2] + b * e2[2]];
          const f = field([centre[0] + d[0], centre[1] + d[1], centre[2] + d[2]]) * rr * (R / NR) * ((2 * Math.PI) / NT);
          force += f;
          abs += Math.abs(f);
          absArm += Math.abs(f) * rr;
          M[0] += f * d[0];
          M[1] += f * d[1];
          M[2] += f * d[2];
        }
      }
      if (abs === 0) continue;
      expect(Math.abs(r.net.forceN - force) / abs).toBeLessThan(1e-4);
      if (r.net.centreOfPressure) {
        const cop = r.net.centreOfPressure;
        const err = Math.hypot((cop.x - centre[0]) * r.net.forceN - M[0], (cop.y - centre[1]) * r.net.forceN - M[1], (cop.z - centre[2]) * r.net.forceN - M[2]);
        expect(err / absArm).toBeLessThan(1e-4);
      }
    }
  }, BRUTE_FORCE_TIMEOUT_MS);
});
