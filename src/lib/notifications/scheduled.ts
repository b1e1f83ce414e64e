// The e-mails that go out on a clock rather than on an event: the therapists'
// daily digest (from 07:00 clinic time), "a session is due" reminders (from
// 18:00 in the client's time zone, when none has arrived that day) and the
// rider's weekly summary (Monday from 08:00). The job runs every hour; dedupe
// keys make each go out once per day or week even when a run is missed or repeated.
import type { Db, Query } from '../data/db';
import { DateTime } from 'luxon';
import { computeAdherence, prescriptionTimeline } from '../adherence';
import { config } from '../config';
import type { ClientRow, FlagRow } from '../db/tables';
import { enqueueEmail } from '../mail/outbox';
import { nextSessionDue } from '../rider/next-session';
import { reminderDue } from '../rider/reminder';
import { readGoalFor } from '../riders/goal-progress';
import { riderPauses } from '../riders/sessions';
import { loadHistories } from '../supervision/history';
import { isoWeekOf } from '../time/iso-week';
import { localDate } from '../time/local-date';
import { notificationEmail, type Recipient } from './compose';
import { riderAndCarers, riderOnly, therapistsOf } from './recipients';
import { FLAG_KIND_WORDS } from '../flags/words';
import { clearanceReviewLines } from '../care/care-status';
import { flagReason } from '../flags/reason';
import { count, distance } from '../format/numbers';
import { FALLBACK_LOCALE, formatDate, weekOf } from '../time/format';
import { clinicLocale } from '../time/locale';

export const DIGEST_HOUR = 7;
export const REMINDER_HOUR = 18;
export const WEEKLY_HOUR = 8;

/**
 * Queues what is due at `now`, for every clinic or for the clinics named, and
 * says how many of each it queued (not counting those queued before).
 */
export async function sendScheduledEmails(
  knex: Db,
  now = new Date(),
  only: { clinicIds?: string[] } = {},
): Promise<{ digests: number; reminders: number; weekly: number }> {
  const clients = await knex<ClientRow>('clients')
    .whereNull('archived_at')
    .modify((q) => {
      if (only.clinicIds) q.whereIn('clinic_id', only.clinicIds);
    });
  return { digests: await digests(knex, clients, now), reminders: await reminders(knex, clients, now), weekly: await weeklySummaries(knex, clients, now) };
}

async function digests(knex: Db, clients: ClientRow[], now: Date): Promise<number> {
  const flags = await knex<FlagRow>('flags').whereIn('state', ['open', 'acknowledged']).orderBy('raised_at');
  const clinics = new Map((await knex('clinics').select('id', 'time_zone', 'locale')).map((c) => [c.id as string, c as { time_zone: string; locale: string | null }]));
  const byRecipient = new Map<string, { to: Recipient; date: string; locale: string; lines: { fresh: boolean; text: string }[]; reviews: string[] }>();
  // Clearances falling due for review go into the same digest (issue 12).
  const reviews = await clearanceReviewLines(knex, clients, now, (c) => {
    const clinic = clinics.get(c.clinic_id);
    return clinic ? clinicLocale(clinic) : FALLBACK_LOCALE;
  });
  for (const client of clients) {
    const own = flags.filter((f) => f.client_id === client.id);
    const review = reviews.get(client.id);
    if (!own.length && !review) continue;
    const clinic = clinics.get(client.clinic_id);
    const local = DateTime.fromJSDate(now).setZone(clinic?.time_zone ?? 'UTC');
    if (local.hour < DIGEST_HOUR) continue;
    const locale = clinic ? clinicLocale(clinic) : FALLBACK_LOCALE;
    for (const to of await therapistsOf(knex, client, 'daily_digest')) {
      const entry = byRecipient.get(to.userId) ?? { to, date: local.toISODate()!, locale, lines: [], reviews: [] };
      if (review) entry.reviews.push(review);
      for (const f of own) {
        const fresh = now.getTime() - f.raised_at.getTime() < 86_400_000;
        entry.lines.push({ fresh, text: `${client.display_name} — ${FLAG_KIND_WORDS[f.kind]} (${f.severity}${f.state === 'acknowledged' ? ', acknowledged' : ''}): ${flagReason(f, locale)}` });
      }
      byRecipient.set(to.userId, entry);
    }
  }
  let n = 0;
  for (const { to, date, locale, lines, reviews: due } of byRecipient.values()) {
    const fresh = lines.filter((l) => l.fresh).map((l) => `New: ${l.text}`);
    const open = lines.filter((l) => !l.fresh).map((l) => `Still open: ${l.text}`);
    const reviewText = due.length ? `, ${due.length} clearance review${due.length === 1 ? '' : 's'}` : '';
    const id = await enqueueEmail(
      knex,
      notificationEmail(to, 'daily_digest', {
        kind: 'daily_digest',
        subject: `Kinloop: ${fresh.length} new and ${open.length} open flag${fresh.length + open.length === 1 ? '' : 's'}${reviewText} today`,
        paragraphs: [`Here are the flags for your clients on ${formatDate(date, locale, 'dayLong')}.`, ...fresh, ...open, ...due.map((r) => `Clearance: ${r}`)],
        action: { label: 'Open triage', url: `${config().publicUrl}/triage` },
        dedupeKey: `digest:${to.userId}:${date}`,
        caution: true,
      }),
    );
    if (id) n++;
  }
  return n;
}

async function reminders(knex: Db, clients: ClientRow[], now: Date): Promise<number> {
  let n = 0;
  const localOf = (c: ClientRow) => DateTime.fromJSDate(now).setZone(c.time_zone);
  for (const h of await loadHistories(knex, clients.filter((c) => localOf(c).hour >= REMINDER_HOUR))) {
    const client = h.client;
    const today = localOf(client).toISODate()!;
    const version = prescriptionTimeline(h.prescriptions).versionOn(today);
    if (!version) continue;
    const adherence = computeAdherence({ timeZone: client.time_zone, now: now.toISOString(), prescriptions: h.prescriptions, pauses: h.pauses, sessions: h.sessions, countThresholdPct: h.thresholds.countThresholdPct, weeks: 1 });
    const last = h.sessions[h.sessions.length - 1];
    const next = nextSessionDue({ timeZone: client.time_zone, now, sessionsPerWeek: version.sessionsPerWeek, countedThisWeek: adherence.weeks[0].counted, lastSessionAt: last?.startedAt ?? null, pauses: riderPauses(h) });
    const sessionsToday = h.sessions.filter((s) => localDate(s.startedAt, client.time_zone) === today).length;
    if (!reminderDue({ timeZone: client.time_zone, now, eveningHour: REMINDER_HOUR, nextDue: next.dueLocalDate, sessionsToday })) continue;
    for (const to of await riderAndCarers(knex, client, 'reminders')) {
      const self = to.userId === client.user_id;
      const id = await enqueueEmail(
        knex,
        notificationEmail(to, 'reminders', {
          kind: 'reminder',
          subject: self ? 'A ride is due today' : `A ride is due today for ${client.display_name}`,
          paragraphs: [
            self ? 'Your program has a ride planned for today, and Kinloop has not received one yet.' : `${client.display_name}'s program has a ride planned for today, and Kinloop has not received one yet.`,
            'If the ride happened, upload its file; if today does not suit, that is fine — the next ride will be planned around it.',
          ],
          action: { label: 'Upload a ride file', url: `${config().publicUrl}/upload?clientId=${client.id}` },
          dedupeKey: `reminder:${to.userId}:${client.id}:${today}`,
        }),
      );
      if (id) n++;
    }
  }
  return n;
}

async function weeklySummaries(knex: Db, clients: ClientRow[], now: Date): Promise<number> {
  let n = 0;
  const localOf = (c: ClientRow) => DateTime.fromJSDate(now).setZone(c.time_zone);
  const due = clients.filter((c) => c.user_id && localOf(c).weekday === 1 && localOf(c).hour >= WEEKLY_HOUR);
  for (const h of await loadHistories(knex, due)) {
    const client = h.client;
    const local = localOf(client);
    const recipients = await riderOnly(knex, client, 'weekly_summary');
    if (!recipients.length) continue;
    const adherence = computeAdherence({ timeZone: client.time_zone, now: now.toISOString(), prescriptions: h.prescriptions, pauses: h.pauses, sessions: h.sessions, countThresholdPct: h.thresholds.countThresholdPct, weeks: 2 });
    const thisWeek = adherence.weeks[0];
    const lastWeek = isoWeekOf(local.minus({ weeks: 1 }).toISODate()!, client.time_zone);
    const rides = h.sessions.filter((s) => {
      const d = localDate(s.startedAt, client.time_zone);
      return d >= lastWeek.monday && d <= lastWeek.sunday;
    });
    const metres = rides.reduce((sum, r) => sum + (r.row.distance_m ?? 0), 0);
    const minutes = Math.round(rides.reduce((sum, r) => sum + r.row.active_s, 0) / 60);
    const locale = await localeOf(knex, client);
    const week = weekOf(lastWeek.monday, locale);
    const goal = await goalLine(knex, client, locale);
    for (const to of recipients) {
      const id = await enqueueEmail(
        knex,
        notificationEmail(to, 'weekly_summary', {
          kind: 'weekly_summary',
          subject: `Your riding last week: ${rides.length} session${rides.length === 1 ? '' : 's'}`,
          paragraphs: [
            thisWeek.paused
              ? `Last week (${week}) your program was paused.`
              : `Last week (${week}) you did ${count(rides.length, 'session')}${thisWeek.prescribed ? ` of the ${thisWeek.prescribed} planned` : ''}: ${minutes} active minutes and ${distance(metres, locale)}.`,
            `Your streak: ${adherence.streakWeeks} week${adherence.streakWeeks === 1 ? '' : 's'}.`,
            ...(goal ? [goal] : []),
          ],
          action: { label: 'See your progress', url: `${config().publicUrl}/progress` },
          dedupeKey: `weekly:${to.userId}:${lastWeek.isoWeek}`,
        }),
      );
      if (id) n++;
    }
  }
  return n;
}

async function goalLine(knex: Db, client: ClientRow, locale: string): Promise<string | null> {
  const g = await readGoalFor(knex, client);
  if (!g) return null;
  return g.progress.finished
    ? `You have reached the end of ${g.route.name}. Well done!`
    : `Distance goal, ${g.route.name}: ${distance(g.progress.travelledM, locale)} of ${distance(g.progress.totalM, locale)}${g.progress.next ? `; next: ${g.progress.next.name} in ${distance(g.progress.next.remainingM, locale)}` : ''}.`;
}

async function localeOf(knex: Db, client: ClientRow): Promise<string> {
  const clinic = await knex('clinics').where({ id: client.clinic_id }).first('time_zone', 'locale');
  return clinic ? clinicLocale(clinic) : FALLBACK_LOCALE;
}
