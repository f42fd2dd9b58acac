/**
 * Plate loads against closed forms worked by hand. Sources: the hydrostatic force on a vertical
 * rectangle F = ρ g b h²/2 acting at h/3 above the bottom (the pressure prism), and the superposition of
 * a uniform gas pressure, as in standard fluid-mechanics texts (e.g. White, Fluid Mechanics, ch. 2,
 * from memory); the volume and centroid of a wedge of liquid in a heeled box (solid geometry, by hand);
 * a statically determinate beam's end reactions (statics: the loads add up).
 */
import { describe, expect, it } from 'vitest';
import { computeSurvey } from '@shared/engine';
import { baseSurvey, boxCompartment, contents, polygonBoundary, tid } from '../unit/engine/fixtures';

const G = 9.80665;
const wall = (x: number): [number, number, number][] => [
  [x, -5, 0],
  [x, 5, 0],
  [x, 5, 10],
  [x, -5, 10],
];

function twoTanks(levelA: number, levelB: number, gasA?: number) {
  const s = baseSurvey({ aft: 0, fwd: 0 });
  const a = boxCompartment([0, -5, 0], [10, 5, 10]);
  const b = boxCompartment([10, -5, 0], [20, 5, 10]);
  s.compartments.push(a, b);
  s.conditions[0].contents.push(contents(a.id, [{ fluidId: 'fresh-water', z: levelA, densityKgM3: 1000 }], gasA));
  if (levelB > 0) s.conditions[0].contents.push(contents(b.id, [{ fluidId: 'fresh-water', z: levelB, densityKgM3: 1000 }]));
  s.boundaries.push(polygonBoundary(wall(10), { kind: 'compartment', compartmentId: a.id }, { kind: 'compartment', compartmentId: b.id }));
  return s;
}

describe('flat plate loads', () => {
  it('water on both sides: net = difference of the two triangles', () => {
    const r = computeSurvey(twoTanks(6, 2)).boundaries[0];
    const F = 1000 * G * 10 * (36 - 4) / 2;
    expect(r.net.forceN).toBeCloseTo(F, 6);
    expect(r.sideA.forceN).toBeCloseTo(1000 * G * 10 * 18, 6);
    expect(r.sideB.wettedAreaM2).toBeCloseTo(20, 9);
    expect(r.net.signChange).toBe(false);
    expect(r.net.peak.pressurePa).toBeCloseTo(1000 * G * 4, 6);
  });

  it('gas pressure acts over the whole plate, and suction reverses the net load above the water', () => {
    const s = twoTanks(4, 0, 30e3);
    const r = computeSurvey(s).boundaries[0];
    expect(r.net.forceN).toBeCloseTo(30e3 * 100 + (1000 * G * 16 * 10) / 2, 4);
    const s2 = twoTanks(4, 0, -20e3);
    const r2 = computeSurvey(s2).boundaries[0];
    // net p = −20 kPa + ρ g (4 − z) for z < 4: zero at z = 4 − 20e3/(ρ g)
    expect(r2.net.signChange).toBe(true);
    const z0 = 4 - 20e3 / (1000 * G);
    expect(r2.net.positive.areaM2).toBeCloseTo(10 * z0, 9);
    expect(r2.net.positive.forceN).toBeCloseTo((1000 * G * z0 * z0 * 10) / 2, 4);
    expect(r2.net.positive.forceN + r2.net.negative.forceN).toBeCloseTo(r2.net.forceN, 4);
    expect(r2.net.minPressurePa).toBeCloseTo(-20e3, 6);
  });

  it('sea side: pressure down to the outside waterline, none above', () => {
    const s = baseSurvey({ aft: 3, fwd: 3 });
    const c = boxCompartment([0, -5, 0], [10, 5, 10]);
    s.compartments.push(c);
    s.boundaries.push(polygonBoundary(wall(10), { kind: 'sea' }, { kind: 'compartment', compartmentId: c.id }));
    const r = computeSurvey(s).boundaries[0];
    expect(r.net.forceN).toBeCloseTo((1025 * G * 9 * 10) / 2, 6);
    expect(r.sideA.wettedAreaM2).toBeCloseTo(30, 9);
    expect(r.net.centreOfPressure!.z).toBeCloseTo(1, 12);
  });

  it('open-to-sea compartment floods to the waterline under heel', () => {
    const s = baseSurvey({ aft: 4, fwd: 4, heelDeg: 5 });
    const c = boxCompartment([0, -5, 0], [10, 5, 10], { openToSea: true, permeability: 1 });
    s.compartments.push(c);
    const r = computeSurvey(s);
    const t = Math.tan((5 * Math.PI) / 180);
    // level z = 4 − t y is inside the box for |y| ≤ 5, so V = 10 × 10 × 4
    expect(r.compartments[0].liquid.volumeM3).toBeCloseTo(400, 9);
    expect(r.compartments[0].liquid.centroid!.y).toBeCloseTo((-t * 100) / 12 / 4, 9);
  });

  it('a door cut out of its bulkhead: parent + child = whole plate', () => {
    const s = twoTanks(8, 0);
    const whole = computeSurvey(s).boundaries[0].net.forceN;
    const parentId = s.boundaries[0].id;
    s.boundaries.push({
      ...polygonBoundary([[10, 1, 1], [10, 2, 1], [10, 2, 3], [10, 1, 3]], s.boundaries[0].sideA, s.boundaries[0].sideB),
      kind: 'door',
      parentBoundaryId: parentId,
    });
    const r = computeSurvey(s);
    expect(r.boundaries[0].openingsExcluded.length).toBe(1);
    expect(r.boundaries[0].areaM2).toBeCloseTo(98, 9);
    expect(r.boundaries[0].net.forceN + r.boundaries[1].net.forceN).toBeCloseTo(whole, 5);
  });

  it('stiffeners and shores on a shored bulkhead', () => {
    const s = twoTanks(6, 0);
    const b = s.boundaries[0];
    b.stiffening = { direction: { x: 0, y: 0, z: 1 }, spacingM: 1, endFixity: 'simply-supported', sectionModulusM3: 500e-6, allowableStressPa: 160e6 };
    b.shores = [
      { id: tid(), position: { x: 10, y: 0, z: 2 }, lengthM: 5, section: { kind: 'rectangular', widthM: 0.2, depthM: 0.3 }, elasticModulusPa: 11e9, allowableStressPa: 8e6, endCondition: 'pinned-pinned', side: 'B' },
      { id: tid(), position: { x: 10, y: 0, z: 6 }, lengthM: 8, section: { kind: 'tube', outerDiameterM: 0.2, wallThicknessM: 0.01 }, elasticModulusPa: 200e9, allowableStressPa: 150e6, endCondition: 'fixed-fixed', side: 'B' },
    ];
    const r = computeSurvey(s).boundaries[0];
    // every stiffener spans 10 m with a triangular load 0..ρ g 6 over the lowest 6 m
    const st = r.stiffeners!;
    expect(st.items.length).toBe(9);
    expect(st.items[0].totalLoadN).toBeCloseTo((1000 * G * 36) / 2, 6);
    // both shores stand on the middle stiffener (y = 0): they are its intermediate supports, and
    // every other stiffener bears only at its ends (statics: each load goes to exactly one place)
    expect(r.shores.map((x) => x.bearsOn)).toEqual(['stiffener', 'stiffener']);
    const ends = st.items.reduce((a, x) => a + x.reactionStartN + x.reactionEndN, 0);
    const onShores = r.shores.reduce((a, x) => a + x.tributaryForceN, 0);
    expect(ends + onShores + st.edgeLoadN!).toBeCloseTo(r.net.forceN, 4);
    const middle = st.items[4];
    expect(middle.shoreForcesN).toBeCloseTo(onShores, 6);
    expect(middle.reactionStartN + middle.reactionEndN + onShores).toBeCloseTo(middle.totalLoadN, 6);
    expect(r.shores[1].effectiveLengthFactor).toBe(0.65);
    expect(r.shores[0].slender).toBe(false);
    // a tube is never judged by length over "thickness"
    expect(r.shores[1].lengthToLeastDimension).toBeNull();
  });

  it('shores on an unstiffened plate share it by nearest-shore areas that add up to the plate', () => {
    const s = twoTanks(6, 0);
    s.boundaries[0].shores = [
      { id: tid(), position: { x: 10, y: 0, z: 2 }, lengthM: 5, section: { kind: 'rectangular', widthM: 0.2, depthM: 0.3 }, elasticModulusPa: 11e9, allowableStressPa: 8e6, endCondition: 'pinned-pinned', side: 'B' },
      { id: tid(), position: { x: 10, y: 0, z: 6 }, lengthM: 8, section: { kind: 'tube', outerDiameterM: 0.2, wallThicknessM: 0.01 }, elasticModulusPa: 200e9, allowableStressPa: 150e6, endCondition: 'fixed-fixed', side: 'B' },
    ];
    const r = computeSurvey(s).boundaries[0];
    const total = r.shores.reduce((a, x) => a + x.tributaryForceN, 0);
    expect(total).toBeCloseTo(r.net.forceN, 4);
    expect(r.shores[0].tributaryAreaM2).toBeCloseTo(40, 9);
    expect(r.shores[0].tributaryForceN).toBeCloseTo(1000 * G * 10 * (36 - 4) / 2, 4);
  });
});
