// ISO 8601 weeks (Monday first; week 1 holds the year's first Thursday) of
// dates in a client's time zone. A session belongs to the week of its local
// start date, so every week computation starts from the local calendar date.
import { addDays, daysFrom, isLocalDate, isoWeekday, localDate } from './local-date';

export interface IsoWeek {
  /** e.g. '2026-W41' */
  isoWeek: string;
  year: number;
  week: number;
  /** local date YYYY-MM-DD */
  monday: string;
  sunday: string;
}

const WEEK_KEY = /^(\d{4})-W(\d{2})$/;

/**
 * The ISO week of an instant (taken in `timeZone`) or of a local date
 * 'YYYY-MM-DD' (already local, so `timeZone` does not move it).
 */
export function isoWeekOf(instantOrLocalDate: string | Date, timeZone: string): IsoWeek {
  const date =
    typeof instantOrLocalDate === 'string' && isLocalDate(instantOrLocalDate)
      ? instantOrLocalDate
      : localDate(instantOrLocalDate, timeZone);
  return weekOfLocalDate(date);
}

// ISO 8601: a week belongs to the year of its Thursday and is numbered from
// that year's first Thursday.
function weekOfLocalDate(date: string): IsoWeek {
  const monday = addDays(date, 1 - isoWeekday(date));
  const thursday = addDays(monday, 3);
  const year = Number(thursday.slice(0, 4));
  const week = Math.floor(daysFrom(`${thursday.slice(0, 4)}-01-01`, thursday) / 7) + 1;
  return {
    isoWeek: `${thursday.slice(0, 4)}-W${String(week).padStart(2, '0')}`,
    year,
    week,
    monday,
    sunday: addDays(monday, 6),
  };
}

/** The ISO week key ('2026-W41') of a local date. */
export function isoWeekKey(date: string): string {
  return weekOfLocalDate(date).isoWeek;
}

/** Parses a week key such as '2026-W41'. */
export function parseIsoWeek(key: string): IsoWeek {
  const match = WEEK_KEY.exec(key);
  if (!match) throw new RangeError(`Not an ISO week (YYYY-Www): ${key}`);
  // Week 1 is the week of 4 January.
  const firstMonday = weekOfLocalDate(`${match[1]}-01-04`).monday;
  const week = weekOfLocalDate(addDays(firstMonday, (Number(match[2]) - 1) * 7));
  if (week.isoWeek !== key) throw new RangeError(`Not an ISO week (YYYY-Www): ${key}`);
  return week;
}

function toWeek(week: IsoWeek | string): IsoWeek {
  return typeof week === 'string' ? parseIsoWeek(week) : week;
}

export function addWeeks(week: IsoWeek | string, weeks: number): IsoWeek {
  return weekOfLocalDate(addDays(toWeek(week).monday, weeks * 7));
}

export function previousWeek(week: IsoWeek | string): IsoWeek {
  return addWeeks(week, -1);
}

export function nextWeek(week: IsoWeek | string): IsoWeek {
  return addWeeks(week, 1);
}

/** The `count` weeks ending with `end` (inclusive), oldest first. */
export function weeksEndingAt(end: IsoWeek | string, count: number): IsoWeek[] {
  if (!Number.isInteger(count) || count < 0) throw new RangeError(`Not a week count: ${count}`);
  return Array.from({ length: count }, (_, i) => addWeeks(end, i - count + 1));
}

/** The seven local dates of a week, Monday first. */
export function datesOfWeek(week: IsoWeek | string): string[] {
  const monday = toWeek(week).monday;
  return Array.from({ length: 7 }, (_, i) => addDays(monday, i));
}
