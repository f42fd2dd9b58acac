/**
 * Where the camera stands so the whole ship is in view: the ship's box (hull from the aft
 * perpendicular to the forward one, side to side, keel to deck, grown to take in every modelled
 * space) is seen from the view's direction, and the camera backs off until all eight corners are
 * inside both fields of view (a phone's canvas is taller than wide, a desk's wider than tall).
 */
import * as THREE from 'three';

/** Ship axes (x fwd, y port, z up) → three.js (y up): (x, z, −y). */
export const toThree = (p: { x: number; y: number; z: number } | readonly [number, number, number]): THREE.Vector3 =>
  'x' in p ? new THREE.Vector3(p.x, p.z, -p.y) : new THREE.Vector3(p[0], p[2], -p[1]);

/** The hull's box in three.js axes, from the main dimensions (m). */
export function hullBox(vessel: { lbpM: number; breadthM: number; depthM: number }): THREE.Box3 {
  return new THREE.Box3().setFromPoints([toThree({ x: 0, y: -vessel.breadthM / 2, z: 0 }), toThree({ x: vessel.lbpM, y: vessel.breadthM / 2, z: vessel.depthM })]);
}

export type View = 'oblique' | 'profile' | 'plan' | 'section';

/** The direction from the ship's centre towards the camera for each named view (three.js axes). */
export function viewDirection(view: View): THREE.Vector3 {
  switch (view) {
    case 'profile':
      return new THREE.Vector3(0, 0, 1); // from starboard
    case 'plan':
      return new THREE.Vector3(0, 1, 0.001).normalize(); // from above (a hair off vertical keeps "up" defined)
    case 'section':
      return new THREE.Vector3(1, 0, 0); // from ahead
    case 'oblique':
      return new THREE.Vector3(0.55, 0.45, 0.75).normalize();
  }
}

export interface Framing {
  position: THREE.Vector3;
  target: THREE.Vector3;
  near: number;
  far: number;
}

/**
 * The camera that shows all of `box` from `direction`, for a perspective camera of vertical field
 * of view `fovDeg` on a canvas of `aspect` (width ÷ height), with `margin` to spare (1.05 = 5 %).
 * Looking at the box's centre, a corner at (x, y) across and z towards the camera stays in the
 * picture while |x| ≤ (d − z)·tan(half horizontal angle), and likewise for y: d is the least
 * distance that holds for all eight corners.
 */
export function frameBox(box: THREE.Box3, direction: THREE.Vector3, fovDeg: number, aspect: number, margin = 1.05): Framing {
  const target = box.getCenter(new THREE.Vector3());
  const back = direction.clone().normalize();
  // the camera's own axes when it looks at the target with y up (as lookAt makes them)
  const m = new THREE.Matrix4().lookAt(back, new THREE.Vector3(), new THREE.Vector3(0, 1, 0));
  const right = new THREE.Vector3().setFromMatrixColumn(m, 0);
  const up = new THREE.Vector3().setFromMatrixColumn(m, 1);
  const tanV = Math.tan(THREE.MathUtils.degToRad(fovDeg) / 2);
  const tanH = tanV * Math.max(aspect, 1e-3);
  let distance = 0;
  let depth = 0;
  for (const x of [box.min.x, box.max.x])
    for (const y of [box.min.y, box.max.y])
      for (const z of [box.min.z, box.max.z]) {
        const c = new THREE.Vector3(x, y, z).sub(target);
        const towards = c.dot(back);
        depth = Math.max(depth, Math.abs(towards));
        distance = Math.max(distance, towards + (Math.abs(c.dot(right)) * margin) / tanH, towards + (Math.abs(c.dot(up)) * margin) / tanV);
      }
  distance = Math.max(distance, depth * 1.5, 0.5);
  return {
    position: target.clone().addScaledVector(back, distance),
    target,
    near: Math.max((distance - depth) * 0.5, distance / 1000),
    far: distance + depth * 4,
  };
}

/** A round step for a scale of `lengthInUnits` (1, 2 or 5 × 10ⁿ), giving about 4 to 10 divisions. */
export function scaleStep(lengthInUnits: number): number {
  if (!(lengthInUnits > 0)) return 1;
  const raw = lengthInUnits / 6;
  const pow = 10 ** Math.floor(Math.log10(raw));
  const m = raw / pow;
  return (m < 1.5 ? 1 : m < 3.5 ? 2 : m < 7.5 ? 5 : 10) * pow;
}
