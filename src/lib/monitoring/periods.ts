// Monitoring time and days with data, as a clinic documents them for funders
// that pay for remote monitoring. Kinloop totals; it does not decide what is
// billable. Pure: months and days are computed from what is passed in.
import { DateTime } from 'luxon';
import type { MonitoringActivity } from '../db/tables';
import { addDays } from '../time/local-date';

export const MONITORING_ACTIVITIES: MonitoringActivity[] = ['review', 'phone_call', 'message', 'report'];
export const ACTIVITY_WORDS: Record<MonitoringActivity, string> = {
  review: 'Reviewing data',
  phone_call: 'Phone or video call',
  message: 'Message',
  report: 'Writing a report',
};

/** The length of a data period, in days of the client's calendar. */
export const DATA_PERIOD_DAYS = 30;

const MONTH = /^(\d{4})-(0[1-9]|1[0-2])$/;
export const isMonth = (value: string) => MONTH.test(value);

/** The instants a calendar month ('YYYY-MM') begins and ends in a time zone: [start, end). */
export function monthRange(month: string, timeZone: string): { start: Date; end: Date; first: string; last: string } {
  if (!isMonth(month)) throw new RangeError(`Not a month (YYYY-MM): ${month}`);
  const start = DateTime.fromISO(`${month}-01`, { zone: timeZone }).startOf('day');
  const next = start.plus({ months: 1 });
  return { start: start.toJSDate(), end: next.toJSDate(), first: start.toISODate()!, last: next.minus({ days: 1 }).toISODate()! };
}

/** The month ('YYYY-MM') an instant falls in, in a time zone. */
export const monthOf = (instant: Date, timeZone: string) => DateTime.fromJSDate(instant, { zone: timeZone }).toFormat('yyyy-MM');

export interface DataPeriod {
  from: string;
  to: string;
  daysWithData: number;
  /** The period's last day has passed. */
  complete: boolean;
}

/**
 * Consecutive 30-day periods from `start` (the program's first day) up to the
 * one holding `today`, each with the number of days on which data arrived.
 */
export function dataPeriods(start: string, today: string, dataDays: Iterable<string>): DataPeriod[] {
  const days = new Set(dataDays);
  const out: DataPeriod[] = [];
  if (start > today) return out;
  for (let from = start; from <= today; from = addDays(from, DATA_PERIOD_DAYS)) {
    const to = addDays(from, DATA_PERIOD_DAYS - 1);
    let count = 0;
    for (let d = from; d <= to; d = addDays(d, 1)) if (days.has(d)) count++;
    out.push({ from, to, daysWithData: count, complete: to < today });
  }
  return out;
}

/** The periods that share at least one day with [first, last]. */
export const periodsWithin = (periods: DataPeriod[], first: string, last: string) => periods.filter((p) => p.to >= first && p.from <= last);

export interface Totals {
  seconds: number;
  entries: number;
  byActivity: Record<MonitoringActivity, number>;
}

export function totalsOf(entries: { seconds: number; activity: MonitoringActivity }[]): Totals {
  const byActivity = Object.fromEntries(MONITORING_ACTIVITIES.map((a) => [a, 0])) as Record<MonitoringActivity, number>;
  for (const e of entries) byActivity[e.activity] += e.seconds;
  return { seconds: entries.reduce((s, e) => s + e.seconds, 0), entries: entries.length, byActivity };
}

/** Whole minutes and seconds, so a total never reads as more than was recorded: "23 min 40 s". */
export function minutesText(seconds: number): string {
  const m = Math.floor(seconds / 60);
  const s = seconds % 60;
  return s ? `${m} min ${s} s` : `${m} min`;
}
