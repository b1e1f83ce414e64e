// One call loads everything a client's progress report needs for a period,
// with one audit entry, and runs the report's arithmetic (figures.ts). The
// report page and the PDF both start here, so they can never disagree.
import { DateTime } from 'luxon';
import { z } from 'zod';
import type { RequestContext } from '../auth/context';
import { scope } from '../data';
import { checkView } from '../riders/checks';
import { programStartOf, riderSessions } from '../riders/sessions';
import { clientView } from '../clients/view';
import type { CheckRow, PauseRow } from '../db/tables';
import { badRequest } from '../http/errors';
import { trendPointsOf } from '../supervision/client-figures';
import { flagsWithHistory } from '../supervision/flags';
import { loadHistory } from '../supervision/history';
import { overviewOf } from '../supervision/overview';
import { pauseView } from '../supervision/pauses';
import { prescriptionVersions, prescriptionView } from '../supervision/prescriptions';
import { isoWeekOf } from '../time/iso-week';
import { localDate } from '../time/local-date';
import { addDays, isLocalDate } from '../time/local-date';
import { paragraph } from '../validation/fields';
import { clinicEfficiencyPct } from './energy-settings';
import { reportFigures } from './figures';

export const REPORT_WEEKS = [4, 12, 26] as const;
/** The longest period one report covers: half a year still prints on three A4 pages. */
export const MAX_REPORT_DAYS = 26 * 7;

const localDay = (label: string) => z.string().refine(isLocalDate, `${label}: use the form YYYY-MM-DD.`);

/** `?weeks=4|12|26` (the ISO weeks ending with the current one) or `?from=…&to=…` (local days, both included). */
export const reportPeriodSchema = z
  .object({
    weeks: z.coerce.number().refine((w) => (REPORT_WEEKS as readonly number[]).includes(w), 'Weeks: choose 4, 12 or 26.').optional(),
    from: localDay('From').optional(),
    to: localDay('To').optional(),
  })
  .refine((p) => (p.from === undefined) === (p.to === undefined), { message: 'Give both from and to, or neither.', path: ['to'] })
  .refine((p) => !(p.from && p.weeks), { message: 'Give either weeks or from and to, not both.', path: ['weeks'] })
  .refine((p) => !p.from || !p.to || p.from <= p.to, { message: 'To: the period must end on or after the day it starts.', path: ['to'] })
  .refine((p) => !p.from || !p.to || DateTime.fromISO(p.to).diff(DateTime.fromISO(p.from), 'days').days < MAX_REPORT_DAYS, {
    message: `To: a report covers at most ${MAX_REPORT_DAYS / 7} weeks; the sessions CSV has the whole history.`,
    path: ['to'],
  });
export type ReportPeriod = z.infer<typeof reportPeriodSchema>;

export const reportSummarySchema = paragraph(z.string().trim().max(2000, 'Summary: at most 2000 characters.'), 'Summary');
/** The body of a PDF download: the therapist's optional summary (a form post or JSON). */
export const reportPdfBodySchema = z.object({ summary: reportSummarySchema.optional() }).strict();

export interface ReportOptions {
  /** What the audit entry calls this read. */
  action: 'report.view' | 'report.pdf';
  /** The therapist's own summary, printed in the PDF and kept with the audit entry. */
  summary?: string;
  now?: Date;
}

/** Progress reports hold the clinic's flags and notes, so they are for the staff of the client's clinic (others: 403, or 404 when they may not see the client). */
export async function loadReport(ctx: RequestContext, clientId: string, period: ReportPeriod, options: ReportOptions) {
  const now = options.now ?? new Date();
  const summary = options.summary?.trim() || null;
  // The one access, and the one audit entry, of the report: everything below reads through this grant.
  const grant = await scope(ctx).client(clientId, 'manage', options.action, { ...period, ...(summary ? { summary } : {}) });
  const row = grant.row;
  const db = grant.db;
  const tz = row.time_zone;
  const today = localDate(now, tz);
  if (period.to && period.to > today) {
    throw badRequest(`To: the period cannot end after today (${today} in the client’s time zone).`, { fields: [{ path: 'to', message: `Choose ${today} or earlier.` }] });
  }

  // The period: whole ISO weeks ending with this one, or the days asked for.
  const weekCount = period.from
    ? Math.round(DateTime.fromISO(isoWeekOf(period.to!, tz).monday).diff(DateTime.fromISO(isoWeekOf(period.from, tz).monday), 'weeks').weeks) + 1
    : (period.weeks ?? 12);
  const to = period.to ?? today;
  // Adherence is judged as it stood at the end of the period.
  const asOf = to < today ? new Date(DateTime.fromISO(addDays(to, 1), { zone: tz }).toMillis() - 1) : now;

  const h = await loadHistory(db, row);
  const { adherence, overview } = overviewOf(h, asOf, weekCount);
  const from = period.from ?? adherence.weeks[0].monday;
  const clinic = await db('clinics').where({ id: row.clinic_id }).first('name', 'time_zone', 'fes_efficiency_pct');
  const flags = await flagsWithHistory(db, row.id);
  const notes = await db('client_notes as n').join('users as u', 'u.id', 'n.author_id').orderBy('n.created_at', 'desc').select('n.*', 'u.name as author_name');
  const checks = await db('checks as c')
    .join('users as u', 'u.id', 'c.recorded_by')
    // A day either side, so the local-day filter in figures.ts decides at the edges.
    .whereBetween('c.taken_at', [DateTime.fromISO(addDays(from, -1), { zone: 'utc' }).toJSDate(), DateTime.fromISO(addDays(to, 2), { zone: 'utc' }).toJSDate()])
    .orderBy('c.taken_at', 'desc')
    .select('c.*', 'u.name as recorded_by_name');
  const versions = (await prescriptionVersions(db, row.id)).map(prescriptionView);
  const pauseRows: PauseRow[] = await db<PauseRow>('pauses').orderBy('starts_on', 'desc');

  const points = new Map(trendPointsOf(h).map((p) => [p.sessionId, p]));
  const sessions = h.sessions.map(({ row: r }) => ({
    id: r.id,
    startedAt: r.started_at.toISOString(),
    durationS: r.duration_s,
    activeS: r.active_s,
    meanPowerW: r.mean_power_w,
    peakPower5sW: r.peak_power_5s_w,
    workKj: r.work_kj,
    distanceM: r.distance_m,
    currentPerWattMaPerW: r.current_per_watt_ma_per_w,
    counted: points.get(r.id)?.counted ?? false,
    baselineW: points.get(r.id)?.baselineW ?? null,
  }));
  const client = clientView(row);
  const efficiencyPct = clinicEfficiencyPct(clinic.fes_efficiency_pct);
  const figures = reportFigures({
    timeZone: tz,
    from,
    to,
    today,
    sessions,
    weeks: adherence.weeks,
    prescriptions: versions,
    pauses: pauseRows.map((p) => pauseView(p, today)),
    flags,
    checks: checks.map((c: CheckRow & { recorded_by_name: string }) => checkView(c)),
    notes: notes.map((n) => ({ id: n.id as string, body: n.body as string, author: { name: n.author_name as string }, createdAt: (n.created_at as Date).toISOString() })),
    energy: { efficiencyPct, bodyMassKg: client.bodyMassKg, volitionalControl: row.volitional_control },
  });
  const all = riderSessions(h);
  return {
    client,
    clinic: { name: clinic.name as string, timeZone: clinic.time_zone as string },
    producedBy: ctx.viewer.name,
    producedAt: now.toISOString(),
    today,
    period: { from, to, weeks: period.from ? null : weekCount, days: DateTime.fromISO(to).diff(DateTime.fromISO(from), 'days').days + 1 },
    summary,
    prescription: { current: versions.find((v) => v.effectiveFrom <= to) ?? null, history: versions },
    programStart: client.programStart ?? programStartOf(h, today),
    adherence: { streakWeeks: adherence.streakWeeks, adherence4wPct: adherence.adherence4wPct },
    powerTrendWPerWeek: overview.powerTrendWPerWeek,
    countThresholdPct: h.thresholds.countThresholdPct,
    totals: {
      sessions: all.length,
      activeMinutes: Math.round(all.reduce((sum, x) => sum + x.activeS, 0) / 60),
      distanceM: Math.round(all.reduce((sum, x) => sum + (x.distanceM ?? 0), 0)),
    },
    figures,
  };
}
export type Report = Awaited<ReturnType<typeof loadReport>>;
