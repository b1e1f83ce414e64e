// What the session charts need from chart.js, registered once, and the plugin
// that shades the phases behind the lines.
import { Chart, Legend, LinearScale, LineElement, PointElement, Tooltip, type ChartOptions, type Plugin } from 'chart.js';
import { PALETTE } from '../palette';
import { clock } from './format';
import { phaseRanges } from './minute-rows';
import type { ChartSeries } from './types';

Chart.register(LinearScale, PointElement, LineElement, Tooltip, Legend);

/** The theme's tints (global.css), so the shading matches the legend swatches on the page. */
export const PHASE_FILL: Record<string, string> = {
  passive: PALETTE.slateTint,
  active: PALETTE.lagoonTint,
  cooldown: PALETTE.ochreTint,
};

/** Fills each phase's time range across the plot area, beneath the grid and the lines. */
export function phaseBands(phases: ChartSeries['phases']): Plugin<'line'> {
  const ranges = phaseRanges(phases);
  return {
    id: 'phaseBands',
    beforeDraw(chart) {
      const { ctx, chartArea, scales } = chart;
      const x = scales.x;
      if (!x || !chartArea) return;
      ctx.save();
      for (const r of ranges) {
        const left = Math.max(chartArea.left, x.getPixelForValue(r.from / 60));
        const right = Math.min(chartArea.right, x.getPixelForValue(r.to / 60));
        if (right <= left) continue;
        ctx.fillStyle = PHASE_FILL[r.phase] ?? 'transparent';
        ctx.fillRect(left, chartArea.top, right - left, chartArea.bottom - chartArea.top);
      }
      ctx.restore();
    },
  };
}

/** Shared by both charts: minutes along x, no animation, a tooltip that follows the pointer along time. */
export function baseOptions(endMinutes: number): ChartOptions<'line'> {
  return {
    responsive: true,
    maintainAspectRatio: false,
    animation: false,
    parsing: false,
    normalized: true,
    interaction: { mode: 'nearest', axis: 'x', intersect: false },
    elements: { point: { radius: 0, hitRadius: 6, hoverRadius: 4 }, line: { borderWidth: 2, tension: 0 } },
    plugins: {
      legend: { position: 'bottom', labels: { color: PALETTE.ink, boxWidth: 28, usePointStyle: false } },
      tooltip: {
        callbacks: {
          title: (items) => (items.length ? `${clock((items[0].parsed.x ?? 0) * 60)} from the start` : ''),
        },
      },
    },
    scales: {
      x: {
        type: 'linear',
        min: 0,
        max: endMinutes,
        title: { display: true, text: 'Minutes from the start', color: PALETTE.ink },
        ticks: { color: PALETTE.ink, precision: 0 },
        grid: { color: PALETTE.line },
      },
    },
  };
}
