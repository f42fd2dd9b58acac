/**
 * The column store of boundary summaries (results.ts BoundaryTable): made with a row count, filled
 * row by row, read back one row at a time. Typed-array columns live outside V8's young generation,
 * so a computation's results are not copied between scavenges however many boundaries there are.
 */
import { BOUNDARY_NUMBER_FIELDS, type BoundarySummary, type BoundaryTable } from './results';

export function newBoundaryTable(capacity: number): BoundaryTable {
  // every column in one literal, so the table keeps fast properties (a column added in a loop
  // would turn it into a dictionary, and every write of every row into a hash look-up)
  const f = () => new Float64Array(capacity);
  return {
    length: 0,
    id: new Array<string>(capacity),
    name: new Array<string>(capacity),
    kind: new Array<string>(capacity),
    geometryKind: new Array<BoundarySummary['geometryKind']>(capacity),
    parentBoundaryId: new Array<string | null>(capacity),
    sideA: new Array<BoundarySummary['sideA']>(capacity),
    sideB: new Array<BoundarySummary['sideB']>(capacity),
    signChange: new Uint8Array(capacity),
    capacityDirection: new Array<BoundarySummary['capacityDirection']>(capacity),
    capacityKind: new Array<BoundarySummary['capacityKind']>(capacity),
    areaM2: f(),
    forceN: f(),
    resultantN: f(),
    forceX: f(),
    forceY: f(),
    forceZ: f(),
    copX: f(),
    copY: f(),
    copZ: f(),
    normalX: f(),
    normalY: f(),
    normalZ: f(),
    peakPressurePa: f(),
    capacityUtilisation: f(),
    capacityRated: f(),
    capacityActual: f(),
    stiffenerUtilisation: f(),
    platingUtilisation: f(),
    shoreUtilisation: f(),
    maxUtilisation: f(),
  } satisfies Record<keyof BoundaryTable, unknown>;
}

const nan = (x: number | null): number => (x === null ? NaN : x);
const nullable = (x: number): number | null => (Number.isNaN(x) ? null : x);

/** Writes a summary row at index i (the table's length is the caller's to set). */
export function setBoundaryRow(t: BoundaryTable, i: number, r: BoundarySummary): void {
  t.id[i] = r.id;
  t.name[i] = r.name;
  t.kind[i] = r.kind;
  t.geometryKind[i] = r.geometryKind;
  t.parentBoundaryId[i] = r.parentBoundaryId;
  t.sideA[i] = r.sideA;
  t.sideB[i] = r.sideB;
  t.signChange[i] = r.signChange ? 1 : 0;
  t.capacityDirection[i] = r.capacityDirection;
  t.capacityKind[i] = r.capacityKind;
  for (const f of BOUNDARY_NUMBER_FIELDS) t[f][i] = nan(r[f]);
}

/** Row i as a plain object (nulls where the column holds NaN). */
export function boundaryRow(t: BoundaryTable, i: number): BoundarySummary {
  const row = {
    id: t.id[i],
    name: t.name[i],
    kind: t.kind[i],
    geometryKind: t.geometryKind[i],
    parentBoundaryId: t.parentBoundaryId[i],
    sideA: t.sideA[i],
    sideB: t.sideB[i],
    signChange: t.signChange[i] === 1,
    capacityDirection: t.capacityDirection[i],
    capacityKind: t.capacityKind[i],
  } as BoundarySummary;
  for (const f of BOUNDARY_NUMBER_FIELDS) (row as Record<typeof f, number | null>)[f] = nullable(t[f][i]);
  return row;
}

/** Every row as plain objects, in table order. */
export function boundaryRows(t: BoundaryTable): BoundarySummary[] {
  const out = new Array<BoundarySummary>(t.length);
  for (let i = 0; i < t.length; i++) out[i] = boundaryRow(t, i);
  return out;
}

/** A table holding the given rows (the desk shows stored full results through the same views). */
export function tableOfRows(rows: readonly BoundarySummary[]): BoundaryTable {
  const t = newBoundaryTable(rows.length);
  rows.forEach((r, i) => setBoundaryRow(t, i, r));
  t.length = rows.length;
  return t;
}

/** Index of the row with this boundary id, or −1. */
export function boundaryIndex(t: BoundaryTable, id: string | null | undefined): number {
  if (!id) return -1;
  for (let i = 0; i < t.length; i++) if (t.id[i] === id) return i;
  return -1;
}
