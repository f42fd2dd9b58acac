// Plates described on a plane, to the survey format's geometry and back. Normals and areas are checked with
// mathjs's cross product and norm (an outside library), against the survey format's rule that a rectangle's
// normal is edgeU × edgeV and points from side A into side B.
import { describe, expect, it } from 'vitest';
import { cross, norm } from 'mathjs';
import type { BoundaryGeometry, Compartment, Point3 } from '@shared/schemas/survey';
import {
  emptyPlaneShape,
  faceBoundary,
  geometryToPlaneShape,
  planeShapeToGeometry,
  type PlaneKind,
  type PlaneShape,
} from '@client/features/workspace/utils/plane-geometry';

const arr = (p: Point3) => [p.x, p.y, p.z];
const crossOf = (u: Point3, v: Point3) => cross(arr(u), arr(v)) as number[];

/** The normal of a flat geometry, by mathjs: edgeU × edgeV, the circle's own, or Newell's sum of cross products. */
function normalOf(g: BoundaryGeometry): number[] {
  if (g.kind === 'rectangle') return crossOf(g.edgeU, g.edgeV);
  if (g.kind === 'circle') return arr(g.normal);
  if (g.kind === 'polygon') {
    const sum = [0, 0, 0];
    g.vertices.forEach((p, i) => {
      const c = crossOf(p, g.vertices[(i + 1) % g.vertices.length]);
      for (let k = 0; k < 3; k++) sum[k] += c[k] / 2;
    });
    return sum;
  }
  throw new Error(`no normal for ${g.kind}`);
}

const shape = (s: Partial<PlaneShape>): PlaneShape => ({ ...emptyPlaneShape(), ...s });
const AXIS: Record<PlaneKind, number> = { transverse: 0, longitudinal: 1, horizontal: 2 };

describe('planeShapeToGeometry', () => {
  it.each([
    ['transverse', 'low', 1],
    ['transverse', 'high', -1],
    ['longitudinal', 'low', 1],
    ['longitudinal', 'high', -1],
    ['horizontal', 'low', 1],
    ['horizontal', 'high', -1],
  ] as const)('a %s rectangle with side A %s has its normal along %d × its axis', (plane, sideA, sign) => {
    const g = planeShapeToGeometry(shape({ plane, sideA, at: 7, a1: 1, a2: 5, b1: 0, b2: 3 }));
    const n = normalOf(g);
    expect(Math.sign(n[AXIS[plane]])).toBe(sign);
    // area = |edgeU × edgeV| = 4 m × 3 m = 12 m² (by hand, and mathjs's norm)
    expect(norm(n) as number).toBeCloseTo(12, 12);
    // the plate lies in its plane
    if (g.kind === 'rectangle') expect(arr(g.origin)[AXIS[plane]]).toBe(7);
  });

  it('a transverse 4 m × 3 m bulkhead at x = 20 from y −2..2, z 0..3 has corners there', () => {
    const g = planeShapeToGeometry(shape({ plane: 'transverse', at: 20, a1: 2, a2: -2, b1: 3, b2: 0 }));
    expect(g.kind).toBe('rectangle');
    if (g.kind !== 'rectangle') return;
    expect(g.origin).toEqual({ x: 20, y: -2, z: 0 });
    const far = [0, 1, 2].map((k) => arr(g.origin)[k] + arr(g.edgeU)[k] + arr(g.edgeV)[k]);
    expect(far).toEqual([20, 2, 3]);
  });

  it('a circle takes the side as its normal', () => {
    const g = planeShapeToGeometry(shape({ plane: 'horizontal', sideA: 'high', shape: 'circle', at: 8, ca: 30, cb: -1, r: 0.4 }));
    expect(g).toEqual({ kind: 'circle', centre: { x: 30, y: -1, z: 8 }, normal: { x: 0, y: 0, z: -1 }, radiusM: 0.4 });
  });

  it.each(['low', 'high'] as const)('orders a polygon’s corners so its normal follows side A (%s), whichever way they were typed', (sideA) => {
    const square = [
      { a: 0, b: 0 },
      { a: 2, b: 0 },
      { a: 2, b: 2 },
      { a: 0, b: 2 },
    ];
    for (const points of [square, [...square].reverse()]) {
      for (const plane of ['transverse', 'longitudinal', 'horizontal'] as const) {
        const n = normalOf(planeShapeToGeometry(shape({ plane, sideA, shape: 'polygon', at: 0, points })));
        expect(Math.sign(n[AXIS[plane]])).toBe(sideA === 'low' ? 1 : -1);
        expect(norm(n) as number).toBeCloseTo(4, 12);
      }
    }
  });
});

describe('geometryToPlaneShape', () => {
  it.each(['transverse', 'longitudinal', 'horizontal'] as const)('gives back the %s description it was made from', (plane) => {
    for (const sideA of ['low', 'high'] as const) {
      const rect = shape({ plane, sideA, at: 4, a1: -1, a2: 3, b1: 0.5, b2: 2 });
      expect(geometryToPlaneShape(planeShapeToGeometry(rect))).toMatchObject({ plane, sideA, at: 4, a1: -1, a2: 3, b1: 0.5, b2: 2, shape: 'rectangle' });
      const circle = shape({ plane, sideA, shape: 'circle', at: 4, ca: 1, cb: 2, r: 0.3 });
      expect(geometryToPlaneShape(planeShapeToGeometry(circle))).toMatchObject({ plane, sideA, shape: 'circle', at: 4, ca: 1, cb: 2, r: 0.3 });
      const tri = shape({ plane, sideA, shape: 'polygon', at: 4, points: [{ a: 0, b: 0 }, { a: 3, b: 0 }, { a: 0, b: 2 }] });
      expect(geometryToPlaneShape(planeShapeToGeometry(tri))).toMatchObject({ plane, sideA, shape: 'polygon', at: 4 });
    }
  });

  it('gives null for a plate not on a ship-axis plane (edited by import instead)', () => {
    const tilted: BoundaryGeometry = { kind: 'rectangle', origin: { x: 0, y: 0, z: 0 }, edgeU: { x: 1, y: 1, z: 0 }, edgeV: { x: 0, y: 0, z: 1 } };
    expect(geometryToPlaneShape(tilted)).toBeNull();
    expect(geometryToPlaneShape({ kind: 'circle', centre: { x: 0, y: 0, z: 0 }, normal: { x: 0.6, y: 0.8, z: 0 }, radiusM: 1 })).toBeNull();
  });
});

describe('faceBoundary', () => {
  const hold = (id: string, name: string, x0: number, x1: number): Compartment => ({
    id,
    name,
    spaceType: 'dry-cargo',
    geometry: { kind: 'box', min: { x: x0, y: -9, z: 1 }, max: { x: x1, y: 9, z: 10 } },
  });
  const h1 = hold('h1', 'No. 1 hold', 40, 60);
  const h2 = hold('h2', 'No. 2 hold', 20, 40);
  const all = [h1, h2];

  it('the forward bulkhead of No. 2 hold is shared with No. 1 hold, 18 m × 9 m, its normal forward out of No. 2', () => {
    const f = faceBoundary(h2, 'forward', all);
    expect(f.name).toBe('Forward bulkhead of No. 2 hold');
    expect(f.kind).toBe('bulkhead');
    expect(f.sideB).toEqual({ kind: 'compartment', compartmentId: 'h1' });
    const n = normalOf(f.geometry);
    expect(n[0]).toBeGreaterThan(0);
    expect(norm(n) as number).toBeCloseTo(18 * 9, 9);
  });

  it('the aft bulkhead of No. 2 hold has open air behind it and its normal aft', () => {
    const f = faceBoundary(h2, 'aft', all);
    expect(f.sideB).toEqual({ kind: 'air' });
    expect(normalOf(f.geometry)[0]).toBeLessThan(0);
  });

  it('the bottom with nothing under it is shell to the sea, its normal down; the top is a deck to open air', () => {
    const bottom = faceBoundary(h1, 'bottom', all);
    expect(bottom).toMatchObject({ kind: 'shell', sideB: { kind: 'sea' }, name: 'Bottom shell of No. 1 hold' });
    expect(normalOf(bottom.geometry)[2]).toBeLessThan(0);
    const top = faceBoundary(h1, 'top', all);
    expect(top).toMatchObject({ kind: 'deck', sideB: { kind: 'air' }, name: 'Deck over No. 1 hold' });
    expect(norm(normalOf(top.geometry)) as number).toBeCloseTo(20 * 18, 9);
  });

  it('a prism’s end takes the section’s outline: its area is the section’s (shoelace, by hand: 8 × 6 − ½ × 2 × 2 × 2 = 44 m²)', () => {
    const prism: Compartment = {
      id: 'p',
      name: 'Fore peak',
      spaceType: 'tank',
      geometry: {
        kind: 'prism',
        xAftM: 80,
        xForeM: 90,
        section: [
          { y: -2, z: 0 },
          { y: 2, z: 0 },
          { y: 4, z: 2 },
          { y: 4, z: 6 },
          { y: -4, z: 6 },
          { y: -4, z: 2 },
        ],
      },
    } as Compartment;
    const f = faceBoundary(prism, 'aft', [prism]);
    expect(f.geometry.kind).toBe('polygon');
    const n = normalOf(f.geometry);
    expect(n[0]).toBeLessThan(0);
    expect(norm(n) as number).toBeCloseTo(44, 9);
  });
});
