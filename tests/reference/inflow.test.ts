/**
 * Inflow and pumping against outside references: Torricelli's law with a discharge coefficient,
 * ordinary least squares on Anscombe's published data set, and a hand-checkable pumping sum.
 */
import { describe, expect, it } from 'vitest';
import { computeSurvey } from '@shared/engine';
import { timeToPumpOut } from '@shared/engine/inflow';
import { leastSquares } from '@shared/engine/flooding-soundings';
import { baseSurvey, boxCompartment, tid } from '../unit/engine/fixtures';

const G = 9.80665; // standard gravity, 3rd CGPM (1901)

describe('orifice inflow', () => {
  it("follows Torricelli's law Q = C_d A √(2 g h) (White, Fluid Mechanics, orifice flow; C_d 0.6 sharp-edged, from memory)", () => {
    // A 0.25 m² hole 4 m below the waterline into an empty space, sea water 1025 kg/m³.
    // Level keel, draft 5 m; an empty box with the hole at z = 1 m: 4 m of head.
    const s = baseSurvey({ aft: 5, fwd: 5 });
    const c = boxCompartment([10, -5, 0], [20, 5, 10], { breaches: [{ id: tid(), position: { x: 15, y: -5, z: 1 }, areaM2: 0.25 }] });
    s.compartments.push(c);
    const q = computeSurvey(s).compartments[0].inflow!.orificeInflowM3S;
    // 0.6 × 0.25 × √(2 × 9.80665 × 4) = 0.15 × 8.85739 = 1.32861 m³/s = 4,783.0 m³/h (worked by hand).
    expect(Math.abs(q * 3600 - 4783.0)).toBeLessThan(0.05);
  });

  it('a breach in a compartment takes the head from the outside waterline and the water already inside', () => {
    // Level keel, draft 6 m; a breach at z = 1 m into a box holding sea water up to z = 2 m:
    // head 6 − 2 = 4 m of sea water, so Q = 0.6 A √(2 g × 4).
    const s = baseSurvey({ aft: 6, fwd: 6 });
    const c = boxCompartment([10, -5, 0], [20, 5, 10], {
      breaches: [{ id: tid(), position: { x: 15, y: -5, z: 1 }, areaM2: 0.1 }],
      pumps: [{ id: tid(), name: 'portable pump', capacityM3S: 1.0 }],
    });
    s.compartments.push(c);
    s.conditions[0].contents.push({
      compartmentId: c.id,
      layers: [{ id: tid(), fluidId: 'sea-water', level: { kind: 'point', point: { x: 15, y: 0, z: 2 } } }],
      gas: { kind: 'vented' },
    });
    const inflow = computeSurvey(s).compartments[0].inflow!;
    expect(inflow.breaches[0].headM).toBeCloseTo(4, 9);
    // 0.6 × 0.1 × √(2 × 9.80665 × 4) = 0.06 × 8.857381 = 0.531443 m³/s (worked by hand)
    expect(inflow.orificeInflowM3S).toBeCloseTo(0.531443, 6);
    const q = 0.531443;
    // The pumps beat the inflow, but the inflow grows as the level falls (head 4 m now, 5 m once the
    // surface is below the hole): the time lies between volume / (pumps − inflow now) and
    // volume / (pumps − inflow at 5 m); "dry" is when the pump starts to lose suction, with its last
    // minute's capacity (60 m³ here) above the suction (bounds worked by hand).
    const volume = 10 * 10 * 2 * 0.7; // dry-cargo permeability 0.70 (SOLAS II-1 Reg. 7-3)
    const qMax = 0.6 * 0.1 * Math.sqrt(2 * G * 5);
    expect(inflow.timeToPumpOutS!).toBeGreaterThan((volume - 60 * 1.0) / (1.0 - q));
    expect(inflow.timeToPumpOutS!).toBeLessThan(volume / (1.0 - qMax));
  });
});

describe('inflow measured from soundings', () => {
  it("ordinary least squares reproduces Anscombe's published fit (Anscombe 1973, data set I: y = 3.00 + 0.500 x, r² = 0.67)", () => {
    const x = [10, 8, 13, 9, 11, 14, 6, 4, 12, 7, 5];
    const y = [8.04, 6.95, 7.58, 8.81, 8.33, 9.96, 7.24, 4.26, 10.84, 4.82, 5.68];
    const fit = leastSquares(x, y);
    expect(fit.slope).toBeCloseTo(0.5, 3);
    expect(fit.intercept).toBeCloseTo(3.0, 2);
    expect(fit.r2).toBeCloseTo(0.67, 2);
  });

  it('pumps that cannot gain on the inflow give no pump-out time (common practice, no source)', () => {
    expect(timeToPumpOut(100, 0.1, 0.2)).toBeNull();
    expect(timeToPumpOut(100, 0.3, 0.1)).toBeCloseTo(500, 9);
    expect(timeToPumpOut(0, 0, 1)).toBe(0);
  });
});
