import type { ChartData, ChartOptions } from 'chart.js';
import { useMemo } from 'react';
import { Chart } from 'react-chartjs-2';
import { minutes } from '../../lib/format/numbers';
import { PALETTE } from '../palette';
import { baseOptions } from './chart-setup';
import { ChartFrame, type ChartTable } from './ChartFrame';
import { formatDateTime, formatInstantDate } from '../../lib/time/format';
import type { TrendsData } from './types';

const toMinutes = (s: number | null) => (s === null ? null : Math.round((s / 60) * 10) / 10);

function sentence(trends: TrendsData, locale: string): string {
  const min = (s: number | null) => minutes(s, locale);
  const { sessions } = trends;
  if (!sessions.length) return 'No sessions yet.';
  const recent = sessions.slice(-10);
  const counted = recent.filter((s) => s.counted).length;
  const last = sessions[sessions.length - 1];
  return [
    `Of the last ${recent.length} ${recent.length === 1 ? 'session' : 'sessions'}, ${counted} lasted long enough to count (at least ${trends.thresholds.countThresholdPct} % of the prescribed minutes).`,
    `The latest lasted ${min(last.durationS)}${last.targetS !== null ? ` against ${min(last.targetS)} prescribed` : ', with no prescription in effect that day'}.`,
  ].join(' ');
}

/** Each session's duration as a bar, against the prescribed minutes and the point from which a session counts. */
export function DurationChart({ trends, locale, timeZone, compact = false }: { trends: TrendsData; locale: string; timeZone: string; compact?: boolean }) {
  const { sessions, thresholds } = trends;
  const min = (s: number | null) => minutes(s, locale);
  const data = useMemo<ChartData<'bar' | 'line', (number | null)[], string>>(
    () => ({
      labels: sessions.map((s) => formatInstantDate(s.startedAt, locale, timeZone, 'dayMonth')),
      datasets: [
        { type: 'line', label: 'Prescribed minutes', data: sessions.map((s) => toMinutes(s.targetS)), borderColor: PALETTE.ink, backgroundColor: PALETTE.ink, borderWidth: 2, pointRadius: 0, stepped: 'middle', order: 0 },
        {
          type: 'line',
          label: `Counts from (${thresholds.countThresholdPct} %)`,
          data: sessions.map((s) => (s.targetS === null ? null : toMinutes((s.targetS * thresholds.countThresholdPct) / 100))),
          borderColor: PALETTE.ochre,
          backgroundColor: PALETTE.ochre,
          borderDash: [3, 3],
          borderWidth: 2,
          pointRadius: 0,
          stepped: 'middle',
          order: 1,
        },
        { type: 'bar', label: 'Counted session', data: sessions.map((s) => (s.counted ? toMinutes(s.durationS) : null)), backgroundColor: PALETTE.lagoon, grouped: false, order: 2 },
        { type: 'bar', label: 'Too short to count', data: sessions.map((s) => (s.counted ? null : toMinutes(s.durationS))), backgroundColor: PALETTE.lineStrong, grouped: false, order: 3 },
      ],
    }),
    [sessions, locale, timeZone, thresholds.countThresholdPct],
  );
  const options = useMemo<ChartOptions<'bar' | 'line'>>(() => {
    const base = baseOptions<'bar' | 'line'>('Minutes');
    return {
      ...base,
      plugins: {
        ...base.plugins,
        tooltip: {
          filter: (item) => item.parsed.y !== null,
          callbacks: {
            title: (items) => (items.length ? formatDateTime(sessions[items[0].dataIndex].startedAt, locale, timeZone, 'day') : ''),
            label: (item) => `${item.dataset.label}: ${min(item.parsed.y === null ? null : item.parsed.y * 60)}`,
            afterBody: (items) => (items.length ? `Active: ${min(sessions[items[0].dataIndex].activeS)}` : ''),
          },
        },
      },
    };
  }, [sessions, locale, timeZone]);
  const table: ChartTable = {
    caption: 'Duration of each session against the prescribed minutes',
    columns: ['Session', 'Duration', 'Active', 'Prescribed', 'Counted'],
    rows: sessions.map((s) => ({
      key: s.sessionId,
      cells: [formatDateTime(s.startedAt, locale, timeZone, 'day'), min(s.durationS), min(s.activeS), min(s.targetS), s.counted ? 'Yes' : 'No, too short'],
    })),
  };
  return (
    <ChartFrame id="duration-chart" title="Session length against the prescription" compact={compact} summary={sentence(trends, locale)} table={table}>
      <Chart type="bar" data={data} options={options} role="img" aria-label="Bar chart of each session’s minutes against the prescribed minutes; the sentence above and the table below give the numbers." />
    </ChartFrame>
  );
}
