import type { ReactNode } from 'react';

export interface ChartTable {
  caption: string;
  columns: string[];
  rows: { key: string; cells: string[] }[];
}

/**
 * One chart with its text alternatives: a sentence that says what it shows
 * (visible, and the canvas's accessible name points to it) and the numbers as a
 * table behind a disclosure.
 */
export function ChartFrame({
  id,
  title,
  summary,
  table,
  compact = false,
  children,
}: {
  id: string;
  title: string;
  summary: string;
  table: ChartTable;
  /** The overview's small charts. */
  compact?: boolean;
  /** The chart itself; null when there is nothing to draw, so no empty axes stand beside the sentence that says so. */
  children: ReactNode | null;
}) {
  return (
    <section aria-labelledby={`${id}-h`} className="card flex min-w-0 flex-col gap-3">
      <h3 id={`${id}-h`} className="text-lg">
        {title}
      </h3>
      <p id={`${id}-summary`} className="text-sm text-ink-soft">
        {summary}
      </p>
      {children && <div className={`relative ${compact ? 'h-44' : 'h-64'}`}>{children}</div>}
      {table.rows.length > 0 && (
      <details className="group">
        <summary className="inline-flex min-h-12 cursor-pointer items-center font-medium text-lagoon-dark">The numbers behind this chart</summary>
        <div className="mt-2 max-h-96 overflow-auto rounded-lg border border-line" role="region" aria-label={table.caption} tabIndex={0}>
          <table className="w-full border-collapse text-left text-sm">
            <caption className="sr-only">{table.caption}</caption>
            <thead className="sticky top-0 bg-paper">
              <tr>
                {table.columns.map((c) => (
                  <th key={c} scope="col" className="border-b border-line px-3 py-2 font-semibold whitespace-nowrap">
                    {c}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              {table.rows.map((r) => (
                <tr key={r.key} className="border-b border-line last:border-b-0">
                  {r.cells.map((c, i) => (i === 0 ? <th key={i} scope="row" className="px-3 py-2 text-left font-normal whitespace-nowrap">{c}</th> : <td key={i} className="px-3 py-2 whitespace-nowrap">{c}</td>))}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </details>
      )}
    </section>
  );
}
