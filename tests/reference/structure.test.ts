/**
 * Structural checks against published values: AISC available critical stresses, an NDS column
 * worked by hand from the standard's equation, rectangular-plate bending against the Navier
 * double-series solution and Timoshenko's tables, and continuous beams against the AISC Manual's
 * beam diagrams.
 */
import { describe, expect, it } from 'vitest';
import { computeSurvey } from '@shared/engine';
import { aiscE3, ndsColumnStability } from '@shared/engine/column-design';
import { panelStress } from '@shared/engine/plating';
import { pointDeflection } from '@shared/engine/shore-stiffener';
import { PSI_PA } from '@shared/units/units';
import { baseSurvey, boxCompartment, tid } from '../unit/engine/fixtures';

const KSI = 1000 * PSI_PA;
const E_STEEL_KSI = 29000; // AISC 360-16 §E3 uses E = 29,000 ksi

describe('steel shores: AISC 360-16 §E3 against AISC Manual Table 4-22 (available critical stress, from memory)', () => {
  // [KL/r, Fy ksi, Fcr/Ωc ksi (ASD), φc Fcr ksi (LRFD)] as printed in Table 4-22, 15th ed., from memory
  const rows: [number, number, number, number][] = [
    [50, 50, 25.0, 37.5],
    [100, 50, 14.4, 21.7],
    [150, 50, 6.68, 10.0],
    [200, 50, 3.76, 5.65],
    [100, 36, 12.7, 19.1],
  ];
  it.each(rows)('KL/r %d, Fy %d ksi: ASD %f ksi, LRFD %f ksi', (klr, fy, asd, lrfd) => {
    const r = aiscE3(klr, fy * KSI, E_STEEL_KSI * KSI);
    // the table prints three significant figures
    expect(Math.abs(r.asdPa / KSI - asd)).toBeLessThanOrEqual(0.006 * asd);
    expect(Math.abs(r.lrfdPa / KSI - lrfd)).toBeLessThanOrEqual(0.006 * lrfd);
  });
  it('switches from the inelastic to the elastic curve at KL/r = 4.71 √(E/Fy) (113 for Fy 50 ksi, AISC 360-16 §E3)', () => {
    expect(aiscE3(113, 50 * KSI, E_STEEL_KSI * KSI).inelastic).toBe(true);
    expect(aiscE3(114, 50 * KSI, E_STEEL_KSI * KSI).inelastic).toBe(false);
  });
});

describe('timber shores: NDS-2018 §3.7.1 column stability factor', () => {
  it('4x4 Douglas Fir-Larch No. 2, le = 10 ft (Fc 1,350 psi, CF 1.15, Emin 580,000 psi: NDS Supplement Table 4A, from memory; worked by hand with Eq. 3.7-1)', () => {
    // le/d = 120 / 3.5 = 34.29; FcE = 0.822 × 580,000 / 34.29² = 405.6 psi; Fc* = 1,350 × 1.15 = 1,552.5 psi;
    // FcE/Fc* = 0.2612; (1 + 0.2612) / 1.6 = 0.7883; Cp = 0.7883 − √(0.7883² − 0.2612 / 0.8) = 0.2453;
    // Fc' = 380.8 psi; P = 380.8 × 12.25 in² = 4,665 lb.
    const r = ndsColumnStability(120 / 3.5, 1350 * 1.15 * PSI_PA, 580000 * PSI_PA, 0.8);
    expect(r.fcePa / PSI_PA).toBeCloseTo(405.6, 1);
    expect(r.cp).toBeCloseTo(0.2453, 4);
    expect((r.fcPrimePa / PSI_PA) * 12.25).toBeCloseTo(4665, -1);
  });
  it('a stocky column keeps nearly all its crushing strength, and Cp never exceeds 1 (NDS §3.7.1)', () => {
    expect(ndsColumnStability(2, 10e6, 4e9).cp).toBeGreaterThan(0.99);
    expect(ndsColumnStability(2, 10e6, 4e9).cp).toBeLessThanOrEqual(1);
  });
});

/**
 * Navier's double-series solution of a simply supported rectangular plate (Timoshenko &
 * Woinowsky-Krieger, Theory of Plates and Shells, §30): an independent method, here evaluated to
 * convergence. Returns the largest of σx, σy (= 6 M / t², t = 1) over a grid, for a load given by
 * its sine coefficients q_mn.
 */
function navierMaxStress(a: number, b: number, qmn: (m: number, n: number) => number, nu = 0.3, terms = 79, grid = 24): number {
  let best = 0;
  for (let i = 1; i < grid; i++) {
    for (let j = 1; j < grid; j++) {
      const x = (a * i) / grid, y = (b * j) / grid;
      let mx = 0, my = 0;
      for (let m = 1; m <= terms; m++) {
        for (let n = 1; n <= terms; n++) {
          const q = qmn(m, n);
          if (q === 0) continue;
          const am = (m * Math.PI) / a, bn = (n * Math.PI) / b;
          const wmn = q / (am * am + bn * bn) ** 2; // × 1/D
          const s = Math.sin(am * x) * Math.sin(bn * y) * wmn;
          mx += s * (am * am + nu * bn * bn);
          my += s * (bn * bn + nu * am * am);
        }
      }
      best = Math.max(best, 6 * Math.abs(mx), 6 * Math.abs(my));
    }
  }
  return best;
}
const odd = (k: number) => k % 2 === 1;
const uniform = (m: number, n: number) => (odd(m) && odd(n) ? 16 / (Math.PI * Math.PI * m * n) : 0);
/** q = x / a (rising along the side of length a). */
const risingAlongA = (m: number, n: number) => (odd(n) ? (8 * (m % 2 === 1 ? 1 : -1)) / (Math.PI * Math.PI * m * n) : 0);

describe("plating: rectangular-plate coefficients (Roark's Table 11.4) against the Navier solution", () => {
  it('uniform load, simply supported, a/b = 1 and 2: σ = 0.2874 and 0.6102 q b²/t² (Timoshenko Table 8, ν = 0.3, from memory)', () => {
    expect(panelStress(1, 1, 1, 'simply-supported', { qMin: 1, dLong: 0, dShort: 0 })).toBeCloseTo(0.2874, 3);
    expect(panelStress(2, 1, 1, 'simply-supported', { qMin: 1, dLong: 0, dShort: 0 })).toBeCloseTo(0.6102, 3);
    expect(navierMaxStress(1, 1, uniform)).toBeCloseTo(0.2874, 2);
    expect(navierMaxStress(2, 1, uniform)).toBeCloseTo(0.6102, 2);
  });
  it.each([1, 1.5, 2, 3])('load rising along the long side and along the short side, a/b = %f: within 5 percent of Navier', (r) => {
    const alongLong = panelStress(r, 1, 1, 'simply-supported', { qMin: 0, dLong: 1, dShort: 0 });
    const alongShort = panelStress(r, 1, 1, 'simply-supported', { qMin: 0, dLong: 0, dShort: 1 });
    const navLong = navierMaxStress(r, 1, risingAlongA);
    const navShort = navierMaxStress(1, r, risingAlongA);
    expect(Math.abs(alongLong / navLong - 1)).toBeLessThan(0.05);
    expect(Math.abs(alongShort / navShort - 1)).toBeLessThan(0.05);
  });
  it('a plate much longer than wide tends to the strip values 0.75 (uniform) and 6/(9√3) (triangular across) q b²/t² (beam theory)', () => {
    expect(panelStress(20, 1, 1, 'simply-supported', { qMin: 1, dLong: 0, dShort: 0 })).toBeCloseTo(0.75, 3);
    expect(panelStress(20, 1, 1, 'simply-supported', { qMin: 0, dLong: 0, dShort: 1 })).toBeCloseTo(0.3849, 3);
    // clamped long strip: edge moment q b²/12, σ = 0.5 q b²/t² (beam theory)
    expect(panelStress(20, 1, 1, 'fixed', { qMin: 1, dLong: 0, dShort: 0 })).toBeCloseTo(0.5, 6);
  });
});

/** A level deck under a uniform gas pressure from below, one stiffener along x under it, shores under it. */
function deckWithStiffener(fixity: 'simply-supported' | 'fixed', shoreXs: number[], p = 20e3) {
  const s = baseSurvey({ aft: -50, fwd: -50 });
  const c = boxCompartment([0, -1, -5], [12, 1, 0]);
  s.compartments.push(c);
  s.conditions[0].contents.push({ compartmentId: c.id, layers: [], gas: { kind: 'pressurised', gaugePressurePa: p } });
  s.boundaries.push({
    id: tid(),
    name: 'deck',
    kind: 'deck',
    // normal +z: side A below (the pressurised space), side B above (air)
    geometry: { kind: 'rectangle', origin: { x: 0, y: -1, z: 0 }, edgeU: { x: 12, y: 0, z: 0 }, edgeV: { x: 0, y: 2, z: 0 } },
    sideA: { kind: 'compartment', compartmentId: c.id },
    sideB: { kind: 'air' },
    stiffening: { direction: { x: 1, y: 0, z: 0 }, spacingM: 1, endFixity: fixity, sectionModulusM3: 500e-6, allowableStressPa: 160e6 },
    shores: shoreXs.map((x) => ({
      id: tid(), position: { x, y: 0, z: 0 }, lengthM: 3, section: { kind: 'tube' as const, outerDiameterM: 0.15, wallThicknessM: 0.008 },
      elasticModulusPa: 200e9, allowableStressPa: 150e6, endCondition: 'pinned-pinned' as const, side: 'B' as const,
      design: { method: 'aisc-360-e3' as const, yieldStressPa: 235e6 },
    })),
  });
  return computeSurvey(s).boundaries[0];
}

describe('shores on stiffeners: indeterminate beams against the AISC Manual beam diagrams (Tables 3-22, 3-23)', () => {
  it('two equal spans, uniform load: middle reaction 10/8 wL, ends 3/8 wL, support moment wL²/8 (Table 3-22a, from memory)', () => {
    const r = deckWithStiffener('simply-supported', [6]);
    const w = 1 * 20e3, L = 6; // the stiffener carries 1 m of plate (half way to each edge)
    expect(r.shores[0].bearsOn).toBe('stiffener');
    expect(r.shores[0].tributaryForceN).toBeCloseTo(1.25 * w * L, 4);
    const st = r.stiffeners!.items[0];
    expect(st.reactionStartN).toBeCloseTo(0.375 * w * L, 4);
    expect(Math.abs(st.maxMomentNm)).toBeCloseTo((w * L * L) / 8, 4);
  });
  it('fixed ends with a support at mid-length: each half is a fixed-ended span, reaction wL, moment wL²/12 (Table 3-23 case 15, from memory)', () => {
    const r = deckWithStiffener('fixed', [6]);
    const w = 20e3, L = 6;
    expect(r.shores[0].tributaryForceN).toBeCloseTo(w * L, 4);
    expect(Math.abs(r.stiffeners!.items[0].maxMomentNm)).toBeCloseTo((w * L * L) / 12, 4);
  });
  it('three equal spans, uniform load: inner reactions 1.10 wL, outer 0.40 wL (Table 3-22b, from memory)', () => {
    const r = deckWithStiffener('simply-supported', [4, 8]);
    const w = 20e3, L = 4;
    expect(r.shores[0].tributaryForceN).toBeCloseTo(1.1 * w * L, 3);
    expect(r.stiffeners!.items[0].reactionStartN).toBeCloseTo(0.4 * w * L, 3);
  });
  it('point-load deflections: PL³/48EI simply supported, PL³/192EI fixed at mid-span (Table 3-23 cases 7 and 16)', () => {
    expect(pointDeflection(6, 'simply-supported', 3, 3)).toBeCloseTo(216 / 48, 12);
    expect(pointDeflection(6, 'fixed', 3, 3)).toBeCloseTo(216 / 192, 12);
  });
  it('a shore pulled away from its stiffener is dropped and carries nothing (shores push only)', () => {
    const r = deckWithStiffener('simply-supported', [6], -20e3);
    expect(r.shores[0].tributaryForceN).toBe(0);
    expect(r.shores[0].loaded).toBe(false);
  });
});
