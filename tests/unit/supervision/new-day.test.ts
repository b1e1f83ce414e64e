// The hourly flag sweep (five past every UTC hour) judges each client once a
// day, at the first sweep of their new local day, whatever their zone's offset.
import { TZDate } from '@date-fns/tz';
import { format } from 'date-fns';
import { describe, expect, it } from 'vitest';
import { clientsWithNewDay, newDaySinceLastSweep } from '../../../src/lib/supervision/new-day';

const sweep = (iso: string) => new Date(iso);

describe('the clients whose new local day has begun since the last hourly sweep', () => {
  it.each([
    // from memory: India is UTC+5:30 all year, so local midnight of 6 October is 18:30 UTC on the 5th.
    ['Asia/Kolkata', '2026-10-05T18:05:00Z', '2026-10-05T19:05:00Z'],
    // from memory: Nepal is UTC+5:45 all year; midnight is 18:15 UTC.
    ['Asia/Kathmandu', '2026-10-05T18:05:00Z', '2026-10-05T19:05:00Z'],
    // from memory: Adelaide is on summer time (UTC+10:30) from the first Sunday of October; midnight is 13:30 UTC.
    ['Australia/Adelaide', '2026-10-05T13:05:00Z', '2026-10-05T14:05:00Z'],
    // from memory: the Chatham Islands are on summer time (UTC+13:45) from the last Sunday of September; midnight is 10:15 UTC.
    ['Pacific/Chatham', '2026-10-05T10:05:00Z', '2026-10-05T11:05:00Z'],
    // from memory: London is on BST (UTC+1) until 25 October 2026; midnight is 23:00 UTC.
    ['Europe/London', '2026-10-05T22:05:00Z', '2026-10-05T23:05:00Z'],
  ])('%s: not at %s (still the 5th), then at %s, and not an hour later', (zone, before, first) => {
    expect(newDaySinceLastSweep(zone, sweep(before))).toBe(false);
    expect(newDaySinceLastSweep(zone, sweep(first))).toBe(true);
    expect(newDaySinceLastSweep(zone, new Date(sweep(first).getTime() + 3_600_000))).toBe(false);
  });

  it('picks the clients of one zone out of many', () => {
    const clients = [
      { id: 'kolkata', time_zone: 'Asia/Kolkata' },
      { id: 'kathmandu', time_zone: 'Asia/Kathmandu' },
      { id: 'london', time_zone: 'Europe/London' },
      { id: 'kolkata-2', time_zone: 'Asia/Kolkata' },
    ];
    // Hand-worked from the offsets above. 18:25 UTC: 23:55 in Kolkata, 00:10 in Kathmandu, 19:25 in London.
    expect(clientsWithNewDay(clients, sweep('2026-10-05T18:25:00Z')).map((c) => c.id)).toEqual(['kathmandu']);
    // 18:35 UTC: 00:05 in Kolkata, and Kathmandu's day began 20 minutes ago, after the sweep an hour before.
    expect(clientsWithNewDay(clients, sweep('2026-10-05T18:35:00Z')).map((c) => c.id)).toEqual(['kolkata', 'kathmandu', 'kolkata-2']);
  });

  it(
    'judges every local day exactly once, at its first sweep, through the clock changes of 2026',
    () => {
      // source: @date-fns/tz as the reference for a sweep's local date. Havana
      // and Santiago change their clocks at midnight (a day that starts at
      // 01:00, and a midnight that happens twice); the others at other hours.
      const zones = ['Asia/Kolkata', 'Asia/Kathmandu', 'Australia/Adelaide', 'Pacific/Chatham', 'Europe/London', 'America/Havana', 'America/Santiago'];
      const windows = [
        ['2026-03-01T00:05:00Z', '2026-04-15T00:05:00Z'],
        ['2026-09-01T00:05:00Z', '2026-11-10T00:05:00Z'],
      ];
      const localDay = (ms: number, zone: string) => format(new TZDate(ms, zone), 'yyyy-MM-dd');
      const problems: string[] = [];
      for (const zone of zones) {
        for (const [from, to] of windows) {
          const judged = new Map<string, number>();
          for (let ms = Date.parse(from); ms < Date.parse(to); ms += 3_600_000) {
            const day = localDay(ms, zone);
            if (!judged.has(day)) judged.set(day, 0);
            const first = day !== localDay(ms - 3_600_000, zone);
            const picked = newDaySinceLastSweep(zone, new Date(ms));
            if (picked !== first) problems.push(`${zone} ${new Date(ms).toISOString()}: ${picked ? 'picked, not the first sweep of' : 'missed the first sweep of'} ${day}`);
            if (picked) judged.set(day, judged.get(day)! + 1);
          }
          const days = [...judged.keys()].sort().slice(1, -1); // whole days inside the window
          for (const day of days) if (judged.get(day) !== 1) problems.push(`${zone} ${day}: judged ${judged.get(day)} times`);
          expect(days.length, `${zone} from ${from}`).toBeGreaterThan(40);
        }
      }
      expect(problems).toEqual([]);
    },
    60_000,
  );
});
