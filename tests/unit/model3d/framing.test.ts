/**
 * The 3D view opens with the whole ship in view: every corner of the hull's box, projected by
 * three.js's own perspective camera (an outside library, not our formula), lands inside the
 * picture, for a tall phone canvas and a wide desk one and each named view.
 */
import { describe, expect, it } from 'vitest';
import * as THREE from 'three';
import { frameBox, hullBox, scaleStep, viewDirection, type View } from '@client/features/model3d/components/framing';

// an invented ship of ordinary proportions (L/B about 6.5, B/D about 1.6)
const VESSEL = { lbpM: 118, breadthM: 18, depthM: 11 };
const VIEWS: View[] = ['oblique', 'profile', 'plan', 'section'];

function corners(box: THREE.Box3): THREE.Vector3[] {
  const out: THREE.Vector3[] = [];
  for (const x of [box.min.x, box.max.x]) for (const y of [box.min.y, box.max.y]) for (const z of [box.min.z, box.max.z]) out.push(new THREE.Vector3(x, y, z));
  return out;
}

describe('frameBox', () => {
  it.each([
    ['phone', 366, 540],
    ['desk', 1100, 540],
  ])('keeps every corner of the hull inside the picture on a %s canvas', (_name, w, h) => {
    const box = hullBox(VESSEL);
    for (const view of VIEWS) {
      const f = frameBox(box, viewDirection(view), 40, w / h);
      const camera = new THREE.PerspectiveCamera(40, w / h, f.near, f.far);
      camera.position.copy(f.position);
      camera.lookAt(f.target);
      camera.updateMatrixWorld();
      camera.updateProjectionMatrix();
      for (const c of corners(box)) {
        const ndc = c.clone().project(camera);
        expect(Math.abs(ndc.x), `${view}: x of ${c.toArray()}`).toBeLessThanOrEqual(1);
        expect(Math.abs(ndc.y), `${view}: y of ${c.toArray()}`).toBeLessThanOrEqual(1);
        expect(Math.abs(ndc.z), `${view}: inside near/far`).toBeLessThanOrEqual(1);
      }
    }
  });

  it('does not stand needlessly far off: the ship fills a fair part of the picture', () => {
    const box = hullBox(VESSEL);
    const f = frameBox(box, viewDirection('profile'), 40, 1100 / 540);
    const camera = new THREE.PerspectiveCamera(40, 1100 / 540, f.near, f.far);
    camera.position.copy(f.position);
    camera.lookAt(f.target);
    camera.updateMatrixWorld();
    const ndc = corners(box).map((c) => c.clone().project(camera));
    // in profile the ship touches the picture's edge (less the 5 % margin) on one pair of sides
    const spanX = Math.max(...ndc.map((p) => p.x)) - Math.min(...ndc.map((p) => p.x));
    const spanY = Math.max(...ndc.map((p) => p.y)) - Math.min(...ndc.map((p) => p.y));
    expect(Math.max(spanX, spanY)).toBeGreaterThan(1.8);
  });
});

describe('scaleStep', () => {
  // round steps of 1, 2 or 5 × 10ⁿ giving 4 to 10 divisions (common practice for map and chart scales, no source)
  it.each([
    [118, 20],
    [387, 50],
    [30, 5],
    [7, 1],
  ])('a %s long ship gets a step of %s', (length, step) => {
    expect(scaleStep(length)).toBe(step);
    expect(length / scaleStep(length)).toBeGreaterThanOrEqual(4);
    expect(length / scaleStep(length)).toBeLessThanOrEqual(10);
  });
});
