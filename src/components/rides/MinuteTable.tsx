import { number, PHASE_LABELS } from './format';
import type { MinuteRow } from './minute-rows';

/** A chart's numbers as a table, folded away until asked for. */
export function MinuteTable({ summary, caption, columns, rows, digits }: { summary: string; caption: string; columns: string[]; rows: MinuteRow[]; digits: number[] }) {
  return (
    <details className="rounded-lg border border-line bg-surface">
      <summary className="flex min-h-12 cursor-pointer items-center px-4 font-semibold text-lagoon-dark">{summary}</summary>
      <div className="max-h-96 overflow-auto border-t border-line" role="region" aria-label={caption} tabIndex={0}>
        <table className="w-full border-collapse text-left text-sm">
          <caption className="px-3 py-2 text-left sm:px-4 text-ink-soft">{caption}</caption>
          <thead className="sticky top-0 bg-paper">
            <tr>
              <th scope="col" className="px-2 py-2 sm:px-3 whitespace-nowrap">Minute</th>
              <th scope="col" className="px-2 py-2 sm:px-3">Phase</th>
              {columns.map((c) => (
                <th key={c} scope="col" className="px-2 py-2 sm:px-3 text-right whitespace-nowrap">
                  {c}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.minute} className="border-t border-line">
                <th scope="row" className="px-2 py-1 sm:px-3 font-normal whitespace-nowrap">
                  {r.minute}–{r.minute + 1}
                </th>
                <td className="px-2 py-1 sm:px-3">{r.phase ? PHASE_LABELS[r.phase] : '—'}</td>
                {r.values.map((v, i) => (
                  <td key={i} className="px-2 py-1 sm:px-3 text-right tabular-nums">
                    {number(v, digits[i] ?? 0)}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </details>
  );
}
