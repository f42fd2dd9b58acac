/**
 * Compares two sets of engine results number by number. Used to put the server's stored
 * recomputation beside the numbers a device computes, and to compare two revisions. Pure: walks
 * plain JSON, so it works on whatever shape the engine returns.
 */

/** Numbers agree when |a − b| ≤ RELATIVE_TOLERANCE × max(|a|, |b|) (or both are within 1e-12 of zero). */
export const RELATIVE_TOLERANCE = 1e-9;
const ABSOLUTE_FLOOR = 1e-12;

export interface NumberMismatch {
  /** Dotted path with array indices, e.g. boundaries[2].net.forceN. */
  path: string;
  a: number | null;
  b: number | null;
  /** |a − b| / max(|a|, |b|), or null when one side is missing. */
  relative: number | null;
}

export function relativeDifference(a: number, b: number): number {
  const scale = Math.max(Math.abs(a), Math.abs(b));
  if (scale <= ABSOLUTE_FLOOR) return 0;
  return Math.abs(a - b) / scale;
}

export function numbersAgree(a: number, b: number, tolerance = RELATIVE_TOLERANCE): boolean {
  if (Number.isNaN(a) && Number.isNaN(b)) return true;
  if (a === b) return true;
  if (Math.abs(a - b) <= ABSOLUTE_FLOOR) return true;
  return relativeDifference(a, b) <= tolerance;
}

type Json = unknown;

/** Arrays of objects with ids are matched by id, so a reordered list does not read as a change. */
function keyOf(item: Json, index: number): string {
  if (item && typeof item === 'object' && !Array.isArray(item)) {
    const rec = item as Record<string, unknown>;
    for (const k of ['id', 'layerId', 'boundaryId']) if (typeof rec[k] === 'string') return `${k}=${rec[k] as string}`;
  }
  return String(index);
}

/**
 * Every numeric leaf that differs beyond `tolerance`, and every number present on one side only.
 * Strings and booleans are ignored except `engineVersion`, which callers compare themselves.
 */
export function compareNumbers(a: Json, b: Json, tolerance = RELATIVE_TOLERANCE, limit = 500): NumberMismatch[] {
  const out: NumberMismatch[] = [];
  const walk = (x: Json, y: Json, path: string) => {
    if (out.length >= limit) return;
    if (typeof x === 'number' || typeof y === 'number') {
      const xa = typeof x === 'number' ? x : null;
      const yb = typeof y === 'number' ? y : null;
      if (xa === null || yb === null) out.push({ path, a: xa, b: yb, relative: null });
      else if (!numbersAgree(xa, yb, tolerance)) out.push({ path, a: xa, b: yb, relative: relativeDifference(xa, yb) });
      return;
    }
    if (Array.isArray(x) || Array.isArray(y)) {
      const xs = Array.isArray(x) ? x : [];
      const ys = Array.isArray(y) ? y : [];
      const mapY = new Map(ys.map((v, i) => [keyOf(v, i), v] as const));
      const seen = new Set<string>();
      xs.forEach((v, i) => {
        const k = keyOf(v, i);
        seen.add(k);
        walk(v, mapY.get(k), `${path}[${k}]`);
      });
      ys.forEach((v, i) => {
        const k = keyOf(v, i);
        if (!seen.has(k)) walk(undefined, v, `${path}[${k}]`);
      });
      return;
    }
    if ((x && typeof x === 'object') || (y && typeof y === 'object')) {
      const xo = (x && typeof x === 'object' ? x : {}) as Record<string, unknown>;
      const yo = (y && typeof y === 'object' ? y : {}) as Record<string, unknown>;
      const keys = new Set([...Object.keys(xo), ...Object.keys(yo)]);
      for (const k of keys) walk(xo[k], yo[k], path ? `${path}.${k}` : k);
    }
  };
  walk(a, b, '');
  return out;
}

export interface ResultsAgreement {
  /** True when every number agrees and both come from the same engine version. */
  agree: boolean;
  sameEngine: boolean;
  engineA: string | null;
  engineB: string | null;
  mismatches: NumberMismatch[];
}

function engineOf(r: Json): string | null {
  if (r && typeof r === 'object' && typeof (r as Record<string, unknown>).engineVersion === 'string') {
    return (r as Record<string, string>).engineVersion;
  }
  return null;
}

export function compareResults(a: Json, b: Json, tolerance = RELATIVE_TOLERANCE): ResultsAgreement {
  const engineA = engineOf(a);
  const engineB = engineOf(b);
  const mismatches = compareNumbers(a, b, tolerance);
  const sameEngine = engineA === engineB;
  return { agree: sameEngine && mismatches.length === 0, sameEngine, engineA, engineB, mismatches };
}

/** Whether `path` (from compareNumbers) concerns the boundary with this id. */
export function pathConcernsBoundary(path: string, boundaryId: string): boolean {
  return path.startsWith(`boundaries[id=${boundaryId}]`);
}
