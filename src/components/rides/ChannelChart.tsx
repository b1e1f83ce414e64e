import type { ChartData, ChartOptions } from 'chart.js';
import { useMemo } from 'react';
import { Line } from 'react-chartjs-2';
import { PALETTE } from '../palette';
import { baseOptions, phaseBands } from './chart-setup';
import { orderedChannels } from './channel-order';
import { channelLabel, number } from './format';
import { minuteRows } from './minute-rows';
import { MinuteTable } from './MinuteTable';
import { PhaseKey } from './PhaseKey';
import type { ChartSeries } from './types';

// A colour of its own for each channel (at least 3:1 against the phase tints),
// and dashes for every second one, so that lines stay apart without relying on colour alone.
const COLOURS = ['#1e5a5f', '#2d6fb7', '#9c2f29', '#a35400', '#6b3d7a', '#4b5b61', '#2f6133', '#1d2a2f'];

function lineStyle(index: number): { colour: string; dash: number[] } {
  return { colour: COLOURS[index % COLOURS.length], dash: index % 2 ? [6, 3] : [] };
}

/** Stimulation current of each channel over the session, with the same numbers as a table. */
export function ChannelChart({ series, endS }: { series: ChartSeries; endS: number }) {
  const names = useMemo(() => orderedChannels(Object.keys(series.channels).filter((n) => series.channels[n]?.length)), [series.channels]);
  const data = useMemo<ChartData<'line', { x: number; y: number }[]>>(
    () => ({
      datasets: names.map((name, i) => {
        const { colour, dash } = lineStyle(i);
        return {
          label: channelLabel(name),
          data: series.channels[name].map(([t, v]) => ({ x: t / 60, y: v })),
          borderColor: colour,
          backgroundColor: colour,
          borderDash: dash,
        };
      }),
    }),
    [names, series.channels],
  );
  const options = useMemo<ChartOptions<'line'>>(() => {
    const base = baseOptions(endS / 60);
    return {
      ...base,
      scales: {
        ...base.scales,
        y: {
          type: 'linear',
          beginAtZero: true,
          title: { display: true, text: 'Current (mA)', color: PALETTE.ink },
          ticks: { color: PALETTE.ink },
          grid: { color: PALETTE.line },
        },
      },
    };
  }, [endS]);
  const plugins = useMemo(() => [phaseBands(series.phases)], [series.phases]);
  const rows = useMemo(() => minuteRows(series.phases, names.map((n) => series.channels[n]), endS), [series.phases, series.channels, names, endS]);

  if (!names.length) return <p className="text-ink-soft">This ride file has no channel current columns.</p>;
  return (
    <div className="space-y-3">
      <div className="relative h-72 sm:h-80">
        <Line
          data={data}
          options={options}
          plugins={plugins}
          role="img"
          aria-label={`Line chart of the current of ${names.length === 1 ? 'one channel' : `${names.length} channels`} over ${number(endS / 60, 0)} minutes, with the phases shaded behind. The table below gives the values minute by minute.`}
        />
      </div>
      <PhaseKey phases={series.phases} />
      <MinuteTable
        summary="Channel current minute by minute"
        caption="Current in mA per channel, mean of the plotted points in each minute"
        columns={names.map(channelLabel)}
        rows={rows}
        digits={names.map(() => 0)}
      />
    </div>
  );
}
