import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  useReactTable,
  type SortingState,
} from '@tanstack/react-table';
import { useId, useMemo, type ReactNode } from 'react';
import { Adherence, LastSession, PowerTrend, Streak } from './ClientFigures';
import { compareClientsByUrgency } from '../../lib/flags/urgency';
import type { ClientRow } from './types';
import { CareBadges } from '../care/CareBadges';

const col = createColumnHelper<ClientRow>();

interface CellMeta {
  renderFlags: (row: ClientRow) => ReactNode;
  now: Date;
  locale: string;
}
const meta = (c: { table: { options: { meta?: unknown } } }) => c.table.options.meta as CellMeta;

// Module-level so that cells keep their identity between renders: flexRender
// mounts each cell function as a component, and a new function would remount
// the row's buttons and lose keyboard focus.
const COLUMNS = [
  col.accessor('clientName', {
    id: 'client',
    header: 'Client',
    sortingFn: (a, b) => a.original.clientName.localeCompare(b.original.clientName),
    cell: (c) => (
      <>
        <a href={`/clients/${c.row.original.clientId}`} className="inline-flex min-h-12 items-center text-lg font-semibold lg:text-base">
          {c.getValue()}
        </a>
        {c.row.original.care && <CareBadges care={c.row.original.care} />}
      </>
    ),
  }),
  col.accessor('flags', { id: 'flags', header: 'Open flags', sortingFn: (a, b) => compareClientsByUrgency(a.original, b.original), sortDescFirst: false, cell: (c) => meta(c).renderFlags(c.row.original) }),
  col.accessor((r) => r.lastSessionAt ?? undefined, { id: 'lastSession', header: 'Last session', sortUndefined: -1, sortDescFirst: false, cell: (c) => <LastSession at={c.row.original.lastSessionAt} now={meta(c).now} locale={meta(c).locale} timeZone={c.row.original.timeZone} /> }),
  col.accessor((r) => r.adherence4wPct ?? undefined, { id: 'adherence', header: '4-week adherence', sortUndefined: 'last', sortDescFirst: false, cell: (c) => <Adherence pct={c.row.original.adherence4wPct} /> }),
  col.accessor('streakWeeks', { id: 'streak', header: 'Streak', sortDescFirst: false, cell: (c) => <Streak weeks={c.getValue()} /> }),
  col.accessor((r) => r.powerTrendWPerWeek ?? undefined, { id: 'powerTrend', header: 'Power trend', sortUndefined: 'last', sortDescFirst: false, cell: (c) => <PowerTrend wPerWeek={c.row.original.powerTrendWPerWeek} locale={meta(c).locale} /> }),
];
// The link's own 48 px height stands in for the cell padding, so the name lines up with the other cells' text.
const CELL_WIDTH: Record<string, string> = { client: 'lg:py-0 lg:w-[15%]', flags: 'lg:w-[44%]' };
const LABELS: Record<string, string> = Object.fromEntries(COLUMNS.map((c) => [c.id, String(c.header)]));

// Labels for the sort menu that narrow screens get in place of the column headers.
const SORT_CHOICES: { id: string; desc: boolean; label: string }[] = [
  { id: 'flags', desc: false, label: 'Most urgent first' },
  { id: 'client', desc: false, label: 'Client name, A to Z' },
  { id: 'client', desc: true, label: 'Client name, Z to A' },
  { id: 'lastSession', desc: false, label: 'Longest since last session first' },
  { id: 'lastSession', desc: true, label: 'Most recent session first' },
  { id: 'adherence', desc: false, label: 'Lowest adherence first' },
  { id: 'streak', desc: false, label: 'Shortest streak first' },
  { id: 'powerTrend', desc: false, label: 'Most falling power first' },
];

/**
 * One row per client with their flags and figures, sortable by every column.
 * Below 1024 px each row becomes a card with its labels written out, and a
 * sort menu stands in for the column headers.
 */
export function ClientTable({
  caption,
  rows,
  renderFlags,
  sorting,
  onSortingChange,
  locale,
}: {
  caption: string;
  locale: string;
  rows: ClientRow[];
  renderFlags: (row: ClientRow) => ReactNode;
  sorting: SortingState;
  onSortingChange: (sorting: SortingState) => void;
}) {
  const sortId = useId();
  const now = useMemo(() => new Date(), [rows]);
  const table = useReactTable({
    data: rows,
    columns: COLUMNS,
    meta: { renderFlags, now, locale } satisfies CellMeta,
    state: { sorting },
    onSortingChange: (updater) => onSortingChange(typeof updater === 'function' ? updater(sorting) : updater),
    getCoreRowModel: getCoreRowModel(),
    // The server orders the whole list (triage and the caseload come a page at a time).
    manualSorting: true,
    enableSortingRemoval: false,
    getRowId: (r) => r.clientId,
  });
  const current = sorting[0];
  const choice = SORT_CHOICES.findIndex((c) => c.id === current?.id && c.desc === current?.desc);
  const choices = choice >= 0 || !current ? SORT_CHOICES : [...SORT_CHOICES, { ...current, label: 'As chosen in the table' }];
  const chosen = choice >= 0 ? choice : current ? choices.length - 1 : 0;

  return (
    <div className="space-y-3">
      <div className="sm:max-w-xs lg:hidden">
        <label htmlFor={sortId} className="block font-medium">
          Sort by
        </label>
        <select
          id={sortId}
          className="field-input"
          value={String(chosen)}
          onChange={(e) => {
            const c = choices[Number(e.target.value)];
            onSortingChange([{ id: c.id, desc: c.desc }]);
          }}
        >
          {choices.map((c, i) => (
            <option key={`${c.id}-${c.desc}`} value={i}>
              {c.label}
            </option>
          ))}
        </select>
      </div>
      <div className="lg:overflow-x-auto lg:rounded-xl lg:border lg:border-line lg:bg-surface" role="region" aria-label={caption} tabIndex={0}>
        {/* Explicit roles keep the table a table for screen readers when narrow screens lay it out as cards. */}
        <table role="table" className="w-full border-collapse text-left max-lg:block">
          <caption className="sr-only">{caption}</caption>
          <thead className="bg-paper max-lg:hidden">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id} role="row">
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  return (
                    <th
                      key={header.id}
                      role="columnheader"
                      scope="col"
                      className="border-b border-line px-3 py-2 text-sm font-semibold"
                      aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined}
                    >
                      <button
                        type="button"
                        className="inline-flex min-h-12 items-center gap-1 rounded px-1 text-left font-semibold"
                        onClick={header.column.getToggleSortingHandler()}
                      >
                        {flexRender(header.column.columnDef.header, header.getContext())}
                        <span aria-hidden="true" className="text-ink-soft">
                          {sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}
                        </span>
                      </button>
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody className="max-lg:block max-lg:space-y-3">
            {table.getRowModel().rows.map((row) => (
              <tr
                key={row.id}
                role="row"
                data-testid="client-row"
                className="border-b border-line align-top last:border-b-0 max-lg:grid max-lg:grid-cols-2 sm:max-lg:grid-cols-4 max-lg:gap-x-4 max-lg:gap-y-2 max-lg:rounded-xl max-lg:border max-lg:bg-surface max-lg:p-4 max-lg:last:border-b"
              >
                {row.getVisibleCells().map((cell) => {
                  const wide = cell.column.id === 'client' || cell.column.id === 'flags';
                  return (
                    <td key={cell.id} role="cell" className={`px-3 py-3 max-lg:block max-lg:p-0 ${wide ? 'max-lg:col-span-full' : 'whitespace-nowrap'} ${CELL_WIDTH[cell.column.id] ?? ''}`}>
                      {!wide && <span className="block text-sm text-ink-soft lg:hidden">{LABELS[cell.column.id]}</span>}
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  );
                })}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
