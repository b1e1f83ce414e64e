// Wall-clock times in a time zone, where daylight-saving changes make days 23
// or 25 hours long: the one place that needs luxon's zone rules. Server code
// only (flag replays, the demo's schedule); islands use local-date.ts.
import { DateTime } from 'luxon';
import { assertLocalDate } from './local-date';

/** The instant (ISO, UTC) at which `date` begins in `timeZone`. */
export function startOfLocalDay(date: string, timeZone: string): string {
  assertLocalDate(date);
  const start = DateTime.fromISO(date, { zone: timeZone }).startOf('day');
  if (!start.isValid) throw new RangeError(`Not a valid time zone: ${timeZone}`);
  return start.toUTC().toISO()!;
}

/** "2026-05-03" at 570 minutes after midnight in Europe/London → "2026-05-03T09:30:00+01:00". */
export function wallTime(date: string, minuteOfDay: number, timeZone: string): string {
  assertLocalDate(date);
  const [year, month, day] = date.split('-').map(Number);
  const dt = DateTime.fromObject({ year, month, day, hour: Math.floor(minuteOfDay / 60), minute: minuteOfDay % 60 }, { zone: timeZone });
  if (!dt.isValid) throw new RangeError(`No wall time ${minuteOfDay} min on ${date} in ${timeZone}`);
  return dt.toISO({ suppressMilliseconds: true })!;
}

/** The local hour (0–23) and ISO weekday (1 = Monday) of an instant in `timeZone`. */
export function wallClock(instant: Date, timeZone: string): { hour: number; weekday: number } {
  const local = DateTime.fromJSDate(instant).setZone(timeZone);
  if (!local.isValid) throw new RangeError(`Not a valid time zone: ${timeZone}`);
  return { hour: local.hour, weekday: local.weekday };
}
