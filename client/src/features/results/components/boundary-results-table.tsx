/**
 * Sortable table of every boundary's load; tap a row to open its detail. Utilisation comes right
 * after the name, so a phone shows it without scrolling sideways. Reads summary rows
 * (computeSurveySummary's BoundaryTable as rows), and beyond a screenful renders only the rows in
 * view (TanStack Virtual), so a ship of thousands of boundaries stays a few hundred elements.
 */
import { SortableHeaderRows } from '@client/components/ui/sortable-header';
import { useMemo, useState } from 'react';
import { useVirtualWindow } from '@client/components/ui/use-virtual-window';
import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
  type SortingState,
} from '@tanstack/react-table';
import type { BoundarySummary, SurveyLevelResults } from '@shared/engine';
import type { UnitSystem } from '@shared/units/units';
import { num, unitLabel } from '@client/lib/unit-system';
import { UtilisationBadge } from './utilisation';
import { PointText } from './point-text';
import { sideName } from './side-name';
import { boundaryKindWords, countWords } from '@shared/review/plain-words';
import { ratingFigureWords } from '@shared/review/rating-words';

const col = createColumnHelper<BoundarySummary>();

/** Above this many rows the table scrolls in its own box and renders only what is in view. */
const VIRTUAL_FROM = 60;
const ROW_ESTIMATE_PX = 56;

export function BoundaryResultsTable({
  results,
  rows,
  system,
  selectedId,
  onSelect,
}: {
  /** For the names of the spaces on each side. */
  results: SurveyLevelResults;
  rows: readonly BoundarySummary[];
  system: UnitSystem;
  selectedId?: string | null;
  onSelect?: (id: string) => void;
}) {
  const [sorting, setSorting] = useState<SortingState>([{ id: 'utilisation', desc: true }]);
  const columns = useMemo(
    () => [
      col.accessor('name', {
        header: 'Boundary',
        cell: (c) => (
          <span>
            <span className="font-bold">{c.getValue()}</span>
            <span className="block text-xs text-ink-soft">
              {boundaryKindWords(c.row.original.kind)} · {sideName(results, c.row.original.sideA)} | {sideName(results, c.row.original.sideB)}
            </span>
          </span>
        ),
      }),
      col.accessor((b) => b.maxUtilisation ?? -1, {
        id: 'utilisation',
        header: 'Utilisation',
        cell: (c) => {
          const b = c.row.original;
          const gov = governingWords(b, { A: sideName(results, b.sideA), B: sideName(results, b.sideB) }, system);
          return (
            <span>
              <UtilisationBadge value={b.maxUtilisation} compact />
              {gov && <span className="block text-xs text-ink-soft" data-testid={`governs-${b.id}`}>{gov.what}</span>}
            </span>
          );
        },
      }),
      col.accessor((b) => b.forceN, {
        id: 'force',
        header: `Net force, + towards side B (${unitLabel('force', system)})`,
        cell: (c) => <span data-testid={`net-force-${c.row.original.id}`}>{num(c.getValue(), 'force', system)}</span>,
      }),
      col.accessor((b) => b.peakPressurePa, {
        id: 'peak',
        header: `Peak net pressure, + towards side B (${unitLabel('pressure', system)})`,
        cell: (c) => num(c.getValue(), 'pressure', system),
      }),
      col.accessor((b) => b.copZ, {
        id: 'cop',
        header: 'Centre of pressure',
        sortUndefined: 'last',
        cell: (c) => (
          <span className="text-sm"><PointText point={copOf(c.row.original)} system={system} /></span>
        ),
      }),
    ],
    [results, system],
  );
  const table = useReactTable({
    data: rows as BoundarySummary[],
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });

  const all = table.getRowModel().rows;
  const { scroller, virtual, indices, padTop, padBottom } = useVirtualWindow({ count: all.length, estimatePx: ROW_ESTIMATE_PX, from: VIRTUAL_FROM });
  const shown = indices.map((i) => all[i]);

  if (rows.length === 0) {
    return <p className="text-ink-soft">No boundaries yet. Add one under Plates to see its load.</p>;
  }

  return (
    <div
      ref={scroller}
      className={`overflow-x-auto rounded-lg border border-line bg-card ${virtual ? 'max-h-[70vh] overflow-y-auto' : ''}`}
      tabIndex={0}
      role="region"
      aria-label={virtual ? `Loads on ${countWords(rows.length, 'boundary', 'boundaries')} (scrolls)` : 'Loads on each boundary (scrolls sideways)'}
    >
      <table className="w-full min-w-[36rem] border-collapse text-left" data-testid="boundary-results">
        <thead className="bg-sea-soft">
          <SortableHeaderRows table={table} />
        </thead>
        <tbody>
          {padTop > 0 && <tr aria-hidden="true" style={{ height: padTop }} />}
          {shown.map((row) => {
            const over = (row.original.maxUtilisation ?? 0) > 1;
            return (
              <tr
                key={row.id}
                className={`border-t border-line ${over ? 'bg-danger-soft' : ''} ${row.original.id === selectedId ? 'outline-3 outline-focus' : ''} ${onSelect ? 'cursor-pointer hover:bg-sea-soft' : ''}`}
                onClick={onSelect ? () => onSelect(row.original.id) : undefined}
                data-testid="boundary-row"
              >
                {row.getVisibleCells().map((cell, i) => (
                  <td key={cell.id} className={`px-2 py-1.5 align-top ${i === 2 || i === 3 ? 'text-right tabular-nums' : ''}`}>
                    {i === 0 && onSelect ? (
                      <button type="button" className="min-h-touch text-left underline-offset-2 hover:underline" onClick={(e) => { e.stopPropagation(); onSelect(row.original.id); }}>
                        {flexRender(cell.column.columnDef.cell, cell.getContext())}
                      </button>
                    ) : (
                      flexRender(cell.column.columnDef.cell, cell.getContext())
                    )}
                  </td>
                ))}
              </tr>
            );
          })}
          {padBottom > 0 && <tr aria-hidden="true" style={{ height: padBottom }} />}
        </tbody>
      </table>
    </div>
  );
}

const copOf = (b: BoundarySummary) => (b.copX === null || b.copY === null || b.copZ === null ? null : { x: b.copX, y: b.copY, z: b.copZ });

/**
 * Which check sets the row's utilisation, in words (the detail view names the stiffener, panel or
 * shore); a rating with its value, unit and the side it holds towards.
 */
function governingWords(b: BoundarySummary, sides: { A: string; B: string }, system: UnitSystem): { what: string } | null {
  const rating =
    b.capacityDirection && b.capacityKind && b.capacityRated != null
      ? `rated ${ratingFigureWords({ kind: b.capacityKind, direction: b.capacityDirection, rated: b.capacityRated }, system, sides)}`
      : 'its rating';
  const cands: [number | null, string][] = [
    [b.capacityUtilisation, rating],
    [b.stiffenerUtilisation, 'a stiffener in bending'],
    [b.platingUtilisation, 'plating in bending'],
    [b.shoreUtilisation, 'a shore'],
  ];
  let best: { u: number; what: string } | null = null;
  for (const [u, what] of cands) if (u !== null && Number.isFinite(u) && (best === null || u > best.u)) best = { u, what };
  return best && { what: best.what };
}
