/**
 * Area, centroid and second moments of a flat section lying in a level plane: a liquid's free
 * surface, or the waterplane a space open to the sea takes away. The loops come from
 * mesh.ts `planeSection` (anticlockwise seen from above, so areas add with their signs).
 *
 * In-plane axes: `along` is the ship's x axis projected into the level plane, `across` completes a
 * right-handed set with earth-up (`along × across = up`, so `across` points to port when upright).
 * `iAlongM4` is the second moment about the centroidal axis running along the ship (the one that
 * governs transverse stability, i_T in the texts), `iAcrossM4` about the centroidal axis running
 * athwartships (i_L). Polygon moments by Green's theorem in closed form (e.g. Bourke, "Calculating
 * the area and centroid of a polygon", 1988; the second-moment terms are the standard extension).
 */
import { cross, dot, scale, sub, unit, type V3 } from './vec';

export interface SectionMoments {
  /** m² (in the level plane) */
  areaM2: number;
  /** Centroid, ship axes (null without area). */
  centroid: V3 | null;
  /** Second moment about the centroidal axis along the ship, m⁴ (transverse free surface, i_T). */
  iAlongM4: number;
  /** Second moment about the centroidal axis across the ship, m⁴ (longitudinal, i_L). */
  iAcrossM4: number;
}

/** Moments of the loops lying in the level plane whose unit normal is `up`. */
export function sectionMoments(loops: readonly (readonly V3[])[], up: V3): SectionMoments {
  const along = unit(sub([1, 0, 0], scale(up, up[0])));
  const across = cross(up, along);
  let a = 0, su = 0, sv = 0, suu = 0, svv = 0;
  let origin: V3 | null = null;
  for (const loop of loops) {
    if (loop.length < 3) continue;
    origin ??= loop[0];
    const o = origin;
    const uv = loop.map((p) => {
      const d = sub(p, o);
      return [dot(d, along), dot(d, across)] as const;
    });
    for (let i = 0; i < uv.length; i++) {
      const [x0, y0] = uv[i];
      const [x1, y1] = uv[(i + 1) % uv.length];
      const c = x0 * y1 - x1 * y0;
      a += c / 2;
      su += ((x0 + x1) * c) / 6;
      sv += ((y0 + y1) * c) / 6;
      suu += ((x0 * x0 + x0 * x1 + x1 * x1) * c) / 12;
      svv += ((y0 * y0 + y0 * y1 + y1 * y1) * c) / 12;
    }
  }
  if (!origin || !(Math.abs(a) > 1e-12)) return { areaM2: 0, centroid: null, iAlongM4: 0, iAcrossM4: 0 };
  const cu = su / a, cv = sv / a;
  const centroid: V3 = [
    origin[0] + along[0] * cu + across[0] * cv,
    origin[1] + along[1] * cu + across[1] * cv,
    origin[2] + along[2] * cu + across[2] * cv,
  ];
  // Parallel-axis theorem to the centroid: ∫v² dA − A·cv² about the axis along the ship.
  return { areaM2: a, centroid, iAlongM4: svv - a * cv * cv, iAcrossM4: suu - a * cu * cu };
}
