/**
 * Closed polyhedra (outward-oriented faces) and their volume and centroid below a level plane.
 * The solid below the plane is bounded by the faces clipped to the plane plus a cap in the plane.
 * Summing signed tetrahedra from a point O on the plane (divergence theorem), the cap's tetrahedra
 * are flat and vanish, so the cap never needs building and non-convex solids come out exact.
 */
import type { CompartmentGeometry } from '../schemas/survey';
import type { V3 } from './vec';

export type Polyhedron = V3[][];

/** Faces of a compartment solid, outward-oriented. */
export function compartmentSolid(g: CompartmentGeometry): Polyhedron {
  if (g.kind === 'box') {
    const section = [
      { y: g.min.y, z: g.min.z },
      { y: g.max.y, z: g.min.z },
      { y: g.max.y, z: g.max.z },
      { y: g.min.y, z: g.max.z },
    ];
    return prismSolid(g.min.x, g.max.x, section);
  }
  return prismSolid(g.xAftM, g.xForeM, g.section);
}

function prismSolid(xa: number, xf: number, sectionIn: readonly { y: number; z: number }[]): Polyhedron {
  let section = sectionIn;
  let area2 = 0;
  for (let i = 0; i < section.length; i++) {
    const a = section[i], b = section[(i + 1) % section.length];
    area2 += a.y * b.z - b.y * a.z;
  }
  if (area2 < 0) section = [...section].reverse();
  if (xf < xa) [xa, xf] = [xf, xa];
  const fore: V3[] = section.map((p) => [xf, p.y, p.z]);
  const aft: V3[] = section.map((p) => [xa, p.y, p.z]).reverse() as V3[];
  const faces: Polyhedron = [fore, aft];
  for (let i = 0; i < section.length; i++) {
    const a = section[i], b = section[(i + 1) % section.length];
    faces.push([
      [xa, a.y, a.z],
      [xa, b.y, b.z],
      [xf, b.y, b.z],
      [xf, a.y, a.z],
    ]);
  }
  return faces;
}

export interface VolumeMoments {
  /** m³ */
  volume: number;
  /** First moments ∫x dV, ∫y dV, ∫z dV, m⁴. */
  mx: number;
  my: number;
  mz: number;
}

/**
 * A solid as flat arrays (no small array per vertex): face f's vertices are
 * xyz[3 faceStart[f] .. 3 faceStart[f + 1]), in the order of the Polyhedron's faces and vertices.
 * Made into scratch space by compartmentSolidInto or flattenSolid.
 */
export interface FlatSolid {
  xyz: Float64Array;
  faceStart: Int32Array;
  nFaces: number;
}

export function newFlatSolid(): FlatSolid {
  return { xyz: new Float64Array(3 * 32), faceStart: new Int32Array(16), nFaces: 0 };
}

function reserve(s: FlatSolid, vertices: number, faces: number): void {
  if (s.xyz.length < 3 * vertices) s.xyz = new Float64Array(6 * vertices);
  if (s.faceStart.length < faces + 1) s.faceStart = new Int32Array(2 * (faces + 1));
}

/** A Polyhedron's faces copied into a flat solid (the same vertices in the same order). */
export function flattenSolid(solid: Polyhedron, out: FlatSolid): FlatSolid {
  let nv = 0;
  for (const f of solid) nv += f.length;
  reserve(out, nv, solid.length);
  let k = 0;
  for (let f = 0; f < solid.length; f++) {
    out.faceStart[f] = k / 3;
    for (const p of solid[f]) {
      out.xyz[k++] = p[0];
      out.xyz[k++] = p[1];
      out.xyz[k++] = p[2];
    }
  }
  out.faceStart[solid.length] = k / 3;
  out.nFaces = solid.length;
  return out;
}

/** compartmentSolid written into a flat solid: the same faces and vertices, without the small arrays. */
export function compartmentSolidInto(g: CompartmentGeometry, out: FlatSolid): FlatSolid {
  if (g.kind === 'box') {
    boxSection[0].y = g.min.y;
    boxSection[0].z = g.min.z;
    boxSection[1].y = g.max.y;
    boxSection[1].z = g.min.z;
    boxSection[2].y = g.max.y;
    boxSection[2].z = g.max.z;
    boxSection[3].y = g.min.y;
    boxSection[3].z = g.max.z;
    return prismInto(g.min.x, g.max.x, boxSection, out);
  }
  return prismInto(g.xAftM, g.xForeM, g.section, out);
}
const boxSection = [
  { y: 0, z: 0 },
  { y: 0, z: 0 },
  { y: 0, z: 0 },
  { y: 0, z: 0 },
];

/** prismSolid's faces into a flat solid: fore face, aft face (reversed), then one side face per section edge. */
function prismInto(xaIn: number, xfIn: number, section: readonly { y: number; z: number }[], out: FlatSolid): FlatSolid {
  const n = section.length;
  let area2 = 0;
  for (let i = 0; i < n; i++) {
    const a = section[i], b = section[(i + 1) % n];
    area2 += a.y * b.z - b.y * a.z;
  }
  const rev = area2 < 0;
  // the section as prismSolid orders it
  const at = (i: number) => section[rev ? n - 1 - i : i];
  const xa = xfIn < xaIn ? xfIn : xaIn;
  const xf = xfIn < xaIn ? xaIn : xfIn;
  reserve(out, 2 * n + 4 * n, 2 + n);
  const xyz = out.xyz;
  let k = 0;
  const put = (x: number, y: number, z: number) => {
    xyz[k++] = x;
    xyz[k++] = y;
    xyz[k++] = z;
  };
  out.faceStart[0] = 0;
  for (let i = 0; i < n; i++) put(xf, at(i).y, at(i).z);
  out.faceStart[1] = n;
  for (let i = n - 1; i >= 0; i--) put(xa, at(i).y, at(i).z);
  for (let i = 0; i < n; i++) {
    out.faceStart[2 + i] = k / 3;
    const a = at(i), b = at((i + 1) % n);
    put(xa, a.y, a.z);
    put(xa, b.y, b.z);
    put(xf, b.y, b.z);
    put(xf, a.y, a.z);
  }
  out.faceStart[2 + n] = k / 3;
  out.nFaces = 2 + n;
  return out;
}

export interface VolumeMoments {
  /** m³ */
  volume: number;
  /** First moments ∫x dV, ∫y dV, ∫z dV, m⁴. */
  mx: number;
  my: number;
  mz: number;
}

/** Scratch for one clipped face, and for a Polyhedron flattened (the engine is synchronous and never re-entered). */
let clipBuf = new Float64Array(64);
const flatScratch = newFlatSolid();

/**
 * Volume and first moments of the part of the solid whose elevation up·p ≤ eta
 * (eta = +∞ for the whole solid). `up` must be a unit vector.
 */
export function volumeBelow(solid: Polyhedron, up: V3, eta: number): VolumeMoments {
  return volumeBelowFlat(flattenSolid(solid, flatScratch), up, eta);
}

/** volumeBelow of a flat solid. */
export function volumeBelowFlat(solid: FlatSolid, up: V3, eta: number): VolumeMoments {
  const whole = !Number.isFinite(eta) || eta === Infinity;
  const ox = whole ? 0 : up[0] * eta, oy = whole ? 0 : up[1] * eta, oz = whole ? 0 : up[2] * eta;
  let vol = 0, mx = 0, my = 0, mz = 0;
  const P = solid.xyz;
  for (let f = 0; f < solid.nFaces; f++) {
    const first = solid.faceStart[f], n = solid.faceStart[f + 1] - first;
    // a face cut by a plane keeps at most n + 1 vertices; the scratch buffer grows, never shrinks
    if (clipBuf.length < 3 * (n + 1)) clipBuf = new Float64Array(6 * (n + 1));
    const clipped = clipBuf;
    let m = 0;
    for (let i = 0; i < n; i++) {
      const a = 3 * (first + i), b = 3 * (first + ((i + 1) % n));
      const da = whole ? -1 : P[a] * up[0] + P[a + 1] * up[1] + P[a + 2] * up[2] - eta;
      const db = whole ? -1 : P[b] * up[0] + P[b + 1] * up[1] + P[b + 2] * up[2] - eta;
      if (da <= 0) {
        clipped[m++] = P[a] - ox;
        clipped[m++] = P[a + 1] - oy;
        clipped[m++] = P[a + 2] - oz;
      }
      if ((da < 0 && db > 0) || (da > 0 && db < 0)) {
        const t = da / (da - db);
        clipped[m++] = P[a] + t * (P[b] - P[a]) - ox;
        clipped[m++] = P[a + 1] + t * (P[b + 1] - P[a + 1]) - oy;
        clipped[m++] = P[a + 2] + t * (P[b + 2] - P[a + 2]) - oz;
      }
    }
    if (m < 9) continue;
    const x0 = clipped[0], y0 = clipped[1], z0 = clipped[2];
    for (let i = 3; i + 5 < m; i += 3) {
      const x1 = clipped[i], y1 = clipped[i + 1], z1 = clipped[i + 2];
      const x2 = clipped[i + 3], y2 = clipped[i + 4], z2 = clipped[i + 5];
      const det = x0 * (y1 * z2 - z1 * y2) - y0 * (x1 * z2 - z1 * x2) + z0 * (x1 * y2 - y1 * x2);
      const v = det / 6;
      vol += v;
      mx += (v * (x0 + x1 + x2)) / 4;
      my += (v * (y0 + y1 + y2)) / 4;
      mz += (v * (z0 + z1 + z2)) / 4;
    }
  }
  // moments about O → about the ship origin
  return { volume: vol, mx: mx + ox * vol, my: my + oy * vol, mz: mz + oz * vol };
}

/** Lowest and highest elevation of the solid's vertices. */
export function elevationRange(solid: Polyhedron, up: V3): [number, number] {
  return elevationRangeFlat(flattenSolid(solid, flatScratch), up);
}

/** elevationRange of a flat solid. */
export function elevationRangeFlat(solid: FlatSolid, up: V3): [number, number] {
  let lo = Infinity, hi = -Infinity;
  const P = solid.xyz, end = 3 * solid.faceStart[solid.nFaces];
  for (let k = 0; k < end; k += 3) {
    const e = P[k] * up[0] + P[k + 1] * up[1] + P[k + 2] * up[2];
    if (e < lo) lo = e;
    if (e > hi) hi = e;
  }
  return [lo, hi];
}

/** Whether a ship point lies inside the solid (ray casting in x through the faces). */
export function insideSolid(g: CompartmentGeometry, p: V3): boolean {
  if (g.kind === 'box') {
    return p[0] >= g.min.x && p[0] <= g.max.x && p[1] >= g.min.y && p[1] <= g.max.y && p[2] >= g.min.z && p[2] <= g.max.z;
  }
  const xa = Math.min(g.xAftM, g.xForeM), xf = Math.max(g.xAftM, g.xForeM);
  if (p[0] < xa || p[0] > xf) return false;
  let inside = false;
  const s = g.section;
  for (let i = 0, j = s.length - 1; i < s.length; j = i++) {
    if (s[i].z > p[2] !== s[j].z > p[2] && p[1] < ((s[j].y - s[i].y) * (p[2] - s[i].z)) / (s[j].z - s[i].z) + s[i].y) inside = !inside;
  }
  return inside;
}
