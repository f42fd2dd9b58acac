/**
 * The structural checks as the brief and the report word them (shared/review/structure-rows.ts):
 * every figure against a value worked by hand from an outside source, every figure with its unit,
 * every rating with its direction.
 */
import { describe, expect, it } from 'vitest';
import { boundaryRows, computeSurvey, computeSurveySummary } from '@shared/engine';
import { structureCheckRows } from '@shared/review/structure-rows';
import { governingCheckWords, ratingFigureWords } from '@shared/review/rating-words';
import { baseSurvey, boxCompartment, contents, polygonBoundary } from '../unit/engine/fixtures';

const G = 9.80665; // standard gravity, 3rd CGPM (1901)
const RHO = 1000;

/** A 10 m × 10 m wall at x = 10 with fresh water to z = 6 on side A ("Hold") and dry air on side B. */
function wall() {
  const s = baseSurvey({ aft: -50, fwd: -50 });
  const a = boxCompartment([0, -5, 0], [10, 5, 10], { name: 'Hold' });
  s.compartments.push(a);
  s.conditions[0].contents.push(contents(a.id, [{ fluidId: 'fresh-water', z: 6, densityKgM3: RHO }]));
  s.boundaries.push(polygonBoundary([[10, -5, 0], [10, 5, 0], [10, 5, 10], [10, -5, 10]], { kind: 'compartment', compartmentId: a.id }, { kind: 'air' }));
  return s;
}

/** A flat 1 m × 1 m tank top at z = 0 under 2 m of fresh water (side A above), open air below. */
function tankTop(plating: { thicknessM: number; stiffenedAt?: number }) {
  const s = baseSurvey({ aft: -50, fwd: -50 });
  const t = boxCompartment([0, 0, 0], [1, 1, 2], { name: 'Tank', spaceType: 'tank' });
  s.compartments.push(t);
  s.conditions[0].contents.push(contents(t.id, [{ fluidId: 'fresh-water', z: 2, densityKgM3: RHO }]));
  s.boundaries.push(
    polygonBoundary([[0, 0, 0], [1, 0, 0], [1, 1, 0], [0, 1, 0]], { kind: 'compartment', compartmentId: t.id }, { kind: 'air' }, {
      kind: 'tank-top',
      plating: { thicknessM: plating.thicknessM, yieldStressPa: 235e6, allowableStressPa: 141e6, edges: 'simply-supported' },
      stiffening:
        plating.stiffenedAt === undefined
          ? undefined
          : { direction: { x: 1, y: 0, z: 0 }, spacingM: plating.stiffenedAt, endFixity: 'simply-supported', sectionModulusM3: 100e-6, allowableStressPa: 141e6 },
    }),
  );
  return s;
}

describe('ratings by direction, as the brief words them', () => {
  it('a force rating towards side B is used against ρ g h²/2 × width pushing that way; towards side A nothing pushes (hand statics)', () => {
    const s = wall();
    s.boundaries[0].directionalCapacity = { kind: 'force', towardsB: 3000e3, towardsA: 1000e3 };
    const b = computeSurvey(s).boundaries[0];
    const rows = structureCheckRows(b, 'si', { A: 'Hold', B: 'open air' });
    const toB = rows.find((r) => r.check.includes('towards side B'))!;
    const toA = rows.find((r) => r.check.includes('towards side A'))!;
    const force = (RHO * G * 6 * 6 * 10) / 2; // ρ g h² / 2 × width, 1,765 kN
    expect(toB.utilisation!).toBeCloseTo(force / 3000e3, 9);
    expect(toB.check).toBe('Rated force towards side B (open air)');
    expect(toB.load).toBe('1765 kN pushing that way');
    expect(toB.capacity).toBe('3000 kN');
    expect(toA.utilisation).toBe(0);
    expect(toA.check).toBe('Rated force towards side A (Hold)');
  });
  it('a pressure rating towards side B is used against the greatest net pressure ρ g h at the foot (hand statics), in psi for US units', () => {
    const s = wall();
    s.boundaries[0].directionalCapacity = { kind: 'pressure', towardsB: 100e3 };
    const b = computeSurvey(s).boundaries[0];
    const rows = structureCheckRows(b, 'us', { A: 'Hold', B: 'open air' });
    expect(rows).toHaveLength(1);
    expect(rows[0].utilisation!).toBeCloseTo((RHO * G * 6) / 100e3, 9);
    // 58.84 kPa = 8.534 psi (1 psi = 6,894.757 Pa, NIST SP 811)
    expect(rows[0].load).toBe('8.53 psi pushing that way');
    expect(rows[0].capacity).toBe('14.5 psi');
  });
});

describe('the governing rating in the results table row and the brief line', () => {
  const PSI = 6894.757; // Pa per psi, NIST SP 811
  it('a wall rated 45 kPa towards side B (open air) under 6 m of fresh water: the row names the direction, value and side; peak ρ g h (hand statics)', () => {
    const s = wall();
    s.boundaries[0].directionalCapacity = { kind: 'pressure', towardsB: 45e3, towardsA: 80e3 };
    const row = boundaryRows(computeSurveySummary(s).boundaries)[0];
    expect(row.capacityDirection).toBe('towards-B');
    expect(row.capacityKind).toBe('pressure');
    expect(row.capacityRated).toBe(45e3);
    expect(row.capacityActual!).toBeCloseTo(RHO * G * 6, 6); // 58.84 kPa at the foot
    expect(row.capacityUtilisation!).toBeCloseTo((RHO * G * 6) / 45e3, 9);
    const sides = { A: 'Hold', B: 'open air' };
    expect(ratingFigureWords({ kind: row.capacityKind!, direction: row.capacityDirection!, rated: row.capacityRated! }, 'si', sides)).toBe('45.0\u00a0kPa towards side B (open air)');
    expect(governingCheckWords(computeSurvey(s).boundaries[0], 'si', sides)!.what).toBe('its rating, 45.0\u00a0kPa towards side B (open air)');
  });
  it('the same wall with the water on side B: the rating towards side A governs, in psi for US units', () => {
    const s = wall();
    const b = s.boundaries[0];
    [b.sideA, b.sideB] = [b.sideB, b.sideA];
    b.directionalCapacity = { kind: 'pressure', towardsB: 10e3, towardsA: 45e3 };
    const row = boundaryRows(computeSurveySummary(s).boundaries)[0];
    expect(row.capacityDirection).toBe('towards-A');
    expect(row.capacityActual!).toBeCloseTo(RHO * G * 6, 6);
    // 45 kPa / 6,894.757 Pa per psi = 6.527 psi
    expect(ratingFigureWords({ kind: row.capacityKind!, direction: row.capacityDirection!, rated: row.capacityRated! }, 'us', { A: 'open air', B: 'Hold' })).toBe(`${(45e3 / PSI).toFixed(2)}\u00a0psi towards side A (open air)`);
  });
  it('a rating either way says so, and a boundary with no rating has no direction', () => {
    const s = wall();
    s.boundaries[0].ratedCapacity = { kind: 'force', forceN: 2000e3 };
    const row = boundaryRows(computeSurveySummary(s).boundaries)[0];
    expect(row.capacityDirection).toBe('either');
    expect(row.capacityActual!).toBeCloseTo((RHO * G * 6 * 6 * 10) / 2, 3); // ρ g h² / 2 × width
    expect(ratingFigureWords({ kind: 'force', direction: 'either', rated: 2000e3 }, 'si', { A: 'Hold', B: 'open air' })).toBe('2000\u00a0kN either way');
    const bare = boundaryRows(computeSurveySummary(wall()).boundaries)[0];
    expect([bare.capacityDirection, bare.capacityKind, bare.capacityRated, bare.capacityActual]).toEqual([null, null, null, null]);
  });
});

describe('plating, as the brief words it', () => {
  it('a square simply supported panel: σ = 6 × 0.0479 q a² / t² (Timoshenko & Woinowsky-Krieger, Theory of Plates and Shells, Table 8, ν = 0.3, from memory)', () => {
    const b = computeSurvey(tankTop({ thicknessM: 0.01 })).boundaries[0];
    const rows = structureCheckRows(b, 'si', { A: 'Tank', B: 'open air' });
    const pl = rows.find((r) => r.kind === 'plating')!;
    const q = RHO * G * 2;
    const sigma = (6 * 0.0479 * q * 1) / 0.01 ** 2; // 56.4 MPa
    expect(pl.utilisation!).toBeCloseTo(sigma / 141e6, 3);
    expect(pl.load).toMatch(/^56\.4 MPa under 19\.6 kPa towards side [AB]$/);
    expect(pl.capacity).toBe('141 MPa allowable');
    expect(pl.note).toContain('10.0 mm net of corrosion allowance');
  });
  it('panels 1 m × 0.5 m between stiffeners: σ = 6 × 0.1017 q b² / t² (same table, b/a = 2, from memory)', () => {
    const b = computeSurvey(tankTop({ thicknessM: 0.01, stiffenedAt: 0.5 })).boundaries[0];
    const rows = structureCheckRows(b, 'si', { A: 'Tank', B: 'open air' });
    const pl = rows.find((r) => r.kind === 'plating')!;
    const q = RHO * G * 2;
    expect(pl.utilisation!).toBeCloseTo((6 * 0.1017 * q * 0.25) / 0.01 ** 2 / 141e6, 3);
    expect(pl.check).toMatch(/^Plating panel \d of 2 in bending$/);
  });
});
