// What the rider's weekly charts need from chart.js, registered once.
import { BarElement, CategoryScale, Chart, LinearScale, LineElement, PointElement, Tooltip } from 'chart.js';
import { PALETTE } from '../palette';

Chart.register(CategoryScale, LinearScale, BarElement, LineElement, PointElement, Tooltip);

export { INK, LINE } from '../rides/chart-setup';
export const LAGOON = PALETTE.lagoon;
export const SLATE = PALETTE.slate;
export const OCHRE = PALETTE.ochre;
