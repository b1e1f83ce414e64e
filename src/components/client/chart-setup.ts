// What the client page's charts need from chart.js, registered once, drawn in
// the palette of global.css so the charts match the page.
import { PALETTE } from '../palette';
import { BarElement, CategoryScale, Chart, Filler, Legend, LinearScale, LineElement, PointElement, Tooltip, type ChartOptions, type ChartType, type LegendItem } from 'chart.js';

Chart.register(CategoryScale, LinearScale, BarElement, LineElement, PointElement, Filler, Tooltip, Legend);

/** The key shows lines as short lines and bars and filled bands as blocks, whatever the points look like. */
function keyItems(chart: Chart): LegendItem[] {
  return Chart.defaults.plugins.legend.labels.generateLabels(chart).map((item) => {
    const dataset = chart.data.datasets[item.datasetIndex ?? 0] as { type?: string; fill?: unknown };
    const block = (dataset.type ?? (chart.config as { type?: string }).type) === 'bar' || Boolean(dataset.fill);
    return { ...item, pointStyle: block ? 'rect' : 'line' };
  });
}

/** Shared by every chart on the page: no animation, categories along x, a legend below, the y title given. */
export function baseOptions<T extends ChartType>(yTitle: string): ChartOptions<T> {
  return {
    responsive: true,
    maintainAspectRatio: false,
    animation: false,
    interaction: { mode: 'index', intersect: false },
    plugins: {
      legend: { position: 'bottom', labels: { color: PALETTE.ink, usePointStyle: true, pointStyleWidth: 28, boxHeight: 10, generateLabels: keyItems } },
    },
    scales: {
      x: { ticks: { color: PALETTE.ink, maxRotation: 0, autoSkipPadding: 12 }, grid: { display: false } },
      y: { beginAtZero: true, title: { display: true, text: yTitle, color: PALETTE.ink }, ticks: { color: PALETTE.ink }, grid: { color: PALETTE.line } },
    },
  } as ChartOptions<T>;
}
