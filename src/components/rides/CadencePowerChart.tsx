import type { ChartData, ChartOptions } from 'chart.js';
import { useMemo } from 'react';
import { Line } from 'react-chartjs-2';
import { baseOptions, phaseBands } from './chart-setup';
import { number } from './format';
import { minuteRows } from './minute-rows';
import { MinuteTable } from './MinuteTable';
import { PhaseKey } from './PhaseKey';
import type { ChartSeries, Point } from './types';
import { PALETTE } from '../palette';

const CADENCE = PALETTE.lagoon;
const POWER = PALETTE.brick;

const NONE: Point[] = [];

const xy = (points: Point[]) => points.map(([t, v]) => ({ x: t / 60, y: v }));

/** Cadence and power over the session, the phases shaded behind, with the same numbers as a table. */
export function CadencePowerChart({ series, endS }: { series: ChartSeries; endS: number }) {
  const cadence = series.cadenceRpm ?? NONE;
  const power = series.powerW ?? NONE;
  const data = useMemo<ChartData<'line', { x: number; y: number }[]>>(
    () => ({
      datasets: [
        ...(cadence.length ? [{ label: 'Cadence (rpm)', data: xy(cadence), borderColor: CADENCE, backgroundColor: CADENCE, borderDash: [6, 3], yAxisID: 'cadence' }] : []),
        ...(power.length ? [{ label: 'Power (W)', data: xy(power), borderColor: POWER, backgroundColor: POWER, yAxisID: 'power' }] : []),
      ],
    }),
    [cadence, power],
  );
  const options = useMemo<ChartOptions<'line'>>(() => {
    const base = baseOptions(endS / 60);
    return {
      ...base,
      scales: {
        ...base.scales,
        cadence: {
          type: 'linear',
          position: 'left',
          display: cadence.length > 0,
          beginAtZero: true,
          title: { display: true, text: 'Cadence (rpm)', color: PALETTE.ink },
          ticks: { color: PALETTE.ink },
          grid: { color: PALETTE.line },
        },
        power: {
          type: 'linear',
          position: 'right',
          display: power.length > 0,
          beginAtZero: true,
          title: { display: true, text: 'Power (W)', color: PALETTE.ink },
          ticks: { color: PALETTE.ink },
          grid: { drawOnChartArea: false },
        },
      },
    };
  }, [endS, cadence.length, power.length]);
  const plugins = useMemo(() => [phaseBands(series.phases)], [series.phases]);
  const table = useMemo(() => {
    const shown = [
      { label: 'Cadence (rpm)', points: cadence, digits: 0 },
      { label: 'Power (W)', points: power, digits: 1 },
    ].filter((c) => c.points.length);
    return { shown, rows: minuteRows(series.phases, shown.map((c) => c.points), endS) };
  }, [series.phases, cadence, power, endS]);

  if (!cadence.length && !power.length) {
    return <p className="text-ink-soft">This ride file has no cadence or power column, so there is nothing to chart here.</p>;
  }
  const shown = [cadence.length && 'cadence', power.length && 'power'].filter(Boolean).join(' and ');
  return (
    <div className="space-y-3">
      <div className="relative h-72 sm:h-80">
        <Line
          data={data}
          options={options}
          plugins={plugins}
          role="img"
          aria-label={`Line chart of ${shown} over ${number(endS / 60, 0)} minutes, with the phases shaded behind. The table below gives the values minute by minute.`}
        />
      </div>
      <PhaseKey phases={series.phases} />
      <MinuteTable
        summary="Cadence and power minute by minute"
        caption="Cadence and power, mean of the plotted points in each minute"
        columns={table.shown.map((c) => c.label)}
        rows={table.rows}
        digits={table.shown.map((c) => c.digits)}
      />
    </div>
  );
}
