/**
 * Linear algebra for the flooding solver's W = I − γhJ when many spaces are joined: a reverse
 * Cuthill–McKee ordering of the spaces (so joined spaces sit close together and W's nonzeros lie in
 * a narrow band), Gaussian elimination with partial pivoting inside that band, and the dense LU it
 * replaces for small groups. A chain of n spaces then costs O(n) per factorisation instead of
 * O(n³/3); a grid of r × c spaces O(n·min(r, c)²).
 *
 * Sources: E. Cuthill & J. McKee, "Reducing the bandwidth of sparse symmetric matrices", Proc. 24th
 * ACM National Conference (1969), reversed as in A. George & J. W. H. Liu, Computer Solution of Large
 * Sparse Positive Definite Systems (Prentice-Hall, 1981), ch. 4, with their pseudo-peripheral start
 * node; band LU with partial pivoting as in G. H. Golub & C. F. Van Loan, Matrix Computations (4th ed.),
 * §4.3.5 (the upper bandwidth grows from ku to kl + ku), stored as LINPACK's DGBFA/DGBSL keep it
 * (multipliers left in place, interchanges applied in order while solving).
 */

/**
 * Reverse Cuthill–McKee order of a graph given by its neighbour lists: `order[k]` is the node put
 * k-th. Every component is ordered, each from a pseudo-peripheral node (George & Liu).
 */
export function reverseCuthillMcKee(neighbours: readonly (readonly number[])[]): Int32Array {
  const n = neighbours.length;
  const degree = neighbours.map((a) => a.length);
  const placed = new Uint8Array(n);
  const order: number[] = [];
  const level = new Int32Array(n);
  // breadth-first levels from `root` over nodes not yet placed; returns the last level's nodes
  const levels = (root: number): { depth: number; last: number[] } => {
    level.fill(-1);
    level[root] = 0;
    let frontier = [root], depth = 0;
    for (;;) {
      const next: number[] = [];
      for (const u of frontier) for (const v of neighbours[u]) if (!placed[v] && level[v] < 0) {
        level[v] = depth + 1;
        next.push(v);
      }
      if (next.length === 0) return { depth, last: frontier };
      frontier = next;
      depth++;
    }
  };
  for (let seed = 0; seed < n; seed++) {
    if (placed[seed]) continue;
    // pseudo-peripheral node: move to a least-degree node of the deepest level while the depth grows
    let root = seed;
    let { depth, last } = levels(root);
    for (let tries = 0; tries < 8; tries++) {
      const far = last.reduce((a, b) => (degree[b] < degree[a] ? b : a));
      const r = levels(far);
      if (r.depth <= depth) break;
      root = far;
      depth = r.depth;
      last = r.last;
    }
    // Cuthill–McKee: breadth first, neighbours by increasing degree
    const start = order.length;
    placed[root] = 1;
    order.push(root);
    for (let head = start; head < order.length; head++) {
      const fresh = neighbours[order[head]].filter((v) => !placed[v]);
      fresh.sort((a, b) => degree[a] - degree[b] || a - b);
      for (const v of fresh) if (!placed[v]) {
        placed[v] = 1;
        order.push(v);
      }
    }
    // reversed, per component
    const part = order.splice(start).reverse();
    order.push(...part);
  }
  return Int32Array.from(order);
}

/** Lower and upper bandwidths of a dense row-major n × n matrix (the widest nonzero offsets). */
export function bandwidths(a: Float64Array, n: number): { kl: number; ku: number } {
  let kl = 0, ku = 0;
  for (let i = 0; i < n; i++) {
    const row = i * n;
    for (let j = 0; j < i - kl; j++) if (a[row + j] !== 0) {
      kl = i - j;
      break;
    }
    for (let j = n - 1; j > i + ku; j--) if (a[row + j] !== 0) {
      ku = j - i;
      break;
    }
  }
  return { kl, ku };
}

/** Whether a band of these widths is worth it over the dense LU for an n × n matrix (work n·kl·(kl+ku) against n³/3). */
export function bandPays(n: number, kl: number, ku: number): boolean {
  return n >= 24 && 3 * kl * (2 * kl + ku + 1) < n * n;
}

/**
 * A band LU of W = I − gh·A (A dense row-major n × n with the given bandwidths): rows hold columns
 * i − kl … i + kl + ku (width 2kl + ku + 1), the fill that partial pivoting brings included.
 */
export interface BandLu {
  n: number;
  kl: number;
  ku: number;
  width: number;
  band: Float64Array;
  piv: Int32Array;
}

export function newBandLu(n: number, kl: number, ku: number, reuse?: BandLu): BandLu {
  const width = 2 * kl + ku + 1;
  const band = reuse && reuse.band.length >= n * width ? reuse.band : new Float64Array(n * width);
  const piv = reuse && reuse.piv.length >= n ? reuse.piv : new Int32Array(n);
  return { n, kl, ku, width, band, piv };
}

/** Factorises W = I − gh·A into `lu` (Golub & Van Loan §4.3.5; LINPACK DGBFA's layout). */
export function bandFactorise(a: Float64Array, gh: number, lu: BandLu): void {
  const { n, kl, ku, width, band, piv } = lu;
  band.fill(0, 0, n * width);
  // column j of row i sits at i·width + (j − i + kl)
  for (let i = 0; i < n; i++) {
    const lo = Math.max(0, i - kl), hi = Math.min(n - 1, i + ku);
    for (let j = lo; j <= hi; j++) band[i * width + j - i + kl] = -gh * a[i * n + j];
    band[i * width + kl] += 1;
  }
  for (let k = 0; k < n; k++) {
    const last = Math.min(n - 1, k + kl);
    let p = k, best = Math.abs(band[k * width + kl]);
    for (let i = k + 1; i <= last; i++) {
      const v = Math.abs(band[i * width + k - i + kl]);
      if (v > best) {
        best = v;
        p = i;
      }
    }
    piv[k] = p;
    const right = Math.min(n - 1, k + kl + ku);
    if (p !== k) {
      for (let j = k; j <= right; j++) {
        const ik = k * width + j - k + kl, ip = p * width + j - p + kl;
        const t = band[ik];
        band[ik] = band[ip];
        band[ip] = t;
      }
    }
    const d = band[k * width + kl];
    if (d === 0) continue;
    for (let i = k + 1; i <= last; i++) {
      const at = i * width + k - i + kl;
      const l = (band[at] /= d);
      if (l === 0) continue;
      const ri = i * width - i + kl, rk = k * width - k + kl;
      for (let j = k + 1; j <= right; j++) band[ri + j] -= l * band[rk + j];
    }
  }
}

/** Solves W x = b in place with a band LU. */
export function bandSolve(lu: BandLu, x: Float64Array): void {
  const { n, kl, ku, width, band, piv } = lu;
  // L: the interchanges and multipliers of each step, in the order they were made
  for (let k = 0; k < n; k++) {
    const p = piv[k];
    if (p !== k) {
      const t = x[k];
      x[k] = x[p];
      x[p] = t;
    }
    const xk = x[k];
    if (xk === 0) continue;
    const last = Math.min(n - 1, k + kl);
    for (let i = k + 1; i <= last; i++) x[i] -= band[i * width + k - i + kl] * xk;
  }
  // U, upper bandwidth kl + ku
  for (let k = n - 1; k >= 0; k--) {
    const right = Math.min(n - 1, k + kl + ku);
    const rk = k * width - k + kl;
    let s = x[k];
    for (let j = k + 1; j <= right; j++) s -= band[rk + j] * x[j];
    const d = band[rk + k];
    x[k] = d === 0 ? 0 : s / d;
  }
}

/** LU with partial pivoting of W = I − gh·A (row-major, size n), into lu and piv (Golub & Van Loan, Matrix Computations, Alg. 3.4.1). */
export function denseFactorise(a: Float64Array, gh: number, n: number, lu: Float64Array, piv: Int32Array): void {
  for (let i = 0; i < n * n; i++) lu[i] = -gh * a[i];
  for (let i = 0; i < n; i++) lu[i * n + i] += 1;
  for (let k = 0; k < n; k++) {
    let p = k, best = Math.abs(lu[k * n + k]);
    for (let i = k + 1; i < n; i++) {
      const v = Math.abs(lu[i * n + k]);
      if (v > best) {
        best = v;
        p = i;
      }
    }
    piv[k] = p;
    if (p !== k) for (let c = 0; c < n; c++) [lu[k * n + c], lu[p * n + c]] = [lu[p * n + c], lu[k * n + c]];
    const d = lu[k * n + k];
    if (d === 0) continue;
    for (let i = k + 1; i < n; i++) {
      const l = (lu[i * n + k] /= d);
      if (l === 0) continue;
      for (let c = k + 1; c < n; c++) lu[i * n + c] -= l * lu[k * n + c];
    }
  }
}

/** Solves W x = b in place with a dense LU from denseFactorise. */
export function denseSolve(lu: Float64Array, piv: Int32Array, n: number, x: Float64Array): void {
  // the rows were swapped whole while factorising (P W = L U): permute b first, then L, then U
  for (let k = 0; k < n; k++) {
    const p = piv[k];
    if (p !== k) [x[k], x[p]] = [x[p], x[k]];
  }
  for (let k = 0; k < n; k++) for (let i = k + 1; i < n; i++) x[i] -= lu[i * n + k] * x[k];
  for (let k = n - 1; k >= 0; k--) {
    let s = x[k];
    for (let c = k + 1; c < n; c++) s -= lu[k * n + c] * x[c];
    const d = lu[k * n + k];
    x[k] = d === 0 ? 0 : s / d;
  }
}
