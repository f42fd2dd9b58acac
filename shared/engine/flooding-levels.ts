/**
 * Levels from volumes. Between two successive vertex elevations of a polyhedron the volume below a
 * level plane is a cubic in the plane's elevation (the cross-section is a polygon whose edges move
 * linearly, so its area is quadratic). The table samples the engine's exact volumeBelow four times
 * per such interval and keeps the cubic through them (exact up to rounding), so the forecast can
 * invert volume → level by root finding (safeguarded Newton) many thousand times without clipping
 * the solid again.
 */
import { compartmentSolid, elevationRange, volumeBelow } from './polyhedron';
import type { CompartmentGeometry } from '../schemas/survey';
import type { V3 } from './vec';

export interface LevelTable {
  /** Vertex elevations, ascending, m. */
  e: Float64Array;
  /** Geometric volume below each elevation, m³. */
  v: Float64Array;
  /** Per interval: V and its forward differences Δ, Δ², Δ³ on u = 0, 1, 2, 3 (u = 3 (η − e_i)/(e_{i+1} − e_i)). */
  d: Float64Array;
  bottom: number;
  top: number;
  total: number;
  /** Plan area used above the top (liquid pressed up into pipes and coamings): 1 % of the mean plan area, m². */
  aboveTopArea: number;
}

export function levelTable(geometry: CompartmentGeometry, up: V3): LevelTable {
  const solid = compartmentSolid(geometry);
  const [bottom, top] = elevationRange(solid, up);
  const raw: number[] = [];
  for (const f of solid) for (const p of f) raw.push(p[0] * up[0] + p[1] * up[1] + p[2] * up[2]);
  raw.sort((a, b) => a - b);
  const tol = 1e-9 * Math.max(1, top - bottom);
  const e: number[] = [];
  for (const x of raw) if (e.length === 0 || x - e[e.length - 1] > tol) e.push(x);
  e[0] = bottom;
  e[e.length - 1] = top;
  const total = volumeBelow(solid, up, Infinity).volume;
  const v = new Float64Array(e.length);
  const d = new Float64Array(4 * Math.max(0, e.length - 1));
  v[0] = 0;
  for (let i = 0; i + 1 < e.length; i++) {
    const a = e[i], b = e[i + 1];
    const f0 = v[i];
    const f1 = volumeBelow(solid, up, a + (b - a) / 3).volume;
    const f2 = volumeBelow(solid, up, a + (2 * (b - a)) / 3).volume;
    const f3 = i + 2 === e.length ? total : volumeBelow(solid, up, b).volume;
    v[i + 1] = f3;
    d[4 * i] = f0;
    d[4 * i + 1] = f1 - f0;
    d[4 * i + 2] = f2 - 2 * f1 + f0;
    d[4 * i + 3] = f3 - 3 * f2 + 3 * f1 - f0;
  }
  const height = Math.max(top - bottom, 1e-9);
  return { e: Float64Array.from(e), v, d, bottom, top, total, aboveTopArea: (0.01 * total) / height };
}

/** Newton forward form on u = 0..3 and its derivative dV/du. */
function cubicAt(d: Float64Array, i: number, u: number): number {
  return d[4 * i] + u * d[4 * i + 1] + ((u * (u - 1)) / 2) * d[4 * i + 2] + ((u * (u - 1) * (u - 2)) / 6) * d[4 * i + 3];
}
function cubicSlope(d: Float64Array, i: number, u: number): number {
  return d[4 * i + 1] + ((2 * u - 1) / 2) * d[4 * i + 2] + ((3 * u * u - 6 * u + 2) / 6) * d[4 * i + 3];
}

/** Geometric volume below elevation η, m³ (from the table; beyond the top the pipes' small area). */
export function volumeAt(t: LevelTable, eta: number): number {
  if (eta <= t.bottom) return 0;
  if (eta >= t.top) return t.total + (eta - t.top) * t.aboveTopArea;
  const i = intervalOfElevation(t, eta);
  const u = (3 * (eta - t.e[i])) / (t.e[i + 1] - t.e[i]);
  return cubicAt(t.d, i, u);
}

function intervalOfElevation(t: LevelTable, eta: number): number {
  let lo = 0, hi = t.e.length - 2;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (t.e[mid] <= eta) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}

/**
 * Elevation of the level plane below which the solid holds geometric volume `vol`, m. Zero or less
 * gives the bottom; more than the whole solid rises above the top over `aboveTopArea`.
 */
export function levelOfVolume(t: LevelTable, vol: number): number {
  if (vol <= 0) return t.bottom;
  if (vol >= t.total) return t.top + (vol - t.total) / t.aboveTopArea;
  const v = t.v;
  let lo = 0, hi = v.length - 2;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (v[mid] <= vol) lo = mid;
    else hi = mid - 1;
  }
  const i = lo;
  const span = t.e[i + 1] - t.e[i];
  const va = v[i], vb = v[i + 1];
  if (vb <= va) return t.e[i];
  // safeguarded Newton on u ∈ [0, 3]
  let a = 0, b = 3;
  let u = (3 * (vol - va)) / (vb - va);
  for (let k = 0; k < 60; k++) {
    const fu = cubicAt(t.d, i, u) - vol;
    if (Math.abs(fu) <= 1e-15 * vb || b - a <= 1e-15 * 3) break;
    if (fu > 0) b = u;
    else a = u;
    const s = cubicSlope(t.d, i, u);
    let next = s > 0 ? u - fu / s : 0.5 * (a + b);
    if (!(next > a && next < b)) next = 0.5 * (a + b);
    if (Math.abs(next - u) <= 1e-14 * 3) {
      u = next;
      break;
    }
    u = next;
  }
  return t.e[i] + (span * u) / 3;
}

/** Plan area of the free surface at elevation η (dV/dη), m². */
export function surfaceAreaAt(t: LevelTable, eta: number): number {
  if (eta >= t.top) return t.aboveTopArea;
  if (eta < t.bottom) return 0;
  const i = intervalOfElevation(t, eta);
  const span = t.e[i + 1] - t.e[i];
  const u = (3 * (eta - t.e[i])) / span;
  return (3 * cubicSlope(t.d, i, u)) / span;
}
