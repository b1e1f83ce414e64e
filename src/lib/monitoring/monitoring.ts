// Minutes staff spend monitoring a client (reviewing data, calls, messages,
// reports), by a timer on the client page or by hand, and the monthly totals
// per therapist and per client beside the days with data.
import { z } from 'zod';
import type { RequestContext } from '../auth/context';
import { scope, type Db } from '../data';
import type { ClientRow, MonitoringEntryRow } from '../db/tables';
import { badRequest } from '../http/errors';
import { localDate } from '../time/local-date';
import { instant, paragraph } from '../validation/fields';
import { toCsv } from '../exports/csv';
import { dataPeriods, isMonth, monthOf, monthRange, MONITORING_ACTIVITIES, periodsWithin, totalsOf, type DataPeriod } from './periods';

/** At most 8 hours in one entry; longer work is recorded as several. */
export const MAX_ENTRY_SECONDS = 8 * 3600;

export const monitoringInputSchema = z
  .object({
    activity: z.enum(MONITORING_ACTIVITIES as [string, ...string[]], { errorMap: () => ({ message: 'Activity: choose review, phone call, message or report.' }) }),
    seconds: z.number().int('Time: whole seconds.').min(1, 'Time: enter at least one minute.').max(MAX_ENTRY_SECONDS, 'Time: at most 8 hours in one entry; record longer work as several entries.'),
    startedAt: instant('Started', 'Started: give a date and time.').optional(),
    source: z.enum(['timer', 'manual']),
    note: paragraph(z.string().trim().max(1000, 'Note: at most 1000 characters.'), 'Note').optional(),
  })
  .strict();

export const monthQuerySchema = z.object({ month: z.string().refine(isMonth, 'Month: use the form YYYY-MM.').optional() });

function entryView(row: MonitoringEntryRow & { staff_name?: string; client_name?: string }) {
  return {
    id: row.id,
    clientId: row.client_id,
    clientName: row.client_name ?? null,
    staff: { userId: row.staff_user_id, name: row.staff_name ?? null },
    activity: row.activity,
    source: row.source,
    startedAt: row.started_at.toISOString(),
    seconds: row.seconds,
    note: row.note,
    createdAt: row.created_at.toISOString(),
  };
}

async function clinicZone(db: Db, clinicId: string): Promise<string> {
  return (await db('clinics').where({ id: clinicId }).first('time_zone')).time_zone;
}

/** Records time spent on a client; the clinic's staff only. */
export async function recordMonitoring(ctx: RequestContext, clientId: string, input: z.infer<typeof monitoringInputSchema>, now = new Date()) {
  const client = await scope(ctx).client(clientId, 'manage', 'monitoring.record', { seconds: input.seconds, activity: input.activity, source: input.source });
  const started = input.startedAt ? new Date(input.startedAt) : new Date(now.getTime() - input.seconds * 1000);
  if (started.getTime() > now.getTime() + 60_000) throw badRequest('Started: the time cannot be in the future.', { fields: [{ path: 'startedAt', message: 'Choose a time that has passed.' }] });
  if (now.getTime() - started.getTime() > 400 * 86_400_000) throw badRequest('Started: record time within about a year of doing it.', { fields: [{ path: 'startedAt', message: 'Choose a date in the last 400 days.' }] });
  const [row] = await client.db<MonitoringEntryRow>('monitoring_entries')
    .insert({ staff_user_id: ctx.viewer.userId, activity: input.activity as MonitoringEntryRow['activity'], source: input.source, started_at: started, seconds: input.seconds, note: input.note || null })
    .returning('*');
  return entryView({ ...row, staff_name: ctx.viewer.name });
}

/** The days (in the client's zone) on which a ride file arrived, for several clients at once. */
async function dataDays(db: Db, clients: ClientRow[]): Promise<Map<string, string[]>> {
  const rows = clients.length ? await db('rides').whereIn('client_id', clients.map((c) => c.id)).select('client_id', 'started_at') : [];
  const zone = new Map(clients.map((c) => [c.id, c.time_zone]));
  const out = new Map<string, string[]>();
  for (const r of rows) {
    const list = out.get(r.client_id) ?? [];
    list.push(localDate(r.started_at, zone.get(r.client_id)!));
    out.set(r.client_id, list);
  }
  return out;
}

/** Days with data per 30-day period from the program's first day (its start, else the first session). */
function periodsOf(client: ClientRow, days: string[], now: Date): DataPeriod[] {
  const start = client.program_start ?? [...days].sort()[0];
  return start ? dataPeriods(start, localDate(now, client.time_zone), days) : [];
}

/** One client's entries in a month of the clinic's calendar, their totals and the client's data periods. */
export async function clientMonitoring(ctx: RequestContext, clientId: string, month: string | undefined, now = new Date()) {
  const grant = await scope(ctx).client(clientId, 'manage', 'monitoring.view', { month });
  const client = grant.row;
  const zone = await clinicZone(grant.db, client.clinic_id);
  const chosen = month ?? monthOf(now, zone);
  const range = monthRange(chosen, zone);
  const rows = await grant.db('monitoring_entries as m')
    .join('users as u', 'u.id', 'm.staff_user_id')
    .where('m.started_at', '>=', range.start)
    .where('m.started_at', '<', range.end)
    .orderBy('m.started_at', 'desc')
    .select('m.*', 'u.name as staff_name');
  const days = (await dataDays(grant.db, [client])).get(client.id) ?? [];
  return {
    month: chosen,
    timeZone: zone,
    entries: rows.map(entryView),
    totals: totalsOf(rows),
    dataPeriods: periodsOf(client, days, now).slice(-6),
  };
}

/** The clinic's month: totals per therapist and per client, with each client's data periods that touch the month. */
export async function monitoringSummary(ctx: RequestContext, query: { month?: string; clinicId?: string }, now = new Date()) {
  const clinic = scope(ctx).clinic(['admin', 'therapist'], query.clinicId);
  const clinicId = clinic.id;
  const zone = await clinicZone(clinic.db, clinicId);
  const month = query.month ?? monthOf(now, zone);
  const range = monthRange(month, zone);
  const rows: (MonitoringEntryRow & { staff_name: string })[] = await clinic.db('monitoring_entries as m')
    .join('users as u', 'u.id', 'm.staff_user_id')
    .where('m.started_at', '>=', range.start)
    .where('m.started_at', '<', range.end)
    .select('m.*', 'u.name as staff_name');
  const clients: ClientRow[] = await clinic.db<ClientRow>('clients').orderBy('display_name');
  const days = await dataDays(clinic.db, clients);
  await clinic.audit({ action: 'monitoring.summary', detail: { month, entries: rows.length } });

  const staffIds = [...new Set(rows.map((r) => r.staff_user_id))];
  const therapists = staffIds
    .map((id) => {
      const own = rows.filter((r) => r.staff_user_id === id);
      return { userId: id, name: own[0].staff_name, clients: new Set(own.map((r) => r.client_id)).size, ...totalsOf(own) };
    })
    .sort((a, b) => a.name.localeCompare(b.name));
  const perClient = clients.map((c) => {
    const own = rows.filter((r) => r.client_id === c.id);
    return {
      clientId: c.id,
      name: c.display_name,
      ...totalsOf(own),
      dataPeriods: periodsWithin(periodsOf(c, days.get(c.id) ?? [], now), range.first, range.last),
    };
  });
  return { month, timeZone: zone, first: range.first, last: range.last, therapists, clients: perClient, totals: totalsOf(rows) };
}

export const monitoringCsvQuerySchema = monthQuerySchema.extend({ by: z.enum(['client', 'therapist'], { errorMap: () => ({ message: 'By: choose client or therapist.' }) }).default('client') });

const minutes = (seconds: number) => Math.round((seconds / 60) * 10) / 10;
const periodText = (p: DataPeriod) => `${p.from} to ${p.to}: ${p.daysWithData} of 30 days${p.complete ? '' : ' (under way)'}`;

/** The month's summary as CSV, one row per client or per therapist. */
export async function monitoringCsv(ctx: RequestContext, query: z.infer<typeof monitoringCsvQuerySchema>) {
  const s = await monitoringSummary(ctx, query);
  const activityHeads = MONITORING_ACTIVITIES.map((a) => `${a}_minutes`);
  const filename = `kinloop-monitoring-${s.month}-by-${query.by}.csv`;
  if (query.by === 'therapist') {
    return {
      filename,
      text: toCsv(
        ['month', 'time_zone', 'staff_user_id', 'therapist', 'clients', 'entries', 'minutes', ...activityHeads],
        s.therapists.map((t) => [s.month, s.timeZone, t.userId, t.name, t.clients, t.entries, minutes(t.seconds), ...MONITORING_ACTIVITIES.map((a) => minutes(t.byActivity[a]))]),
      ),
    };
  }
  return {
    filename,
    text: toCsv(
      ['month', 'time_zone', 'client_id', 'client', 'entries', 'minutes', ...activityHeads, 'days_with_data_per_30_day_period'],
      s.clients.map((c) => [s.month, s.timeZone, c.clientId, c.name, c.entries, minutes(c.seconds), ...MONITORING_ACTIVITIES.map((a) => minutes(c.byActivity[a])), c.dataPeriods.map(periodText).join('; ')]),
    ),
  };
}
