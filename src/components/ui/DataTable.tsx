import {
  flexRender,
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnDef,
  type SortingState,
} from '@tanstack/react-table';
import { useState, type ReactNode } from 'react';

/**
 * A sortable table. Headers are buttons (keyboard and switch friendly) and
 * announce their sort order through aria-sort. Narrow screens scroll sideways
 * inside the table's own region rather than the page.
 */
export function DataTable<T>({
  caption,
  columns,
  data,
  empty,
  initialSort = [],
  rowKey,
}: {
  caption: string;
  columns: ColumnDef<T, any>[];
  data: T[];
  empty: ReactNode;
  initialSort?: SortingState;
  rowKey: (row: T) => string;
}) {
  const [sorting, setSorting] = useState<SortingState>(initialSort);
  const table = useReactTable({
    data,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getRowId: rowKey,
  });
  if (!data.length) return <>{empty}</>;
  return (
    <div className="overflow-x-auto rounded-xl border border-line bg-surface" role="region" aria-label={caption} tabIndex={0}>
      <table className="w-full border-collapse text-left">
        <caption className="sr-only">{caption}</caption>
        <thead className="bg-paper">
          {table.getHeaderGroups().map((group) => (
            <tr key={group.id}>
              {group.headers.map((header) => {
                const sorted = header.column.getIsSorted();
                const canSort = header.column.getCanSort();
                const label = flexRender(header.column.columnDef.header, header.getContext());
                return (
                  <th
                    key={header.id}
                    scope="col"
                    className="border-b border-line px-3 py-2 text-sm font-semibold whitespace-nowrap"
                    aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined}
                  >
                    {canSort ? (
                      <button
                        type="button"
                        className="inline-flex min-h-11 items-center gap-1 rounded px-1 font-semibold"
                        onClick={header.column.getToggleSortingHandler()}
                      >
                        {label}
                        <span aria-hidden="true" className="text-ink-soft">
                          {sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}
                        </span>
                      </button>
                    ) : (
                      label
                    )}
                  </th>
                );
              })}
            </tr>
          ))}
        </thead>
        <tbody>
          {table.getRowModel().rows.map((row) => (
            <tr key={row.id} className="border-b border-line last:border-b-0 align-top">
              {row.getVisibleCells().map((cell) => (
                <td key={cell.id} className="px-3 py-3">
                  {flexRender(cell.column.columnDef.cell, cell.getContext())}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
