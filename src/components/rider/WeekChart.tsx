import type { ChartData, ChartOptions } from 'chart.js';
import { useMemo } from 'react';
import { Bar, Line } from 'react-chartjs-2';
import { PALETTE } from '../palette';
import './chart-setup';
import { formatDate } from '../../lib/time/format';
import { weeklySentence, type WeekMeasure } from './progress-words';
import type { ProgressWeek } from './types';

/**
 * One measure per week since the program started, as a chart with two text
 * alternatives: a sentence that tells its story (the canvas's description)
 * and the numbers as a table behind a disclosure.
 */
export function WeekChart({
  id,
  title,
  axis,
  kind,
  colour,
  measure,
  weeks,
  locale,
}: {
  id: string;
  title: string;
  axis: string;
  kind: 'bar' | 'line';
  colour: string;
  measure: WeekMeasure;
  weeks: ProgressWeek[];
  locale: string;
}) {
  const labels = useMemo(() => weeks.map((w) => formatDate(w.monday, locale, 'dayMonth')), [weeks, locale]);
  const values = useMemo(() => weeks.map((w) => (w.sessions > 0 ? measure.value(w) : kind === 'bar' ? 0 : null)), [weeks, measure, kind]);
  const summary = weeklySentence(weeks, measure, locale);
  const hasData = weeks.some((w) => w.sessions > 0 && measure.value(w) !== null);
  const options = useMemo(
    () =>
      ({
        responsive: true,
        maintainAspectRatio: false,
        animation: false,
        plugins: {
          legend: { display: false },
          tooltip: {
            callbacks: {
              title: (items: { dataIndex: number }[]) => (items.length ? `Week of ${formatDate(weeks[items[0].dataIndex].monday, locale, 'date')}` : ''),
              label: (item: { parsed: { y: number | null } }) => (item.parsed.y === null ? 'No sessions' : measure.format(item.parsed.y, locale)),
            },
          },
        },
        scales: {
          x: { ticks: { color: PALETTE.ink, maxRotation: 0, autoSkipPadding: 14 }, grid: { display: false } },
          y: { beginAtZero: true, title: { display: true, text: axis, color: PALETTE.ink }, ticks: { color: PALETTE.ink }, grid: { color: PALETTE.line } },
        },
      }) as ChartOptions<'bar'> & ChartOptions<'line'>,
    [weeks, measure, locale, axis],
  );
  const label = `${title}, a ${kind} chart by week. The sentence above says what it shows; the table below gives every week.`;
  const chart =
    kind === 'bar' ? (
      <Bar
        data={{ labels, datasets: [{ label: title, data: values, backgroundColor: colour, borderRadius: 3 }] } as ChartData<'bar', (number | null)[], string>}
        options={options}
        role="img"
        aria-label={label}
      />
    ) : (
      <Line
        data={{ labels, datasets: [{ label: title, data: values, borderColor: colour, backgroundColor: colour, borderWidth: 3, pointRadius: 3, spanGaps: true }] } as ChartData<'line', (number | null)[], string>}
        options={options}
        role="img"
        aria-label={label}
      />
    );
  return (
    <section aria-labelledby={`${id}-h`} className="card flex min-w-0 flex-col gap-3">
      <h3 id={`${id}-h`} className="text-lg">
        {title}
      </h3>
      <p className="text-ink-soft">{summary}</p>
      {/* Nothing to draw yet: the sentence says so, without empty 0–1 axes beside it. */}
      {hasData && <div className="relative h-64">{chart}</div>}
      {hasData && (
      <details>
        <summary className="inline-flex min-h-12 cursor-pointer items-center font-medium text-lagoon-dark">Show {title.toLowerCase()} as a table</summary>
        <div className="mt-2 max-h-80 overflow-auto rounded-lg border border-line" role="region" aria-label={`${title}, week by week`} tabIndex={0}>
          <table className="w-full border-collapse text-left">
            <caption className="sr-only">{`${title}, week by week`}</caption>
            <thead className="sticky top-0 bg-paper">
              <tr>
                <th scope="col" className="border-b border-line px-3 py-2 font-semibold">
                  Week of
                </th>
                <th scope="col" className="border-b border-line px-3 py-2 font-semibold">
                  Sessions
                </th>
                <th scope="col" className="border-b border-line px-3 py-2 font-semibold">
                  {title}
                </th>
              </tr>
            </thead>
            <tbody>
              {weeks.map((w) => {
                const v = measure.value(w);
                return (
                  <tr key={w.isoWeek} className="border-b border-line last:border-b-0">
                    <th scope="row" className="px-3 py-2 font-normal whitespace-nowrap">
                      {formatDate(w.monday, locale, 'date')}
                    </th>
                    <td className="px-3 py-2">{w.sessions}</td>
                    <td className="px-3 py-2 whitespace-nowrap">{w.sessions > 0 && v !== null ? measure.format(v, locale) : '—'}</td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
      </details>
      )}
    </section>
  );
}
