// One row per session with its summary fields, for a client or a clinic.
import { orderedChannels } from '../../components/rides/channel-order';
import type { RideRow } from '../db/tables';
import { fesEnergyKcal, sessionWorkJ } from '../reports/energy';
import { roundTo } from '../analytics/round';
import { toCsv } from './csv';

export interface SessionCsvRow {
  client: { id: string; name: string; timeZone: string };
  ride: RideRow;
}

const SUMMARY_COLUMNS: [string, (r: RideRow) => number | null][] = [
  ['duration_s', (r) => r.duration_s],
  ['active_s', (r) => r.active_s],
  ['passive_s', (r) => r.passive_s],
  ['cooldown_s', (r) => r.cooldown_s],
  ['mean_power_w', (r) => r.mean_power_w],
  ['peak_power_5s_w', (r) => r.peak_power_5s_w],
  ['work_kj', (r) => r.work_kj],
  ['mean_cadence_rpm', (r) => r.mean_cadence_rpm],
  ['distance_m', (r) => r.distance_m],
  ['current_per_watt_ma_per_w', (r) => r.current_per_watt_ma_per_w],
  ['pulse_width_us', (r) => r.pulse_width_us],
  ['frequency_hz', (r) => r.frequency_hz],
  ['samples', (r) => r.samples],
];

/** "2026-10-05 09:30:00" in the zone: a spreadsheet reads it as a date and time. */
function localDateTime(instant: Date, timeZone: string): string {
  const parts = Object.fromEntries(
    new Intl.DateTimeFormat('en-GB', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit', second: '2-digit', hourCycle: 'h23' })
      .formatToParts(instant)
      .map((p) => [p.type, p.value]),
  );
  return `${parts.year}-${parts.month}-${parts.day} ${parts.hour}:${parts.minute}:${parts.second}`;
}

/** The CSV text; channel columns are those any of the sessions has, in Kinloop's channel order. */
export function sessionsCsv(rows: SessionCsvRow[], efficiencyPct: number): string {
  const channels = orderedChannels([...new Set(rows.flatMap((r) => Object.keys(r.ride.channels ?? {})))]);
  const header = [
    'session_id',
    'client_id',
    'client',
    'started_local',
    'started_utc',
    'time_zone',
    'start_taken_from',
    ...SUMMARY_COLUMNS.map(([name]) => name),
    'estimated_energy_kcal',
    'energy_efficiency_pct',
    ...channels.flatMap((c) => [`${c}_mean_current_ma`, `${c}_max_current_ma`]),
    'warnings',
  ];
  const body = rows.map(({ client, ride: r }) => {
    const work = sessionWorkJ({ workKj: r.work_kj, meanPowerW: r.mean_power_w, activeS: r.active_s });
    return [
      r.id,
      client.id,
      client.name,
      localDateTime(r.started_at, client.timeZone),
      r.started_at.toISOString(),
      client.timeZone,
      r.started_at_source,
      ...SUMMARY_COLUMNS.map(([, get]) => get(r)),
      work === null ? null : roundTo(fesEnergyKcal(work, efficiencyPct), 1),
      efficiencyPct,
      ...channels.flatMap((c) => [r.channels?.[c]?.meanCurrentMa ?? null, r.channels?.[c]?.maxCurrentMa ?? null]),
      r.warnings.join(' | '),
    ];
  });
  return toCsv(header, body);
}
