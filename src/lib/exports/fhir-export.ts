import { z } from 'zod';
import type { RequestContext } from '../auth/context';
import { scope, type Query } from '../data';
import type { CheckRow, RideRow } from '../db/tables';
import { fileSlug } from '../http/download';
import { clinicEfficiencyPct } from '../reports/energy-settings';
import { addDays, isLocalDate, localDate } from '../time/local-date';
import { startOfLocalDay } from '../time/zoned';
import { fhirBundle } from './fhir';

const localDay = (label: string) => z.string().refine(isLocalDate, `${label}: use the form YYYY-MM-DD.`);
export const fhirQuerySchema = z
  .object({ from: localDay('From').optional(), to: localDay('To').optional() })
  .strict()
  .refine((q) => !q.from || !q.to || q.from <= q.to, { message: 'To: the period must end on or after the day it starts.', path: ['to'] });

/** A client's sessions and checks from `from` to `to` (local days, both included; open ends take everything) as a FHIR R4 collection. */
export async function clientFhir(ctx: RequestContext, clientId: string, query: z.infer<typeof fhirQuerySchema>) {
  const grant = await scope(ctx).client(clientId, 'read', 'fhir.export', query);
  const client = grant.row;
  const tz = client.time_zone;
  const after = query.from ? new Date(startOfLocalDay(query.from, tz)) : null;
  const before = query.to ? new Date(startOfLocalDay(addDays(query.to, 1), tz)) : null;
  const within = (column: string) => (q: Query) => {
    if (after) q.where(column, '>=', after);
    if (before) q.where(column, '<', before);
  };
  const rides: RideRow[] = await grant.db<RideRow>('rides').modify(within('started_at')).orderBy('started_at');
  const checks: CheckRow[] = await grant.db('checks').modify(within('taken_at')).orderBy('taken_at');
  const clinic = await grant.db('clinics').where({ id: client.clinic_id }).first('id', 'name', 'fes_efficiency_pct');
  const bp = (s: number | null, d: number | null) => (s === null || d === null ? null : { systolic: s, diastolic: d });
  const now = new Date();
  const bundle = fhirBundle({
    client: { id: client.id, name: client.display_name, dateOfBirth: client.date_of_birth },
    clinic: { id: clinic.id, name: clinic.name },
    rides,
    checks: checks.map((c) => ({
      id: c.id,
      takenAt: c.taken_at.toISOString(),
      bpBefore: bp(c.bp_before_systolic, c.bp_before_diastolic),
      bpDuring: bp(c.bp_during_systolic, c.bp_during_diastolic),
      bpAfter: bp(c.bp_after_systolic, c.bp_after_diastolic),
      heartRateBefore: c.heart_rate_before,
      heartRateAfter: c.heart_rate_after,
    })),
    efficiencyPct: clinicEfficiencyPct(clinic.fes_efficiency_pct),
    now,
  });
  return { filename: `kinloop-fhir-${fileSlug(client.display_name)}-${localDate(now, tz)}.json`, bundle };
}
