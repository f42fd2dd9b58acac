import { flexRender, type Table } from '@tanstack/react-table';

/**
 * The header rows of a TanStack table whose sortable columns sort on a tap: a full-width touch
 * target, the direction as an arrow and as `aria-sort` for screen readers.
 */
export function SortableHeaderRows<T>({ table, cellClassName = 'p-0 text-sm' }: { table: Table<T>; cellClassName?: string }) {
  return table.getHeaderGroups().map((hg) => (
    <tr key={hg.id}>
      {hg.headers.map((h) => {
        const dir = h.column.getIsSorted();
        const label = flexRender(h.column.columnDef.header, h.getContext());
        return (
          <th key={h.id} scope="col" className={cellClassName} aria-sort={dir === 'asc' ? 'ascending' : dir === 'desc' ? 'descending' : 'none'}>
            {h.column.getCanSort() ? (
              <button
                type="button"
                className="flex min-h-touch w-full items-center gap-1 px-2 text-left font-bold"
                onClick={h.column.getToggleSortingHandler()}
              >
                {label}
                <span aria-hidden="true">{dir === 'asc' ? '↑' : dir === 'desc' ? '↓' : '↕'}</span>
              </button>
            ) : (
              <span className="block px-2 font-bold">{label}</span>
            )}
          </th>
        );
      })}
    </tr>
  ));
}
