/**
 * Checks of the engine against published values and textbook formulas. Each check names its
 * source; "from memory" marks values recalled rather than read from the source at hand.
 */
import { describe, expect, it } from 'vitest';
import { eigs } from 'mathjs';
import { computeSurvey } from '@shared/engine';
import { solveBeam } from '@shared/engine/beam';
import { circleStripMoments, polygonMoments, polygonSuu } from '@shared/engine/plane-integrals';
import { EFFECTIVE_LENGTH_FACTOR, eulerLoad } from '@shared/engine/shore';
import { catalogueFluid, crudeDensityFromApi } from '@shared/fluids/catalogue';
import { DEFAULT_PERMEABILITY } from '@shared/schemas/space-types';
import { STANDARD_GRAVITY_M_S2 } from '@shared/units/units';
import { baseSurvey, boxCompartment, contents, polygonBoundary } from '../unit/engine/fixtures';

const G = 9.80665;

describe('published constants', () => {
  it('standard gravity', () => {
    // 3rd CGPM (1901), declaration on the unit of mass and definition of weight: g_n = 980.665 cm/s²
    expect(STANDARD_GRAVITY_M_S2).toBe(9.80665);
  });

  it('ISO 8217 maximum densities at 15 °C', () => {
    // ISO 8217 (marine fuels), Tables 1 and 2 (from memory): DMA 890, DMB 900, RMG 991, RMK 1010 kg/m³
    expect(catalogueFluid('dma')?.densityKgM3).toBe(890);
    expect(catalogueFluid('dmb')?.densityKgM3).toBe(900);
    expect(catalogueFluid('rmg')?.densityKgM3).toBe(991);
    expect(catalogueFluid('rmk')?.densityKgM3).toBe(1010);
    expect(catalogueFluid('sea-water')?.densityKgM3).toBe(1025);
  });

  it('crude density from API gravity', () => {
    // API gravity definition: °API = 141.5/SG(60 °F) − 131.5; 10 °API is SG 1.0 by construction
    expect(crudeDensityFromApi(10)).toBeCloseTo(999.016, 9);
    expect(crudeDensityFromApi(35)).toBeCloseTo((141.5 / 166.5) * 999.016, 9);
  });

  it('SOLAS II-1 Reg. 7-3 permeabilities', () => {
    // SOLAS Chapter II-1, Regulation 7-3, Table (from memory); also 46 CFR 172.240 uses similar values
    expect(DEFAULT_PERMEABILITY.stores).toBe(0.6);
    expect(DEFAULT_PERMEABILITY.accommodation).toBe(0.95);
    expect(DEFAULT_PERMEABILITY.machinery).toBe(0.85);
    expect(DEFAULT_PERMEABILITY.void).toBe(0.95);
    expect(DEFAULT_PERMEABILITY['dry-cargo']).toBe(0.7);
    expect(DEFAULT_PERMEABILITY.tank).toBe(0.95);
  });
});

describe('section properties (Roark\'s Formulas for Stress and Strain, Table A.1, from memory)', () => {
  it('rectangle: I about centroid = b h³/12', () => {
    const b = 3, h = 2;
    const m = polygonMoments([0, 0, b, 0, b, h, 0, h]);
    const yc = m.sv / m.a;
    expect(m.a).toBeCloseTo(b * h, 12);
    expect(m.svv - m.a * yc * yc).toBeCloseTo((b * h ** 3) / 12, 12);
  });

  it('triangle: I about centroid = b h³/36, centroid at h/3', () => {
    const b = 4, h = 3;
    const m = polygonMoments([0, 0, b, 0, 1.3, h]);
    const yc = m.sv / m.a;
    expect(yc).toBeCloseTo(h / 3, 12);
    expect(m.svv - m.a * yc * yc).toBeCloseTo((b * h ** 3) / 36, 12);
  });

  it('circle: I = π r⁴/4, exact from circular segments', () => {
    const r = 0.7;
    const m = circleStripMoments(0, 0, r, -r, r);
    expect(Math.abs(m.a / (Math.PI * r * r) - 1)).toBeLessThan(1e-12);
    expect(Math.abs(m.svv / ((Math.PI * r ** 4) / 4) - 1)).toBeLessThan(1e-12);
  });

  it('semicircle: centroid 4r/3π from the diameter, I about centroid ≈ 0.1098 r⁴', () => {
    const r = 1.5;
    const m = circleStripMoments(0, 0, r, 0, r);
    const yc = m.sv / m.a;
    expect(yc).toBeCloseTo((4 * r) / (3 * Math.PI), 12);
    const ic = m.svv - m.a * yc * yc;
    expect(ic / r ** 4).toBeCloseTo(Math.PI / 8 - 8 / (9 * Math.PI), 12);
    expect(ic / r ** 4).toBeCloseTo(0.1098, 4);
  });

  it('polygon ∫u² agrees with the rectangle formula', () => {
    expect(polygonSuu([-1, 0, 1, 0, 1, 3, -1, 3])).toBeCloseTo((3 * 2 ** 3) / 12, 12);
  });
});

function tankWithPlate(level: number, rho: number, vertices: [number, number, number][]) {
  const s = baseSurvey({ aft: 0, fwd: 0 });
  const c = boxCompartment([-50, -50, -50], [50, 50, 50]);
  s.compartments.push(c);
  s.conditions[0].contents.push(contents(c.id, [{ fluidId: 'fresh-water', z: level, densityKgM3: rho }]));
  s.boundaries.push(polygonBoundary(vertices, { kind: 'compartment', compartmentId: c.id }, { kind: 'air' }));
  return computeSurvey(s).boundaries[0];
}

describe('plane gates (White, Fluid Mechanics, §2.5 hydrostatic forces on plane surfaces; formulas from memory)', () => {
  it('vertical rectangular gate: F = ρ g (d + h/2) b h, y_cp = y_c + I/(y_c A)', () => {
    const rho = 998, b = 2, h = 3, d = 1.5, level = 10;
    const top = level - d;
    const r = tankWithPlate(level, rho, [
      [0, 0, top - h],
      [0, b, top - h],
      [0, b, top],
      [0, 0, top],
    ]);
    const yc = d + h / 2;
    const F = rho * G * yc * b * h;
    const ycp = yc + (b * h ** 3) / 12 / (yc * b * h);
    expect(r.net.forceN).toBeCloseTo(F, 6);
    expect(level - r.net.centreOfPressure!.z).toBeCloseTo(ycp, 12);
  });

  it('inclined rectangular gate at 30° from horizontal, F = ρ g h_c A, depth of CoP along the slope y_c + I/(y_c A)', () => {
    const rho = 1000, b = 1.2, L = 2, theta = Math.PI / 6, level = 5;
    // gate from slope distance 1 m to 3 m below the free surface
    const s0 = 1, s1 = 3;
    const P = (s: number, y: number): [number, number, number] => [s * Math.cos(theta), y, level - s * Math.sin(theta)];
    const r = tankWithPlate(level, rho, [P(s0, 0), P(s1, 0), P(s1, b), P(s0, b)]);
    const A = b * L;
    const yc = (s0 + s1) / 2;
    const F = rho * G * yc * Math.sin(theta) * A;
    const ycp = yc + (b * L ** 3) / 12 / (yc * A);
    expect(Math.abs(r.net.forceN)).toBeCloseTo(F, 6);
    const cop = r.net.centreOfPressure!;
    expect((level - cop.z) / Math.sin(theta)).toBeCloseTo(ycp, 10);
  });

  it('vertical circular gate, top at depth d: F = ρ g (d + r) π r², exact to 1e-6', () => {
    const s = baseSurvey({ aft: 0, fwd: 0 });
    const c = boxCompartment([-50, -50, -50], [50, 50, 50]);
    s.compartments.push(c);
    s.conditions[0].contents.push(contents(c.id, [{ fluidId: 'fresh-water', z: 0, densityKgM3: 1000 }]));
    const r = 0.45, d = 0.8;
    s.boundaries.push({
      id: '00000000-0000-4000-8000-0000000ff001',
      name: 'circular gate',
      kind: 'door',
      geometry: { kind: 'circle', centre: { x: 0, y: 0, z: -(d + r) }, normal: { x: 1, y: 0, z: 0 }, radiusM: r },
      sideA: { kind: 'compartment', compartmentId: c.id },
      sideB: { kind: 'air' },
    });
    const b = computeSurvey(s).boundaries[0];
    const yc = d + r;
    expect(Math.abs(b.net.forceN / (1000 * G * yc * Math.PI * r * r) - 1)).toBeLessThan(1e-9);
    const ycp = yc + (Math.PI * r ** 4) / 4 / (yc * Math.PI * r * r);
    expect(Math.abs(-b.net.centreOfPressure!.z / ycp - 1)).toBeLessThan(1e-9);
  });
});

describe('curved surfaces', () => {
  it('vertical force on a curved surface equals the weight of liquid above it (White §2.6, from memory)', () => {
    // quarter-cylinder bottom (radius R, length Lx) under water to z = H, built from N flat facets;
    // liquid above the faceted surface is an exact polygon, so the comparison is exact
    const R = 2, Lx = 3, H = 4, N = 24, rho = 1025;
    const s = baseSurvey({ aft: 0, fwd: 0 });
    const c = boxCompartment([-10, -10, -10], [10, 10, 10]);
    s.compartments.push(c);
    s.conditions[0].contents.push(contents(c.id, [{ fluidId: 'sea-water', z: H, densityKgM3: rho }]));
    const arc: [number, number][] = [];
    for (let i = 0; i <= N; i++) {
      const a = Math.PI + (i * Math.PI) / 2 / N;
      arc.push([R * Math.cos(a), R + R * Math.sin(a)]); // y from −R to 0, z from R down to 0
    }
    const facets = [];
    for (let i = 0; i < N; i++) {
      const [y0, z0] = arc[i], [y1, z1] = arc[i + 1];
      facets.push({ vertices: [{ x: 0, y: y0, z: z0 }, { x: 0, y: y1, z: z1 }, { x: Lx, y: y1, z: z1 }, { x: Lx, y: y0, z: z0 }] });
    }
    s.boundaries.push({
      id: '00000000-0000-4000-8000-0000000ff002',
      name: 'bilge',
      kind: 'shell',
      geometry: { kind: 'faceted', facets },
      sideA: { kind: 'compartment', compartmentId: c.id },
      sideB: { kind: 'air' },
    });
    const b = computeSurvey(s).boundaries[0];
    // area in y–z between the faceted arc and the level z = H, over y ∈ [−R, 0]
    const poly: number[] = [];
    for (const [y, z] of arc) poly.push(y, z);
    poly.push(0, H, -R, H);
    const area = Math.abs(polygonMoments(poly).a);
    const weight = rho * G * area * Lx;
    expect(Math.abs(Math.abs(b.net.verticalN) / weight - 1)).toBeLessThan(1e-12);
    // and it converges to the smooth result: (H R − R² + π R²/4) L
    expect(Math.abs(b.net.verticalN) / (rho * G * (H * R - R * R + (Math.PI * R * R) / 4) * Lx)).toBeCloseTo(1, 2);
  });
});

describe('beams (AISC Steel Construction Manual, Table 3-23, from memory)', () => {
  const L = 6, w = 10e3;
  it('diagram 1: simple beam, uniform load: M = wL²/8 at mid-span, R = wL/2', () => {
    const r = solveBeam([0, L], [w, w], 'simply-supported');
    expect(r.maxMomentNm).toBeCloseTo((w * L * L) / 8, 6);
    expect(r.maxMomentAtM).toBeCloseTo(L / 2, 9);
    expect(r.reactionStartN).toBeCloseTo((w * L) / 2, 6);
  });
  it('diagram 2: simple beam, load increasing uniformly to one end: M = 0.1283 W L at x = L/√3, R1 = W/3, R2 = 2W/3', () => {
    const r = solveBeam([0, L], [0, w], 'simply-supported');
    const W = (w * L) / 2;
    expect(r.maxMomentNm).toBeCloseTo((2 * W * L) / (9 * Math.sqrt(3)), 6);
    expect(r.maxMomentNm / (W * L)).toBeCloseTo(0.1283, 4);
    expect(r.maxMomentAtM).toBeCloseTo(L / Math.sqrt(3), 9);
    expect(r.reactionStartN).toBeCloseTo(W / 3, 6);
    expect(r.reactionEndN).toBeCloseTo((2 * W) / 3, 6);
  });
  it('diagram 3: simple beam, load increasing uniformly to centre: M = W L/6', () => {
    const r = solveBeam([0, L / 2, L], [0, w, 0], 'simply-supported');
    const W = (w * L) / 2;
    expect(r.maxMomentNm).toBeCloseTo((W * L) / 6, 6);
  });
  it('diagram 15: fixed both ends, uniform load: ends wL²/12, centre wL²/24', () => {
    const r = solveBeam([0, L], [w, w], 'fixed');
    expect(r.endMomentStartNm).toBeCloseTo((-w * L * L) / 12, 6);
    expect(r.endMomentEndNm).toBeCloseTo((-w * L * L) / 12, 6);
    expect(Math.abs(r.maxMomentNm)).toBeCloseTo((w * L * L) / 12, 6);
    const partial = solveBeam([0, L / 2, L], [w, w, w], 'fixed');
    expect(partial.reactionStartN).toBeCloseTo((w * L) / 2, 6);
  });
  it('fixed both ends, triangular load: fixed-end moments wL²/30 and wL²/20 (standard fixed-end moment tables)', () => {
    const r = solveBeam([0, L], [0, w], 'fixed');
    expect(r.endMomentStartNm).toBeCloseTo((-w * L * L) / 30, 6);
    expect(r.endMomentEndNm).toBeCloseTo((-w * L * L) / 20, 6);
  });
});

describe('Euler buckling (AISC Specification Commentary, Table C-A-7.1 recommended K, from memory)', () => {
  it('K values', () => {
    expect(EFFECTIVE_LENGTH_FACTOR['pinned-pinned']).toBe(1.0);
    expect(EFFECTIVE_LENGTH_FACTOR['fixed-fixed']).toBe(0.65);
    expect(EFFECTIVE_LENGTH_FACTOR['fixed-pinned']).toBe(0.8);
    expect(EFFECTIVE_LENGTH_FACTOR['fixed-free']).toBe(2.1);
  });
  it('the pinned column load is the least eigenvalue of E I y″ + P y = 0, found numerically by mathjs (not the closed form)', () => {
    // central differences on n inner points: P_cr ≈ E I λ_min(T / h²), T = tridiag(−1, 2, −1); the
    // discretisation error is about (π h / L)² / 12 relative, under 3e-4 here
    const E = 11e9, b = 0.2, I = b ** 4 / 12, L = 5, n = 59, h = L / (n + 1);
    const T = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (i === j ? 2 : Math.abs(i - j) === 1 ? -1 : 0) / (h * h)));
    const values = eigs(T).values as number[];
    const pcr = E * I * Math.min(...values);
    expect(Math.abs(eulerLoad(E, I, 1, L) / pcr - 1)).toBeLessThan(5e-4);
    // K scales the length: a K of 2.1 is a pinned column 2.1 times as long
    const longer = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => T[i][j] / (2.1 * 2.1)));
    expect(Math.abs(eulerLoad(E, I, 2.1, L) / (E * I * Math.min(...(eigs(longer).values as number[]))) - 1)).toBeLessThan(5e-4);
  });
});
