import type { ChartData, ChartOptions } from 'chart.js';
import { useMemo } from 'react';
import { Line } from 'react-chartjs-2';
import { percent } from '../../lib/format/numbers';
import { PALETTE } from '../palette';
import { baseOptions } from './chart-setup';
import { ChartFrame, type ChartTable } from './ChartFrame';
import { formatDateTime, formatInstantDate } from '../../lib/time/format';
import type { TrendsData } from './types';

function sentence(trends: TrendsData, locale: string, timeZone: string): string {
  const pct = (v: number | null) => percent(v, locale);
  const shown = trends.sessions.filter((s) => s.enduranceRatioPct !== null);
  if (!shown.length) return 'No session has 12 active minutes with power readings yet, so power held to the end is not known.';
  const first = shown[0];
  const last = shown[shown.length - 1];
  return [
    `Mean power of the last 5 active minutes as a share of the first 5, over ${shown.length} ${shown.length === 1 ? 'session' : 'sessions'}: ${pct(first.enduranceRatioPct)} on ${formatInstantDate(first.startedAt, locale, timeZone, 'dayMonth')}, ${pct(last.enduranceRatioPct)} in the latest.`,
    'Nearer 100 % means the muscles held their power through the ride; sessions under 12 active minutes are left out.',
  ].join(' ');
}

/** Within-ride endurance per session (PRODUCT.md's enduranceRatioPct). */
export function EnduranceChart({ trends, locale, timeZone, compact = false }: { trends: TrendsData; locale: string; timeZone: string; compact?: boolean }) {
  const pct = (v: number | null) => percent(v, locale);
  const sessions = useMemo(() => trends.sessions.filter((s) => s.enduranceRatioPct !== null), [trends.sessions]);
  const data = useMemo<ChartData<'line', (number | null)[], string>>(
    () => ({
      labels: sessions.map((s) => formatInstantDate(s.startedAt, locale, timeZone, 'dayMonth')),
      datasets: [{ label: 'Power held to the end', data: sessions.map((s) => s.enduranceRatioPct), borderColor: PALETTE.moss, backgroundColor: PALETTE.moss, pointRadius: 3, borderWidth: 2, spanGaps: true }],
    }),
    [sessions, locale, timeZone],
  );
  const options = useMemo<ChartOptions<'line'>>(() => {
    const base = baseOptions<'line'>('% of the first 5 minutes');
    return {
      ...base,
      plugins: {
        ...base.plugins,
        legend: { display: false },
        tooltip: { callbacks: { title: (items) => (items.length ? formatDateTime(sessions[items[0].dataIndex].startedAt, locale, timeZone, 'day') : ''), label: (item) => pct(item.parsed.y) } },
      },
    };
  }, [sessions, locale, timeZone]);
  const table: ChartTable = {
    caption: 'Power held to the end, per session',
    columns: ['Session', 'Last 5 min ÷ first 5 min'],
    rows: sessions.map((s) => ({ key: s.sessionId, cells: [formatDateTime(s.startedAt, locale, timeZone, 'day'), pct(s.enduranceRatioPct)] })),
  };
  return (
    <ChartFrame id="endurance-chart" title="Power held to the end" compact={compact} summary={sentence(trends, locale, timeZone)} table={table}>
      <Line data={data} options={options} role="img" aria-label="Line chart of the mean power of each session's last 5 active minutes as a share of its first 5; the sentence above and the table below give the numbers." />
    </ChartFrame>
  );
}
