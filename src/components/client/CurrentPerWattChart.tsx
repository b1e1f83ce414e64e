import type { ChartData, ChartOptions } from 'chart.js';
import { useMemo } from 'react';
import { Line } from 'react-chartjs-2';
import { milliampsPerWatt } from '../../lib/format/numbers';
import { PALETTE } from '../palette';
import { baseOptions } from './chart-setup';
import { ChartFrame, type ChartTable } from './ChartFrame';
import { formatDateTime, formatInstantDate } from '../../lib/time/format';
import type { TrendsData } from './types';


function sentence(trends: TrendsData, locale: string, timeZone: string): string {
  const maw = (v: number | null) => milliampsPerWatt(v, locale);
  const shown = trends.sessions.filter((s) => s.currentPerWattMaPerW !== null);
  if (!shown.length) return 'No session has both current and power readings yet.';
  const first = shown[0];
  const last = shown[shown.length - 1];
  return [
    `Stimulation current for each watt of power, over ${shown.length} ${shown.length === 1 ? 'session' : 'sessions'}: ${maw(first.currentPerWattMaPerW)} on ${formatInstantDate(first.startedAt, locale, timeZone, 'dayMonth')}, ${maw(last.currentPerWattMaPerW)} in the latest.`,
    `Lower means the muscles give more power for the same stimulation; a rise of ${trends.thresholds.currentRiseReviewPct} % over the usual level is flagged for review.`,
  ].join(' ');
}

/** The sum of the channels' mean current divided by mean power, per session. */
export function CurrentPerWattChart({ trends, locale, timeZone, compact = false }: { trends: TrendsData; locale: string; timeZone: string; compact?: boolean }) {
  const { sessions } = trends;
  const maw = (v: number | null) => milliampsPerWatt(v, locale);
  const data = useMemo<ChartData<'line', (number | null)[], string>>(
    () => ({
      labels: sessions.map((s) => formatInstantDate(s.startedAt, locale, timeZone, 'dayMonth')),
      datasets: [
        {
          label: 'Current per watt',
          data: sessions.map((s) => s.currentPerWattMaPerW),
          borderColor: PALETTE.slate,
          backgroundColor: PALETTE.slate,
          pointRadius: 3,
          borderWidth: 2,
          spanGaps: true,
        },
      ],
    }),
    [sessions, locale, timeZone],
  );
  const options = useMemo<ChartOptions<'line'>>(() => {
    const base = baseOptions<'line'>('mA per W');
    return {
      ...base,
      plugins: {
        ...base.plugins,
        legend: { display: false },
        tooltip: {
          callbacks: {
            title: (items) => (items.length ? formatDateTime(sessions[items[0].dataIndex].startedAt, locale, timeZone, 'day') : ''),
            label: (item) => maw(item.parsed.y),
          },
        },
      },
    };
  }, [sessions, locale, timeZone]);
  const table: ChartTable = {
    caption: 'Current per watt per session',
    columns: ['Session', 'Current per watt'],
    rows: sessions.map((s) => ({ key: s.sessionId, cells: [formatDateTime(s.startedAt, locale, timeZone, 'day'), maw(s.currentPerWattMaPerW)] })),
  };
  return (
    <ChartFrame id="current-chart" title="Current per watt" compact={compact} summary={sentence(trends, locale, timeZone)} table={table}>
      {sessions.some((s) => s.currentPerWattMaPerW !== null) ? (
        <Line data={data} options={options} role="img" aria-label="Line chart of stimulation current per watt for each session; the sentence above and the table below give the numbers." />
      ) : null}
    </ChartFrame>
  );
}
