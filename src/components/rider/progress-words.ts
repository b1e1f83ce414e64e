// One sentence per weekly chart, so the chart's story can be read without
// seeing it: the first and the latest week with rides, and the best week.
// `weeks` run from the program's first week to the current one.
import { DIGITS, number, watts } from '../../lib/format/numbers';
import { formatDate } from '../../lib/time/format';
import type { ProgressWeek } from './types';

export interface WeekMeasure {
  /** "mean power" */
  what: string;
  value: (w: ProgressWeek) => number | null;
  format: (v: number, locale: string) => string;
}

export function weeklySentence(weeks: ProgressWeek[], m: WeekMeasure, locale: string): string {
  const rode = weeks.filter((w) => w.sessions > 0 && m.value(w) !== null);
  if (!rode.length) return `No ${m.what} to show yet: it builds up week by week as ride files are uploaded.`;
  const first = rode[0];
  const latest = rode[rode.length - 1];
  const best = rode.reduce((a, b) => ((m.value(b) as number) > (m.value(a) as number) ? b : a));
  // The last week listed is the current one, which is not over yet.
  const current = weeks[weeks.length - 1];
  const at = (w: ProgressWeek) => `${m.format(m.value(w) as number, locale)} ${w === current ? 'so far this week' : `in the week of ${formatDate(w.monday, locale, 'dayMonth')}`}`;
  if (rode.length === 1) return `Your ${m.what}: ${at(first)}.`;
  const parts = [`Your ${m.what} per week went from ${at(first)} to ${at(latest)}.`];
  if (best !== latest && best !== first) parts.push(`Your best week so far: ${at(best)}.`);
  if (best === latest) parts.push('The latest week is your best so far.');
  return parts.join(' ');
}

export const MEASURES = {
  power: { what: 'mean power', value: (w: ProgressWeek) => w.meanPowerW, format: (v: number, locale: string) => watts(v, locale) },
  minutes: { what: 'active minutes', value: (w: ProgressWeek) => w.activeMinutes, format: (v: number, locale: string) => `${number(v, 0, locale)} min` },
  distance: { what: 'distance', value: (w: ProgressWeek) => w.distanceM / 1000, format: (v: number, locale: string) => `${number(v, DIGITS.distanceKm, locale)} km` },
} satisfies Record<string, WeekMeasure>;
