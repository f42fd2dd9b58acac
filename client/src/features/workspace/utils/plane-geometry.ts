/**
 * Boundary shapes as a surveyor describes them: a rectangle, circle or polygon on a transverse
 * (x = const), longitudinal (y = const) or horizontal (z = const) plane, with side A on the low or
 * high side. Converted both ways to the survey format's geometry, whose normal points from side A
 * into side B (rectangle normal = edgeU × edgeV).
 */
import type { BoundaryGeometry, Compartment, Point3 } from '@shared/schemas/survey';

export type PlaneKind = 'transverse' | 'longitudinal' | 'horizontal';
export type ShapeKind = 'rectangle' | 'circle' | 'polygon';

export interface PlaneShape {
  plane: PlaneKind;
  /** Coordinate of the plane (x, y or z), m. */
  at: number;
  /** Side A is on the low side (aft / starboard / below) when 'low'. */
  sideA: 'low' | 'high';
  shape: ShapeKind;
  /** Rectangle: in-plane ranges. */
  a1: number;
  a2: number;
  b1: number;
  b2: number;
  /** Circle. */
  ca: number;
  cb: number;
  r: number;
  /** Polygon, in-plane points. */
  points: { a: number; b: number }[];
}

/** Which ship axes the in-plane coordinates a and b are, and the plane's own axis. */
export const PLANE_AXES: Record<PlaneKind, { a: 'x' | 'y' | 'z'; b: 'x' | 'y' | 'z'; n: 'x' | 'y' | 'z' }> = {
  transverse: { a: 'y', b: 'z', n: 'x' },
  longitudinal: { a: 'x', b: 'z', n: 'y' },
  horizontal: { a: 'x', b: 'y', n: 'z' },
};

export const SIDE_WORDS: Record<PlaneKind, { low: string; high: string }> = {
  transverse: { low: 'aft of', high: 'forward of' },
  longitudinal: { low: 'to starboard of', high: 'to port of' },
  horizontal: { low: 'below', high: 'above' },
};

function pt(plane: PlaneKind, at: number, a: number, b: number): Point3 {
  const ax = PLANE_AXES[plane];
  const p = { x: 0, y: 0, z: 0 };
  p[ax.n] = at;
  p[ax.a] = a;
  p[ax.b] = b;
  return p;
}

function vec(plane: PlaneKind, da: number, db: number): Point3 {
  return pt(plane, 0, da, db);
}

/** Does (a × b) point along +n for this plane? transverse y×z=+x, longitudinal x×z=−y, horizontal x×y=+z. */
const A_CROSS_B_POSITIVE: Record<PlaneKind, boolean> = { transverse: true, longitudinal: false, horizontal: true };

export function planeShapeToGeometry(s: PlaneShape): BoundaryGeometry {
  const normalPositive = s.sideA === 'low';
  const normalSign = normalPositive ? 1 : -1;
  if (s.shape === 'circle') {
    const n = { x: 0, y: 0, z: 0 };
    n[PLANE_AXES[s.plane].n] = normalSign;
    return { kind: 'circle', centre: pt(s.plane, s.at, s.ca, s.cb), normal: n, radiusM: s.r };
  }
  if (s.shape === 'rectangle') {
    const a1 = Math.min(s.a1, s.a2), a2 = Math.max(s.a1, s.a2);
    const b1 = Math.min(s.b1, s.b2), b2 = Math.max(s.b1, s.b2);
    const ua = vec(s.plane, a2 - a1, 0);
    const vb = vec(s.plane, 0, b2 - b1);
    const abPositive = A_CROSS_B_POSITIVE[s.plane] === normalPositive;
    return { kind: 'rectangle', origin: pt(s.plane, s.at, a1, b1), edgeU: abPositive ? ua : vb, edgeV: abPositive ? vb : ua };
  }
  // polygon: orient so the normal matches
  let area2 = 0;
  const p = s.points;
  for (let i = 0; i < p.length; i++) {
    const q = p[i], r = p[(i + 1) % p.length];
    area2 += q.a * r.b - r.a * q.b;
  }
  const ccwPositive = A_CROSS_B_POSITIVE[s.plane];
  const wantCcw = ccwPositive === normalPositive;
  const ordered = (area2 > 0) === wantCcw ? p : [...p].reverse();
  return { kind: 'polygon', vertices: ordered.map((q) => pt(s.plane, s.at, q.a, q.b)) };
}

const AXES = ['x', 'y', 'z'] as const;
const EPS = 1e-9;

function alignedAxis(v: Point3): { axis: 'x' | 'y' | 'z'; sign: number } | null {
  const len = Math.hypot(v.x, v.y, v.z);
  if (len === 0) return null;
  for (const a of AXES) if (Math.abs(Math.abs(v[a]) - len) < 1e-9 * Math.max(1, len)) return { axis: a, sign: Math.sign(v[a]) };
  return null;
}

const planeOfAxis = (axis: 'x' | 'y' | 'z'): PlaneKind => (axis === 'x' ? 'transverse' : axis === 'y' ? 'longitudinal' : 'horizontal');

export function emptyPlaneShape(): PlaneShape {
  return { plane: 'transverse', at: 0, sideA: 'low', shape: 'rectangle', a1: 0, a2: 1, b1: 0, b2: 1, ca: 0, cb: 0, r: 0.3, points: [] };
}

/** The plane description of a geometry, or null for shapes not on a ship-axis plane (edit them by import). */
export function geometryToPlaneShape(g: BoundaryGeometry): PlaneShape | null {
  const base = emptyPlaneShape();
  if (g.kind === 'circle') {
    const n = alignedAxis(g.normal);
    if (!n) return null;
    const plane = planeOfAxis(n.axis);
    const ax = PLANE_AXES[plane];
    return { ...base, plane, shape: 'circle', at: g.centre[n.axis], sideA: n.sign > 0 ? 'low' : 'high', ca: g.centre[ax.a], cb: g.centre[ax.b], r: g.radiusM };
  }
  if (g.kind === 'rectangle') {
    const u = alignedAxis(g.edgeU), v = alignedAxis(g.edgeV);
    if (!u || !v || u.axis === v.axis) return null;
    const nAxis = AXES.find((a) => a !== u.axis && a !== v.axis)!;
    const plane = planeOfAxis(nAxis);
    const ax = PLANE_AXES[plane];
    const far = { x: g.origin.x + g.edgeU.x + g.edgeV.x, y: g.origin.y + g.edgeU.y + g.edgeV.y, z: g.origin.z + g.edgeU.z + g.edgeV.z };
    const n = { x: g.edgeU.y * g.edgeV.z - g.edgeU.z * g.edgeV.y, y: g.edgeU.z * g.edgeV.x - g.edgeU.x * g.edgeV.z, z: g.edgeU.x * g.edgeV.y - g.edgeU.y * g.edgeV.x };
    return {
      ...base,
      plane,
      shape: 'rectangle',
      at: g.origin[nAxis],
      sideA: n[nAxis] > 0 ? 'low' : 'high',
      a1: Math.min(g.origin[ax.a], far[ax.a]),
      a2: Math.max(g.origin[ax.a], far[ax.a]),
      b1: Math.min(g.origin[ax.b], far[ax.b]),
      b2: Math.max(g.origin[ax.b], far[ax.b]),
    };
  }
  if (g.kind === 'polygon') {
    for (const nAxis of AXES) {
      const at = g.vertices[0][nAxis];
      if (g.vertices.every((p) => Math.abs(p[nAxis] - at) < EPS)) {
        const plane = planeOfAxis(nAxis);
        const ax = PLANE_AXES[plane];
        const points = g.vertices.map((p) => ({ a: p[ax.a], b: p[ax.b] }));
        let area2 = 0;
        for (let i = 0; i < points.length; i++) {
          const q = points[i], r = points[(i + 1) % points.length];
          area2 += q.a * r.b - r.a * q.b;
        }
        const normalPositive = (area2 > 0) === A_CROSS_B_POSITIVE[plane];
        return { ...base, plane, shape: 'polygon', at, sideA: normalPositive ? 'low' : 'high', points };
      }
    }
  }
  return null;
}

export type Face = 'aft' | 'forward' | 'port' | 'starboard' | 'top' | 'bottom';
export const FACES: readonly Face[] = ['aft', 'forward', 'starboard', 'port', 'bottom', 'top'];

export const FACE_KIND: Record<Face, 'bulkhead' | 'deck' | 'tank-top' | 'shell'> = {
  aft: 'bulkhead',
  forward: 'bulkhead',
  port: 'shell',
  starboard: 'shell',
  top: 'deck',
  bottom: 'shell',
};

interface Extent {
  min: Point3;
  max: Point3;
}

function extentOf(c: Compartment): Extent {
  const g = c.geometry;
  if (g.kind === 'box') return { min: g.min, max: g.max };
  const ys = g.section.map((p) => p.y), zs = g.section.map((p) => p.z);
  return {
    min: { x: Math.min(g.xAftM, g.xForeM), y: Math.min(...ys), z: Math.min(...zs) },
    max: { x: Math.max(g.xAftM, g.xForeM), y: Math.max(...ys), z: Math.max(...zs) },
  };
}

const FACE_AXIS: Record<Face, { axis: 'x' | 'y' | 'z'; high: boolean }> = {
  aft: { axis: 'x', high: false },
  forward: { axis: 'x', high: true },
  starboard: { axis: 'y', high: false },
  port: { axis: 'y', high: true },
  bottom: { axis: 'z', high: false },
  top: { axis: 'z', high: true },
};

/**
 * "Aft bulkhead of Hold 2" in one step: the face's outline (a rectangle for a box, the section
 * polygon for a prism's end), side A the compartment, side B the neighbour sharing that face, else
 * the sea for the shell below and at the sides, else open air.
 */
export function faceBoundary(
  c: Compartment,
  face: Face,
  all: readonly Compartment[],
): { name: string; kind: string; geometry: BoundaryGeometry; sideB: { kind: 'compartment'; compartmentId: string } | { kind: 'sea' } | { kind: 'air' } } {
  const e = extentOf(c);
  const { axis, high } = FACE_AXIS[face];
  const at = high ? e.max[axis] : e.min[axis];
  const plane = planeOfAxis(axis);
  const ax = PLANE_AXES[plane];
  // side A = this compartment, inside; the normal points out of it: +axis on the high face
  const sideA: 'low' | 'high' = high ? 'low' : 'high';
  let geometry: BoundaryGeometry;
  if (c.geometry.kind === 'prism' && axis === 'x') {
    geometry = planeShapeToGeometry({ ...emptyPlaneShape(), plane, at, sideA, shape: 'polygon', points: c.geometry.section.map((p) => ({ a: p.y, b: p.z })) });
  } else {
    geometry = planeShapeToGeometry({ ...emptyPlaneShape(), plane, at, sideA, shape: 'rectangle', a1: e.min[ax.a], a2: e.max[ax.a], b1: e.min[ax.b], b2: e.max[ax.b] });
  }
  const tol = 0.01;
  const neighbour = all.find((o) => {
    if (o.id === c.id) return false;
    const oe = extentOf(o);
    const touching = Math.abs((high ? oe.min[axis] : oe.max[axis]) - at) < tol;
    const overlaps = (['x', 'y', 'z'] as const).filter((k) => k !== axis).every((k) => oe.min[k] < e.max[k] - tol && oe.max[k] > e.min[k] + tol);
    return touching && overlaps;
  });
  const sideB = neighbour
    ? ({ kind: 'compartment', compartmentId: neighbour.id } as const)
    : face === 'top' || face === 'aft' || face === 'forward'
      ? ({ kind: 'air' } as const)
      : ({ kind: 'sea' } as const);
  const kind = FACE_KIND[face] === 'shell' && face === 'bottom' && neighbour ? 'tank-top' : neighbour && (face === 'port' || face === 'starboard') ? 'bulkhead' : FACE_KIND[face];
  const word = face === 'top' ? 'deck over' : face === 'bottom' ? (neighbour ? 'tank top under' : 'bottom shell of') : face === 'port' || face === 'starboard' ? `${face} side of` : `${face} bulkhead of`;
  return { name: `${word[0].toUpperCase()}${word.slice(1)} ${c.name}`, kind, geometry, sideB };
}
