import { describe, expect, it } from 'vitest';
import { boundaryPolygons, clipSolid, liquidBody } from '@shared/engine/mesh';
import { compartmentSolid, volumeBelow } from '@shared/engine/polyhedron';
import { unit, type V3 } from '@shared/engine/vec';

// Check: a clipped solid must be closed, so its own volume (divergence theorem over its faces)
// equals the engine's volume below the same plane, which never builds the cap.
describe('drawing meshes', () => {
  const box = { kind: 'box' as const, min: { x: 0, y: -5, z: 0 }, max: { x: 10, y: 5, z: 8 } };
  const up = unit([0.05, -0.12, 1]) as V3;

  it('a box clipped by an inclined level plane is closed and has the engine’s volume', () => {
    const clipped = clipSolid(compartmentSolid(box), up, 3);
    expect(volumeBelow(clipped, up, Infinity).volume).toBeCloseTo(volumeBelow(compartmentSolid(box), up, 3).volume, 9);
  });

  it('a non-convex prism slab between two levels has the difference of volumes', () => {
    const prism = {
      kind: 'prism' as const,
      xAftM: 0,
      xForeM: 12,
      section: [
        { y: -6, z: 0 },
        { y: 6, z: 0 },
        { y: 6, z: 8 },
        { y: 2, z: 8 },
        { y: 2, z: 3 },
        { y: -2, z: 3 },
        { y: -2, z: 8 },
        { y: -6, z: 8 },
      ],
    };
    const body = liquidBody(prism, up, 2, 5);
    const solid = compartmentSolid(prism);
    const expected = volumeBelow(solid, up, 5).volume - volumeBelow(solid, up, 2).volume;
    expect(volumeBelow(body, up, Infinity).volume).toBeCloseTo(expected, 9);
  });

  it('outlines a rectangle by its four corners and a circle as a polygon', () => {
    const [rect] = boundaryPolygons({ kind: 'rectangle', origin: { x: 1, y: 0, z: 0 }, edgeU: { x: 0, y: 2, z: 0 }, edgeV: { x: 0, y: 0, z: 3 } });
    expect(rect).toEqual([[1, 0, 0], [1, 2, 0], [1, 2, 3], [1, 0, 3]]);
    const [circle] = boundaryPolygons({ kind: 'circle', centre: { x: 0, y: 0, z: 0 }, normal: { x: 1, y: 0, z: 0 }, radiusM: 1 }, 12);
    expect(circle).toHaveLength(12);
    for (const p of circle) expect(Math.hypot(p[1], p[2])).toBeCloseTo(1, 12);
  });
});
