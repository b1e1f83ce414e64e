import type { ChartData, ChartOptions } from 'chart.js';
import { useMemo } from 'react';
import { Bar } from 'react-chartjs-2';
import { baseOptions } from '../client/chart-setup';
import { PALETTE } from '../palette';

export interface OverviewBar {
  key: string;
  label: string;
  count: number;
  /** Where the clients behind this bar are listed. */
  href: string;
  /** What the count counts, for the table's link text ("3 clients"). */
  unit: [string, string];
}

export interface OverviewChart {
  id: string;
  title: string;
  summary: string;
  yTitle: string;
  xTitle: string;
  firstColumn: string;
  bars: OverviewBar[];
  horizontal?: boolean;
}

const countText = (b: OverviewBar) => `${b.count} ${b.count === 1 ? b.unit[0] : b.unit[1]}`;

/** A long category name under a vertical bar, broken at spaces so that neighbours never overlap (chart.js draws an array as lines). */
function lines(label: string, width = 12): string | string[] {
  if (label.length <= width) return label;
  const out: string[] = [];
  for (const word of label.split(' ')) {
    const last = out.length - 1;
    if (last >= 0 && out[last].length + 1 + word.length <= width) out[last] += ` ${word}`;
    else out.push(word);
  }
  return out;
}

/**
 * One bar chart of the clinic overview with its table: the table is on the
 * page (not hidden) because each row links to the clients behind the figure.
 */
function ChartWithTable({ chart }: { chart: OverviewChart }) {
  const data = useMemo<ChartData<'bar', number[], string | string[]>>(
    () => ({ labels: chart.bars.map((b) => (chart.horizontal ? b.label : lines(b.label))), datasets: [{ label: chart.yTitle, data: chart.bars.map((b) => b.count), backgroundColor: PALETTE.lagoon, maxBarThickness: 40 }] }),
    [chart],
  );
  const options = useMemo<ChartOptions<'bar'>>(() => {
    const base = baseOptions<'bar'>(chart.yTitle);
    const value = { ...base.scales!.y, ticks: { color: PALETTE.ink, precision: 0 } };
    // A few categories are all labelled; 26 weeks skip some.
    const category = { ...base.scales!.x, ticks: { ...base.scales!.x!.ticks, autoSkip: chart.bars.length > 12 }, title: { display: true, text: chart.xTitle, color: PALETTE.ink } };
    return {
      ...base,
      indexAxis: chart.horizontal ? 'y' : 'x',
      plugins: { ...base.plugins, legend: { display: false } },
      scales: chart.horizontal ? { x: { ...value, title: { display: true, text: chart.yTitle, color: PALETTE.ink } }, y: { ...category, title: { display: false } } } : { x: category, y: value },
    };
  }, [chart]);
  return (
    <section aria-labelledby={`${chart.id}-h`} className="card flex min-w-0 flex-col gap-3" data-testid={chart.id}>
      <h2 id={`${chart.id}-h`} className="text-lg">
        {chart.title}
      </h2>
      <p id={`${chart.id}-summary`} className="text-sm text-ink-soft">
        {chart.summary}
      </p>
      <div className="relative h-64">
        <Bar data={data} options={options} role="img" aria-label={`${chart.title}: bar chart; the table below gives the numbers and links to the clients.`} />
      </div>
      <div className={`${chart.bars.length > 8 ? 'max-h-80 overflow-auto' : ''} rounded-lg border border-line`} role="region" aria-label={`${chart.title}, table`} tabIndex={0}>
        <table className="w-full border-collapse text-left text-sm">
          <caption className="sr-only">{chart.title}</caption>
          <thead className="sticky top-0 bg-paper">
            <tr>
              <th scope="col" className="border-b border-line px-3 py-2 font-semibold">
                {chart.firstColumn}
              </th>
              <th scope="col" className="border-b border-line px-3 py-2 font-semibold">
                How many (the link lists the clients)
              </th>
            </tr>
          </thead>
          <tbody>
            {chart.bars.map((b) => (
              <tr key={b.key} className="border-b border-line last:border-b-0">
                <th scope="row" className="px-3 py-1 text-left font-normal whitespace-nowrap">
                  {b.label}
                </th>
                <td className="px-3 py-1">
                  {b.count ? (
                    <a href={b.href} className="inline-flex min-h-11 items-center">
                      {countText(b)}
                    </a>
                  ) : (
                    countText(b)
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}

export default function OverviewCharts({ charts }: { charts: OverviewChart[] }) {
  return (
    <div className="grid gap-6 lg:grid-cols-2">
      {charts.map((c) => (
        <ChartWithTable key={c.id} chart={c} />
      ))}
    </div>
  );
}
