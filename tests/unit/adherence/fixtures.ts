// Demo data builders for adherence and flag tests (invented numbers).
import { TZDate } from '@date-fns/tz';

/** The UTC instant of a local wall time, built with @date-fns/tz. */
export function at(date: string, time: string, zone: string): string {
  const [y, m, d] = date.split('-').map(Number);
  const [hh, mm] = time.split(':').map(Number);
  return new Date(new TZDate(y, m - 1, d, hh, mm, zone).getTime()).toISOString();
}

/** Adds days to a local date (test-side arithmetic on UTC noon). */
export function plusDays(date: string, days: number): string {
  const t = new Date(`${date}T12:00:00Z`).getTime() + days * 86_400_000;
  return new Date(t).toISOString().slice(0, 10);
}

export interface DemoSession {
  id: string;
  startedAt: string;
  durationS: number;
  meanPowerW: number | null;
  currentPerWattMaPerW: number | null;
}

export function ride(
  date: string,
  zone: string,
  opts: { time?: string; minutes?: number; power?: number | null; currentPerWatt?: number | null; id?: string } = {},
): DemoSession {
  const time = opts.time ?? '10:00';
  return {
    id: opts.id ?? `s-${date}-${time.replace(':', '')}`,
    startedAt: at(date, time, zone),
    durationS: (opts.minutes ?? 30) * 60,
    meanPowerW: opts.power === undefined ? 20 : opts.power,
    currentPerWattMaPerW: opts.currentPerWatt === undefined ? 2.5 : opts.currentPerWatt,
  };
}

/** Rides on Monday, Wednesday and Friday of `weeks` weeks from the Monday `firstMonday`. */
export function mondayWednesdayFriday(
  firstMonday: string,
  weeks: number,
  zone: string,
  opts: Parameters<typeof ride>[2] = {},
): DemoSession[] {
  const out: DemoSession[] = [];
  for (let w = 0; w < weeks; w++) {
    for (const offset of [0, 2, 4]) out.push(ride(plusDays(firstMonday, w * 7 + offset), zone, opts));
  }
  return out;
}
