// What the rider's weekly charts need from chart.js, registered once.
import { BarElement, CategoryScale, Chart, LinearScale, LineElement, PointElement, Tooltip } from 'chart.js';

Chart.register(CategoryScale, LinearScale, BarElement, LineElement, PointElement, Tooltip);

export { INK, LINE } from '../rides/chart-setup';
export const LAGOON = '#1e5a5f';
export const SLATE = '#3a5378';
export const OCHRE = '#7a4f05';
