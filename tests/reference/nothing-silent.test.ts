/**
 * Inputs that used to give a quiet wrong number now give the right one with a warning: hand-worked
 * statics (ρ g h integrated by hand), SOLAS permeabilities and the geometry of a heeled tape.
 */
import { describe, expect, it } from 'vitest';
import { computeSurvey } from '@shared/engine';
import { facetOrientation } from '@shared/engine/facets';
import { baseSurvey, boxCompartment, contents, polygonBoundary, tid } from '../unit/engine/fixtures';

const G = 9.80665; // standard gravity, 3rd CGPM (1901)
const RHO = 1000;

function wallBetween(levelA: number, levelB: number) {
  const s = baseSurvey({ aft: -50, fwd: -50 });
  const a = boxCompartment([0, -5, 0], [10, 5, 10]);
  const b = boxCompartment([10, -5, 0], [20, 5, 10]);
  s.compartments.push(a, b);
  s.conditions[0].contents.push(contents(a.id, [{ fluidId: 'fresh-water', z: levelA, densityKgM3: RHO }]));
  s.conditions[0].contents.push(contents(b.id, [{ fluidId: 'fresh-water', z: levelB, densityKgM3: RHO }]));
  s.boundaries.push(polygonBoundary([[10, -5, 0], [10, 5, 0], [10, 5, 10], [10, -5, 10]], { kind: 'compartment', compartmentId: a.id }, { kind: 'compartment', compartmentId: b.id }));
  return s;
}

describe('faceted surfaces', () => {
  // a vertical wall at x = 10, 10 m wide, water to z = 6 on side A only, cut into two facets
  const facet = (z0: number, z1: number) => [{ x: 10, y: -5, z: z0 }, { x: 10, y: 5, z: z0 }, { x: 10, y: 5, z: z1 }, { x: 10, y: -5, z: z1 }];
  function split(reverseSecond: boolean) {
    const s = wallBetween(6, 0);
    const top = facet(3, 10);
    s.boundaries[0].geometry = { kind: 'faceted', facets: [{ vertices: facet(0, 3) }, { vertices: reverseSecond ? [...top].reverse() : top }] };
    return s;
  }
  it('the net force is signed along the mean facet normal and equals ρ g h²/2 × width (hand statics)', () => {
    const r = computeSurvey(split(false));
    const b = r.boundaries[0];
    expect(b.net.forceN).toBeCloseTo((RHO * G * 36 * 10) / 2, 4);
    expect(b.net.referenceDirection!.x).toBeCloseTo(1, 12);
    expect(b.reversedFacets).toEqual([]);
  });
  it('one facet listed the other way round is named, with a danger warning, and turning it over is offered', () => {
    const r = computeSurvey(split(true));
    expect(r.boundaries[0].reversedFacets).toEqual([1]);
    expect(r.warnings.some((w) => w.code === 'facets-reversed' && w.severity === 'danger')).toBe(true);
    expect(facetOrientation([{ vertices: facet(0, 3) }, { vertices: facet(3, 10).reverse() }]).reversed).toEqual([1]);
  });
});

describe('a net force that nearly cancels', () => {
  it('gives the force and the couple about the centroid, no far-off point (hand statics: M = 10 ρ g [(hA³ − hB³)/6 − 5 (hA² − hB²)/2])', () => {
    const hA = 6, hB = 5.95;
    const b = computeSurvey(wallBetween(hA, hB)).boundaries[0];
    expect(b.net.nearlyCancels).toBe(true);
    expect(b.net.centreOfPressure).toBeNull();
    expect(b.net.forceN).toBeCloseTo((10 * RHO * G * (hA * hA - hB * hB)) / 2, 4);
    const M = 10 * RHO * G * ((hA ** 3 - hB ** 3) / 6 - (5 * (hA * hA - hB * hB)) / 2);
    expect(b.net.coupleNm!).toBeCloseTo(Math.abs(M), 3);
  });
});

describe('stiffeners that cannot be checked say so', () => {
  const stiff = (direction: { x: number; y: number; z: number }, spacingM: number) => {
    const s = wallBetween(6, 0);
    s.boundaries[0].stiffening = { direction, spacingM, endFixity: 'simply-supported', sectionModulusM3: 500e-6, allowableStressPa: 160e6 };
    return computeSurvey(s);
  };
  it('a run normal to the plate: no utilisation (never 0 %) and a danger warning', () => {
    const r = stiff({ x: 1, y: 0, z: 0 }, 0.7);
    expect(r.boundaries[0].stiffeners!.maxUtilisation).toBeNull();
    expect(r.boundaries[0].stiffeners!.status).toBe('normal-to-plate');
    expect(r.boundaries[0].maxUtilisation).toBeNull();
    expect(r.warnings.some((w) => w.code === 'stiffener-normal' && w.severity === 'danger')).toBe(true);
  });
  it('more than 1,000 stiffeners: the first 1,000 are checked and a warning says the rest are not', () => {
    const r = stiff({ x: 0, y: 0, z: 1 }, 0.005);
    expect(r.boundaries[0].stiffeners!.items.length).toBe(1000);
    expect(r.boundaries[0].stiffeners!.truncated).toBe(true);
    expect(r.warnings.some((w) => w.code === 'stiffeners-truncated')).toBe(true);
  });
});

describe('readings', () => {
  it('a zero sounding at heel is "at or below the pipe bottom": a range down to the lowest point, and a warning', () => {
    const s = baseSurvey({ aft: 4, fwd: 4, heelDeg: 5 });
    const c = boxCompartment([0, -5, 0], [10, 5, 10]);
    s.compartments.push(c);
    s.conditions[0].contents.push({ compartmentId: c.id, layers: [{ id: tid(), fluidId: 'sea-water', level: { kind: 'sounding', pipe: { x: 5, y: 4, bottomZM: 0.3 }, soundingM: 0 } }] });
    const r = computeSurvey(s);
    const layer = r.compartments[0].layers[0];
    const heel = (5 * Math.PI) / 180;
    // earth-up in ship axes at 5° heel (starboard down): elevation of (y, z) is z cos θ + y sin θ … here the
    // lowest point of the box is its starboard bottom corner (y = −5, z = 0), the pipe bottom at (4, 0.3)
    expect(layer.levelRange).not.toBeNull();
    expect(layer.levelRange!.highElevationM).toBeCloseTo(layer.levelElevationM, 12);
    expect(layer.levelRange!.highElevationM - layer.levelRange!.lowElevationM).toBeCloseTo(0.3 * Math.cos(heel) + 9 * Math.sin(heel), 9);
    expect(r.warnings.some((w) => w.code === 'sounding-zero')).toBe(true);
  });
  it('an ullage by plumb tape is vertical; along the pipe it is taken along the heeled ship\'s z axis (heel correction cos θ, geometry)', () => {
    const make = (tape: 'plumb' | 'along-pipe') => {
      const s = baseSurvey({ aft: 4, fwd: 4, heelDeg: 10 });
      const c = boxCompartment([0, -5, 0], [10, 5, 10]);
      s.compartments.push(c);
      s.conditions[0].contents.push({ compartmentId: c.id, layers: [{ id: tid(), fluidId: 'sea-water', level: { kind: 'ullage', reference: { x: 5, y: 0, z: 10 }, ullageM: 4, tape } }] });
      return computeSurvey(s).compartments[0].layers[0].levelElevationM;
    };
    const cos = Math.cos((10 * Math.PI) / 180);
    expect(make('plumb')).toBeCloseTo(10 * cos - 4, 9);
    expect(make('along-pipe')).toBeCloseTo((10 - 4) * cos, 9);
  });
  it('an empty hold floods to 0.95 of its volume, a loaded one to 0.70 (SOLAS II-1 Reg. 7-3, from memory)', () => {
    const vol = (cargoState?: 'empty' | 'loaded') => {
      const s = baseSurvey({ aft: 4, fwd: 4 });
      s.compartments.push(boxCompartment([0, -5, 0], [10, 5, 10], { openToSea: true, cargoState }));
      const r = computeSurvey(s);
      return { v: r.compartments[0].liquid.volumeM3, source: r.compartments[0].permeabilitySource, warned: r.warnings.some((w) => w.code === 'cargo-state-unknown') };
    };
    expect(vol('empty').v).toBeCloseTo(400 * 0.95, 9);
    expect(vol('loaded').v).toBeCloseTo(400 * 0.7, 9);
    expect(vol('empty').source).toMatch(/SOLAS/);
    expect(vol().warned).toBe(true);
  });
});

describe('ratings with a direction', () => {
  it('a hatch cover rated 40 kPa towards side B and 5 kPa towards side A is checked against the peak pressure each way (hand statics: ρ g h)', () => {
    const s = wallBetween(2, 0);
    s.boundaries[0].directionalCapacity = { kind: 'pressure', towardsB: 40e3, towardsA: 5e3 };
    const b = computeSurvey(s).boundaries[0];
    const towardsB = b.capacities.find((c) => c.direction === 'towards-B')!;
    const towardsA = b.capacities.find((c) => c.direction === 'towards-A')!;
    expect(towardsB.actual).toBeCloseTo(RHO * G * 2, 6);
    expect(towardsB.utilisation).toBeCloseTo((RHO * G * 2) / 40e3, 9);
    expect(towardsA.actual).toBe(0);
    expect(b.capacity!.direction).toBe('towards-B');
  });
});
