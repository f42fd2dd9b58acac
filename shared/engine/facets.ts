/**
 * Orientation of a faceted surface. Facets of one surface are consistently oriented when every
 * edge two facets share is walked in opposite directions by the two (the usual rule for an
 * oriented polygon mesh, e.g. de Berg et al., Computational Geometry, §2.2 on doubly-connected edge
 * lists). A facet listed the other way round pushes its load the wrong way and the sum is wrong
 * without any sign of it, so the engine checks and the editor offers to turn the odd facets over.
 */

type P3 = { x: number; y: number; z: number };

export interface FacetOrientation {
  /** Facets whose vertex order disagrees with the larger consistent group; reversing them fixes the surface. */
  reversed: number[];
  /** Pairs of facets that share an edge walked the same way. */
  conflicts: number;
}

/** Vertex key at 1 mm, so vertices typed twice match. */
const key = (p: P3): string => `${Math.round(p.x * 1000)},${Math.round(p.y * 1000)},${Math.round(p.z * 1000)}`;

/**
 * Checks that facets sharing an edge walk it in opposite directions, grouping connected facets;
 * within each group the smaller side of the disagreement is reported as reversed.
 */
export function facetOrientation(facets: readonly { vertices: readonly P3[] }[]): FacetOrientation {
  const n = facets.length;
  // edge (undirected key) → list of [facet, +1 if walked lo→hi, −1 otherwise]
  const edges = new Map<string, [number, number][]>();
  facets.forEach((f, i) => {
    const vs = f.vertices.map(key);
    for (let k = 0; k < vs.length; k++) {
      const a = vs[k], b = vs[(k + 1) % vs.length];
      if (a === b) continue;
      const [lo, hi, dir] = a < b ? [a, b, 1] : [b, a, -1];
      const id = `${lo}|${hi}`;
      const list = edges.get(id) ?? [];
      list.push([i, dir]);
      edges.set(id, list);
    }
  });
  // neighbours with whether they must flip relative to each other
  const adj: [number, boolean][][] = Array.from({ length: n }, () => []);
  for (const list of edges.values()) {
    for (let x = 0; x < list.length; x++) {
      for (let y = x + 1; y < list.length; y++) {
        const [fi, di] = list[x], [fj, dj] = list[y];
        if (fi === fj) continue;
        const same = di === dj; // same direction: one of the two is reversed
        adj[fi].push([fj, same]);
        adj[fj].push([fi, same]);
      }
    }
  }
  const flip = new Array<number>(n).fill(-1);
  const reversed: number[] = [];
  for (let s = 0; s < n; s++) {
    if (flip[s] >= 0) continue;
    flip[s] = 0;
    const group = [s];
    for (let g = 0; g < group.length; g++) {
      const i = group[g];
      for (const [j, same] of adj[i]) {
        const want = same ? 1 - flip[i] : flip[i];
        if (flip[j] < 0) {
          flip[j] = want;
          group.push(j);
        }
      }
    }
    const ones = group.filter((i) => flip[i] === 1);
    const odd = ones.length * 2 > group.length ? group.filter((i) => flip[i] === 0) : ones;
    reversed.push(...odd);
  }
  return { reversed: reversed.sort((a, b) => a - b), conflicts: countSame(adj) };
}

function countSame(adj: [number, boolean][][]): number {
  let c = 0;
  adj.forEach((list, i) => list.forEach(([j, same]) => (c += i < j && same ? 1 : 0)));
  return c;
}

/** The facets with the given ones turned over (vertex order reversed). */
export function reverseFacets<F extends { vertices: readonly P3[] }>(facets: readonly F[], which: readonly number[]): F[] {
  const set = new Set(which);
  return facets.map((f, i) => (set.has(i) ? { ...f, vertices: [...f.vertices].reverse() } : f));
}
