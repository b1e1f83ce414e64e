import type { ChartData, ChartOptions } from 'chart.js';
import { useMemo } from 'react';
import { Line } from 'react-chartjs-2';
import { watts, wattsPerWeek } from '../../lib/format/numbers';
import { PALETTE } from '../palette';
import { baseOptions } from './chart-setup';
import { ChartFrame, type ChartTable } from './ChartFrame';
import { formatDateTime, formatInstantDate } from '../../lib/time/format';
import type { TrendsData } from './types';


function sentence(trends: TrendsData, locale: string, timeZone: string): string {
  const w = (v: number | null) => watts(v, locale);
  const withPower = trends.sessions.filter((s) => s.meanPowerW !== null);
  if (!withPower.length) return 'No session has a power reading yet.';
  const first = withPower[0];
  const last = withPower[withPower.length - 1];
  const parts = [
    `Mean power over ${withPower.length} ${withPower.length === 1 ? 'session' : 'sessions'}: ${w(first.meanPowerW)} on ${formatInstantDate(first.startedAt, locale, timeZone, 'dayMonth')}, ${w(last.meanPowerW)} in the latest on ${formatInstantDate(last.startedAt, locale, timeZone, 'dayMonth')}.`,
  ];
  if (trends.powerTrendWPerWeek !== null) {
    parts.push(`Trend over the last eight weeks: ${wattsPerWeek(trends.powerTrendWPerWeek, locale)}.`);
  }
  if (last.baselineW !== null && last.reviewBelowW !== null) {
    parts.push(`The usual level is ${w(last.baselineW)}; below ${w(last.reviewBelowW)} (${trends.thresholds.powerDropReviewPct} % under it) a session is due for review${last.meanPowerW! < last.reviewBelowW ? ', and the latest one is below it' : ''}.`);
  } else {
    parts.push(`A usual level shows once there are ${trends.thresholds.baselineMinSessions} counted sessions to compare with.`);
  }
  if (trends.sessions.some((s) => !s.counted)) parts.push('Hollow points are sessions too short to count.');
  return parts.join(' ');
}

/** Mean power per session, with the usual level and the band down to the review line shaded. */
export function PowerChart({ trends, locale, timeZone, compact = false }: { trends: TrendsData; locale: string; timeZone: string; compact?: boolean }) {
  const { sessions } = trends;
  const w = (v: number | null) => watts(v, locale);
  const data = useMemo<ChartData<'line', (number | null)[], string>>(
    () => ({
      labels: sessions.map((s) => formatInstantDate(s.startedAt, locale, timeZone, 'dayMonth')),
      datasets: [
        {
          label: 'Mean power',
          data: sessions.map((s) => s.meanPowerW),
          borderColor: PALETTE.lagoon,
          backgroundColor: PALETTE.lagoon,
          pointBackgroundColor: sessions.map((s) => (s.counted ? PALETTE.lagoon : PALETTE.surface)),
          pointRadius: 3,
          borderWidth: 2,
          order: 0,
        },
        {
          label: 'Usual level',
          data: sessions.map((s) => s.baselineW),
          borderColor: PALETTE.slate,
          backgroundColor: PALETTE.slate,
          borderDash: [6, 4],
          borderWidth: 2,
          pointRadius: 0,
          order: 1,
        },
        {
          label: `Review line (${trends.thresholds.powerDropReviewPct} % under)`,
          data: sessions.map((s) => s.reviewBelowW),
          borderColor: PALETTE.ochre,
          backgroundColor: 'rgba(58, 83, 120, 0.14)',
          borderDash: [2, 3],
          borderWidth: 2,
          pointRadius: 0,
          fill: '-1',
          order: 2,
        },
      ],
    }),
    [sessions, locale, timeZone, trends.thresholds.powerDropReviewPct],
  );
  const options = useMemo<ChartOptions<'line'>>(() => {
    const base = baseOptions<'line'>('Mean power (W)');
    return {
      ...base,
      plugins: {
        ...base.plugins,
        tooltip: {
          callbacks: {
            title: (items) => (items.length ? formatDateTime(sessions[items[0].dataIndex].startedAt, locale, timeZone, 'day') : ''),
            label: (item) => `${item.dataset.label}: ${w(item.parsed.y)}`,
            afterBody: (items) => (items.length && !sessions[items[0].dataIndex].counted ? 'This session was too short to count.' : ''),
          },
        },
      },
    };
  }, [sessions, locale, timeZone]);
  const table: ChartTable = {
    caption: 'Mean power per session, with the usual level and the review line',
    columns: ['Session', 'Mean power', 'Usual level', 'Review line', 'Counted'],
    rows: sessions.map((s) => ({
      key: s.sessionId,
      cells: [formatDateTime(s.startedAt, locale, timeZone, 'day'), w(s.meanPowerW), w(s.baselineW), w(s.reviewBelowW), s.counted ? 'Yes' : 'No, too short'],
    })),
  };
  const summary = sentence(trends, locale, timeZone);
  return (
    <ChartFrame id="power-chart" title="Mean power per session" compact={compact} summary={summary} table={table}>
      {sessions.some((s) => s.meanPowerW !== null) ? (
        <Line data={data} options={options} role="img" aria-label="Line chart of mean power per session; the sentence above and the table below give the numbers." />
      ) : null}
    </ChartFrame>
  );
}
