/** Small 3-vector helpers (ship axes, metres unless stated). */
export type V3 = [number, number, number];

export const v3 = (x: number, y: number, z: number): V3 => [x, y, z];
export const add = (a: V3, b: V3): V3 => [a[0] + b[0], a[1] + b[1], a[2] + b[2]];
export const sub = (a: V3, b: V3): V3 => [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
export const scale = (a: V3, k: number): V3 => [a[0] * k, a[1] * k, a[2] * k];
export const dot = (a: V3, b: V3): number => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
export const cross = (a: V3, b: V3): V3 => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
export const norm = (a: V3): number => Math.sqrt(dot(a, a));
export function unit(a: V3): V3 {
  const n = norm(a);
  return n > 0 ? [a[0] / n, a[1] / n, a[2] / n] : [0, 0, 0];
}
/** Point in the survey format ({x, y, z}) to a tuple. */
export const fromPoint = (p: { x: number; y: number; z: number }): V3 => [p.x, p.y, p.z];
/** Tuple to the survey/results point format. */
export const toPoint = (a: V3): { x: number; y: number; z: number } => ({ x: a[0], y: a[1], z: a[2] });
