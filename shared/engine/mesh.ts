/**
 * Shapes for drawing, not for numbers: a compartment solid cut to the slab of one liquid layer
 * (between two level planes), and a boundary's outline as flat polygons. The 3D view draws these
 * so it never works out geometry itself. Cutting is Sutherland–Hodgman clipping of each face
 * against the plane (Sutherland & Hodgman, "Reentrant polygon clipping", CACM 17(1), 1974), plus
 * a cap polygon chained from the cut edges, so non-convex prism sections come out right.
 */
import type { BoundaryGeometry, CompartmentGeometry } from '../schemas/survey';
import { compartmentSolid, type Polyhedron } from './polyhedron';
import { add, cross, dot, scale, sub, unit, type V3 } from './vec';

const EPS = 1e-9;

/** The part of a closed solid with n·p ≤ d (n need not be unit), as a closed solid. */
export function clipSolid(solid: Polyhedron, n: V3, d: number): Polyhedron {
  const { faces, caps } = clipWithCaps(solid, n, d);
  return [...faces, ...caps];
}

/**
 * The section of a closed solid by the plane n·p = d: the cap loops of clipSolid, each running
 * anticlockwise seen from the side n points to. A liquid's free surface is this section at its level.
 */
export function planeSection(solid: Polyhedron, n: V3, d: number): V3[][] {
  return clipWithCaps(solid, n, d).caps;
}

function clipWithCaps(solid: Polyhedron, n: V3, d: number): { faces: Polyhedron; caps: V3[][] } {
  const out: Polyhedron = [];
  const caps: V3[][] = [];
  const segments: [V3, V3][] = [];
  for (const face of solid) {
    const pts: V3[] = [];
    const onPlane: boolean[] = [];
    const m = face.length;
    for (let i = 0; i < m; i++) {
      const a = face[i], b = face[(i + 1) % m];
      const da = dot(n, a) - d, db = dot(n, b) - d;
      if (da <= EPS) {
        pts.push(a);
        onPlane.push(Math.abs(da) <= EPS);
      }
      if ((da < -EPS && db > EPS) || (da > EPS && db < -EPS)) {
        const t = da / (da - db);
        pts.push(add(a, scale(sub(b, a), t)));
        onPlane.push(true);
      }
    }
    if (pts.length < 3) continue;
    out.push(pts);
    if (onPlane.every(Boolean)) continue; // the face lies in the plane: it is its own cap
    for (let i = 0; i < pts.length; i++) {
      const j = (i + 1) % pts.length;
      if (onPlane[i] && onPlane[j]) segments.push([pts[i], pts[j]]);
    }
  }
  // Chain the cut edges into loops; faces run each edge one way, so the cap runs it the other.
  const key = (p: V3) => p.map((c) => Math.round(c * 1e6)).join(',');
  const byStart = new Map<string, [V3, V3][]>();
  for (const s of segments) {
    const k = key(s[1]); // reversed: the cap edge starts at the face edge's end
    const list = byStart.get(k) ?? [];
    list.push(s);
    byStart.set(k, list);
  }
  const used = new Set<[V3, V3]>();
  for (const s of segments) {
    if (used.has(s)) continue;
    const loop: V3[] = [];
    let cur: [V3, V3] | undefined = s;
    while (cur && !used.has(cur)) {
      used.add(cur);
      loop.push(cur[1]);
      const next: [V3, V3][] = byStart.get(key(cur[0])) ?? [];
      cur = next.find((x) => !used.has(x));
    }
    if (loop.length >= 3) caps.push(loop);
  }
  return { faces: out, caps };
}

/**
 * The solid of a compartment between elevations etaLow and etaHigh along the unit earth-up vector
 * (−∞ / +∞ for no bound): the body of one liquid layer at the ship's heel and trim.
 */
export function liquidBody(geometry: CompartmentGeometry, up: V3, etaLow: number, etaHigh: number): Polyhedron {
  let s = compartmentSolid(geometry);
  if (Number.isFinite(etaHigh)) s = clipSolid(s, up, etaHigh);
  if (Number.isFinite(etaLow)) s = clipSolid(s, scale(up, -1), -etaLow);
  return s;
}

export { compartmentSolid };

/** A circle as a regular polygon of `segments` sides (drawing only). */
function circlePolygon(centre: V3, normal: V3, r: number, segments: number): V3[] {
  const n = unit(normal);
  const helper: V3 = Math.abs(n[2]) < 0.9 ? [0, 0, 1] : [1, 0, 0];
  const u = unit(cross(helper, n));
  const v = cross(n, u);
  const pts: V3[] = [];
  for (let i = 0; i < segments; i++) {
    const a = (2 * Math.PI * i) / segments;
    pts.push(add(centre, add(scale(u, r * Math.cos(a)), scale(v, r * Math.sin(a)))));
  }
  return pts;
}

/** A boundary's outline as one or more flat polygons, ship axes, m. */
export function boundaryPolygons(g: BoundaryGeometry, circleSegments = 48): V3[][] {
  const p = (q: { x: number; y: number; z: number }): V3 => [q.x, q.y, q.z];
  switch (g.kind) {
    case 'polygon':
      return [g.vertices.map(p)];
    case 'rectangle': {
      const o = p(g.origin), u = p(g.edgeU), v = p(g.edgeV);
      return [[o, add(o, u), add(add(o, u), v), add(o, v)]];
    }
    case 'circle':
      return [circlePolygon(p(g.centre), p(g.normal), g.radiusM, circleSegments)];
    case 'faceted':
      return g.facets.map((f) => f.vertices.map(p));
  }
}
