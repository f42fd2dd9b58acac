/** Sortable table of every boundary's load; tap a row to open its detail. */
import { SortableHeaderRows } from '@client/components/ui/sortable-header';
import { useMemo, useState } from 'react';
import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
  type SortingState,
} from '@tanstack/react-table';
import type { BoundaryResult, SurveyResults } from '@shared/engine';
import type { UnitSystem } from '@shared/units/units';
import { fmt, num, unitLabel } from '@client/lib/unit-system';
import { UtilisationBadge } from './utilisation';
import { pointWords } from '@shared/units/point-words';
import { governingCheck } from '@shared/engine';
import { sideName } from './side-name';

const col = createColumnHelper<BoundaryResult>();

export function BoundaryResultsTable({
  results,
  system,
  selectedId,
  onSelect,
}: {
  results: SurveyResults;
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
              {c.row.original.kind} · {sideName(results, c.row.original.sideA)} | {sideName(results, c.row.original.sideB)}
            </span>
          </span>
        ),
      }),
      col.accessor((b) => b.net.forceN, {
        id: 'force',
        header: `Net force, + towards side B (${unitLabel('force', system)})`,
        cell: (c) => <span data-testid={`net-force-${c.row.original.id}`}>{num(c.getValue(), 'force', system)}</span>,
      }),
      col.accessor((b) => b.net.peak.pressurePa, {
        id: 'peak',
        header: `Peak pressure (${unitLabel('pressure', system)})`,
        cell: (c) => num(c.getValue(), 'pressure', system),
      }),
      col.accessor((b) => b.net.centreOfPressure?.z ?? null, {
        id: 'cop',
        header: 'Centre of pressure',
        sortUndefined: 'last',
        cell: (c) => (
          <span className="text-sm">
            {c.row.original.net.nearlyCancels ? `sides nearly cancel: couple ${fmt(c.row.original.net.coupleNm, 'moment', system)}` : pointWords(c.row.original.net.centreOfPressure, system)}
          </span>
        ),
      }),
      col.accessor((b) => b.maxUtilisation ?? -1, {
        id: 'utilisation',
        header: 'Utilisation',
        cell: (c) => {
          const gov = governingCheck(c.row.original);
          return (
            <span>
              <UtilisationBadge value={c.row.original.maxUtilisation} compact />
              {gov && <span className="block text-xs text-ink-soft">{gov.what}</span>}
            </span>
          );
        },
      }),
    ],
    [results, system],
  );
  const table = useReactTable({
    data: results.boundaries,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });

  if (results.boundaries.length === 0) {
    return <p className="text-ink-soft">No boundaries yet. Add one under Plates to see its load.</p>;
  }

  return (
    <div className="overflow-x-auto rounded-lg border border-line bg-card">
      <table className="w-full min-w-[36rem] border-collapse text-left" data-testid="boundary-results">
        <thead className="bg-sea-soft">
          <SortableHeaderRows table={table} />
        </thead>
        <tbody>
          {table.getRowModel().rows.map((row) => {
            const over = (row.original.maxUtilisation ?? 0) > 1;
            return (
              <tr
                key={row.id}
                className={`border-t border-line ${over ? 'bg-danger-soft' : ''} ${row.original.id === selectedId ? 'outline-3 outline-focus' : ''} ${onSelect ? 'cursor-pointer hover:bg-sea-soft' : ''}`}
                onClick={onSelect ? () => onSelect(row.original.id) : undefined}
                data-testid="boundary-row"
              >
                {row.getVisibleCells().map((cell, i) => (
                  <td key={cell.id} className={`px-2 py-1.5 align-top ${i > 0 && i < 3 ? 'text-right tabular-nums' : ''}`}>
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
        </tbody>
      </table>
    </div>
  );
}
