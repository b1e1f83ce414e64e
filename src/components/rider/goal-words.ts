// How far along a distance goal the rider is, in words, for the goal and progress pages.
import { number } from '../../lib/format/numbers';
import type { GoalProgress } from './types';

/** Kilometres with one decimal: "12.3 km". */
export function km(metres: number, locale: string): string {
  return `${number(metres / 1000, 1, locale)} km`;
}

/** Where a route goes: "from Passau to Vienna", or "from Konstanz harbour and back" when it ends within 200 m of its start. */
export function routeEnds(points: { name: string; lat: number; lon: number }[]): string {
  const first = points[0];
  const last = points[points.length - 1];
  if (!first || !last || points.length < 2) return first ? `at ${first.name}` : '';
  // An equirectangular distance is plenty at this scale (common practice); Earth radius 6371 km (IUGG mean radius).
  const rad = Math.PI / 180;
  const dx = (last.lon - first.lon) * rad * Math.cos(((first.lat + last.lat) / 2) * rad);
  const dy = (last.lat - first.lat) * rad;
  const loop = Math.hypot(dx, dy) * 6_371_000 < 200;
  return loop ? `from ${first.name} and back` : `from ${first.name} to ${last.name}`;
}

/** Whole percent, never showing 100 % before the finish. */
export function percent(fraction: number, finished: boolean): number {
  // Rounded to a millionth first, so that 0.29 × 100 = 28.999… still reads 29.
  const p = Math.floor(Math.round(Math.max(0, Math.min(1, fraction)) * 1e6) / 1e4);
  return finished ? 100 : Math.min(p, 99);
}

/** "123.4 km of 250.0 km (49 %)". */
export function travelledText(p: GoalProgress, locale: string): string {
  return `${km(p.travelledM, locale)} of ${km(p.totalM, locale)} (${percent(p.fraction, p.finished)} %)`;
}

/** The next milestone and what is left to it, or the finish. */
export function nextMilestoneText(p: GoalProgress, locale: string): string {
  if (p.finished || !p.next) return 'You have reached the finish of this route — well done.';
  return `Next milestone: ${p.next.name}, ${km(p.next.remainingM, locale)} to go.`;
}

/** What is left of the whole route. */
export function remainingText(p: GoalProgress, locale: string): string {
  return p.finished ? 'Route complete.' : `${km(Math.max(0, p.totalM - p.travelledM), locale)} left to the finish.`;
}
