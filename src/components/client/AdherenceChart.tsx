import type { ChartData, ChartOptions, Plugin } from 'chart.js';
import { useMemo } from 'react';
import { Bar } from 'react-chartjs-2';
import { PALETTE } from '../palette';
import { baseOptions } from './chart-setup';
import { ChartFrame, type ChartTable } from './ChartFrame';
import { formatDate } from '../../lib/time/format';
import { parseIsoWeek } from '../../lib/time/iso-week';
import type { AdherenceData, AdherenceWeek } from './types';

const PAUSED_DATASET = 2;

function status(w: AdherenceWeek, currentIsoWeek: string): string {
  if (w.paused) return 'Paused';
  if (w.isoWeek === currentIsoWeek) return w.met ? 'Met (week under way)' : 'Under way';
  if (w.prescribed === 0) return 'No prescription';
  return w.met ? 'Met' : 'Not met';
}

/** Writes "paused" up the paused weeks' bars, so the pause reads without the legend's colours. */
const pausedLabels: Plugin<'bar'> = {
  id: 'pausedLabels',
  afterDatasetsDraw(chart) {
    const meta = chart.getDatasetMeta(PAUSED_DATASET);
    const { ctx } = chart;
    ctx.save();
    ctx.fillStyle = PALETTE.slate;
    ctx.font = '600 12px "IBM Plex Sans", sans-serif';
    ctx.textAlign = 'center';
    ctx.textBaseline = 'middle';
    meta.data.forEach((bar, i) => {
      if (chart.data.datasets[PAUSED_DATASET].data[i] === null) return;
      const { x, y, base } = bar.getProps(['x', 'y', 'base'], true) as { x: number; y: number; base: number };
      ctx.save();
      ctx.translate(x, (y + base) / 2);
      ctx.rotate(-Math.PI / 2);
      ctx.fillText('paused', 0, 0);
      ctx.restore();
    });
    ctx.restore();
  },
};

/** Sessions that counted each week against the prescribed number; paused weeks are drawn as pauses, not misses. */
export function AdherenceChart({ adherence, locale, currentIsoWeek, compact = false }: { adherence: AdherenceData; locale: string; currentIsoWeek: string; compact?: boolean }) {
  const { weeks } = adherence;
  const top = Math.max(1, ...weeks.map((w) => Math.max(w.prescribed, w.counted)));
  const data = useMemo<ChartData<'bar', (number | null)[], string>>(
    () => ({
      labels: weeks.map((w) => formatDate(parseIsoWeek(w.isoWeek).monday, locale, 'dayMonth')),
      datasets: [
        { label: 'Counted sessions', data: weeks.map((w) => w.counted), backgroundColor: PALETTE.lagoon, grouped: false, barPercentage: 0.5, order: 0 },
        { label: 'Prescribed', data: weeks.map((w) => (w.paused ? null : w.prescribed)), backgroundColor: PALETTE.lagoonTint, borderColor: PALETTE.lagoon, borderWidth: 2, grouped: false, barPercentage: 0.85, order: 1 },
        { label: 'Paused week', data: weeks.map((w) => (w.paused ? top : null)), backgroundColor: PALETTE.slateTint, borderColor: PALETTE.slate, borderWidth: 1, grouped: false, barPercentage: 0.85, order: 2 },
      ],
    }),
    [weeks, locale, top],
  );
  const options = useMemo<ChartOptions<'bar'>>(() => {
    const base = baseOptions<'bar'>('Sessions');
    return {
      ...base,
      scales: { x: { ...base.scales!.x, title: { display: true, text: 'Week starting', color: PALETTE.ink } }, y: { ...base.scales!.y, ticks: { color: PALETTE.ink, precision: 0 } } },
      plugins: {
        ...base.plugins,
        tooltip: {
          filter: (item) => item.parsed.y !== null,
          callbacks: {
            title: (items) => (items.length ? `Week of ${formatDate(parseIsoWeek(weeks[items[0].dataIndex].isoWeek).monday, locale, 'day')}` : ''),
            label: (item) => (item.datasetIndex === PAUSED_DATASET ? 'Paused: neither met nor missed' : `${item.dataset.label}: ${item.parsed.y}`),
            afterBody: (items) => (items.length ? status(weeks[items[0].dataIndex], currentIsoWeek) : ''),
          },
        },
      },
    };
  }, [weeks, locale, currentIsoWeek]);
  const finished = weeks.filter((w) => w.isoWeek !== currentIsoWeek && !w.paused && w.prescribed > 0);
  const paused = weeks.filter((w) => w.paused).length;
  const summary = [
    `Over the last ${weeks.length} weeks, ${finished.filter((w) => w.met).length} of ${finished.length} finished weeks with a prescription were met.`,
    paused ? `${paused} ${paused === 1 ? 'week was' : 'weeks were'} paused and count neither way.` : '',
    `Streak: ${adherence.streakWeeks} ${adherence.streakWeeks === 1 ? 'week' : 'weeks'}.`,
  ]
    .filter(Boolean)
    .join(' ');
  const table: ChartTable = {
    caption: 'Sessions per week against the prescription',
    columns: ['Week of', 'Prescribed', 'Counted', 'Too short', 'Week'],
    rows: weeks.map((w) => ({
      key: w.isoWeek,
      cells: [formatDate(parseIsoWeek(w.isoWeek).monday, locale, 'day'), w.paused ? '—' : String(w.prescribed), String(w.counted), String(w.short), status(w, currentIsoWeek)],
    })),
  };
  return (
    <ChartFrame id="adherence-chart" title="Sessions per week" summary={summary} table={table} compact={compact}>
      {weeks.some((w) => w.prescribed > 0 || w.counted > 0 || w.paused) ? (
        <Bar data={data} options={options} plugins={[pausedLabels]} role="img" aria-label="Bar chart of counted sessions per week against the prescribed number, with paused weeks marked; the sentence above and the table below give the numbers." />
      ) : null}
    </ChartFrame>
  );
}
