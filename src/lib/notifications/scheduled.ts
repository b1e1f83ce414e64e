// The e-mails that go out on a clock rather than on an event: the therapists'
// daily digest (from 07:00 clinic time), "a session is due" reminders (from
// 18:00 in the client's time zone, when none has arrived that day) and the
// rider's weekly summary (Monday from 08:00). The job runs every hour; dedupe
// keys make each go out once per day or week even when a run is missed or repeated.
import type { Db, Query } from '../data/db';
import { DateTime } from 'luxon';
import { prescriptionTimeline } from '../adherence';
import { config } from '../config';
import type { ClientRow, FlagRow, RideRow } from '../db/tables';
import { enqueueEmail } from '../mail/outbox';
import { nextSessionDue } from '../rider/next-session';
import { reminderDue } from '../rider/reminder';
import { readGoalFor } from '../riders/goal-progress';
import { readClients } from '../supervision/adherence-store';
import { isoWeekOf } from '../time/iso-week';
import { localDate } from '../time/local-date';
import { notificationEmail, type Recipient } from './compose';
import { recipientCache, riderAndCarers, riderOnly, therapistsOf, type RecipientCache } from './recipients';
import { FLAG_KIND_WORDS } from '../flags/words';
import { clearanceReviewLines } from '../care/care-status';
import { flagReason } from '../flags/reason';
import { count, distance } from '../format/numbers';
import { FALLBACK_LOCALE, formatDate, weekOf } from '../time/format';
import { clinicLocale } from '../time/locale';

export const DIGEST_HOUR = 7;
export const REMINDER_HOUR = 18;
export const WEEKLY_HOUR = 8;

// Clients are read a page at a time, and for each page only what the mail
// needs: the stored weeks (adherence-store.ts), the sessions of this week
// and last, the last session. A run's memory does not grow with the
// installation, nor its reads with anyone's history.
const PAGE = 200;

/**
 * Queues what is due at `now`, for every clinic or for the clinics named, and
 * says how many of each it queued (not counting those queued before).
 */
export async function sendScheduledEmails(
  knex: Db,
  now = new Date(),
  only: { clinicIds?: string[] } = {},
): Promise<{ digests: number; reminders: number; weekly: number }> {
  const cache = recipientCache();
  const clinics: Clinics = new Map((await knex('clinics').select('id', 'time_zone', 'locale')).map((c) => [c.id as string, c as ClinicZone]));
  const lines: DigestLines = new Map();
  let reminders = 0;
  let weekly = 0;
  let after = '00000000-0000-0000-0000-000000000000';
  for (;;) {
    const clients: ClientRow[] = await knex<ClientRow>('clients')
      .whereNull('archived_at')
      .where('id', '>', after)
      .modify((q) => {
        if (only.clinicIds) q.whereIn('clinic_id', only.clinicIds);
      })
      .orderBy('id')
      .limit(PAGE);
    if (!clients.length) break;
    after = clients[clients.length - 1].id;
    await digestLines(knex, clients, now, clinics, lines, cache);
    reminders += await remindersFor(knex, clients, now, cache);
    weekly += await weeklySummaries(knex, clients, now, clinics, cache);
  }
  return { digests: await sendDigests(knex, lines), reminders, weekly };
}

/** The hour and weekday of `now` in each zone, worked out once per zone. */
function wallClocks(now: Date) {
  const zones = new Map<string, DateTime>();
  return (zone: string) => {
    let local = zones.get(zone);
    if (!local) zones.set(zone, (local = DateTime.fromJSDate(now).setZone(zone)));
    return local;
  };
}

type ClinicZone = { time_zone: string; locale: string | null };
type Clinics = Map<string, ClinicZone>;

type DigestLines = Map<string, { to: Recipient; date: string; locale: string; lines: { fresh: boolean; text: string }[]; reviews: string[] }>;

async function digestLines(knex: Db, clients: ClientRow[], now: Date, clinics: Clinics, byRecipient: DigestLines, cache: RecipientCache): Promise<void> {
  const flags = await knex<FlagRow>('flags').whereIn('client_id', clients.map((c) => c.id)).whereIn('state', ['open', 'acknowledged']).orderBy('raised_at');
  const clock = wallClocks(now);
  // Clearances falling due for review go into the same digest.
  const reviews = await clearanceReviewLines(knex, clients, now, (c) => {
    const clinic = clinics.get(c.clinic_id);
    return clinic ? clinicLocale(clinic) : FALLBACK_LOCALE;
  });
  for (const client of clients) {
    const own = flags.filter((f) => f.client_id === client.id);
    const review = reviews.get(client.id);
    if (!own.length && !review) continue;
    const clinic = clinics.get(client.clinic_id);
    const local = clock(clinic?.time_zone ?? 'UTC');
    if (local.hour < DIGEST_HOUR) continue;
    const locale = clinic ? clinicLocale(clinic) : FALLBACK_LOCALE;
    for (const to of await therapistsOf(knex, client, 'daily_digest', cache)) {
      const entry = byRecipient.get(to.userId) ?? { to, date: local.toISODate()!, locale, lines: [], reviews: [] };
      if (review) entry.reviews.push(review);
      for (const f of own) {
        const fresh = now.getTime() - f.raised_at.getTime() < 86_400_000;
        entry.lines.push({ fresh, text: `${client.display_name} — ${FLAG_KIND_WORDS[f.kind]} (${f.severity}${f.state === 'acknowledged' ? ', acknowledged' : ''}): ${flagReason(f, locale)}` });
      }
      byRecipient.set(to.userId, entry);
    }
  }
}

async function sendDigests(knex: Db, byRecipient: DigestLines): Promise<number> {
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

/** The sessions of the clients since `from`, each with its local date, oldest first. */
async function sessionsSince(knex: Db, clients: ClientRow[], from: Date) {
  const zone = new Map(clients.map((c) => [c.id, c.time_zone]));
  const rows: Pick<RideRow, 'client_id' | 'started_at' | 'active_s' | 'distance_m'>[] = clients.length
    ? await knex<RideRow>('rides').whereIn('client_id', [...zone.keys()]).where('started_at', '>=', from).orderBy('started_at').select('client_id', 'started_at', 'active_s', 'distance_m')
    : [];
  const out = new Map<string, { localDate: string; activeS: number; distanceM: number | null }[]>();
  for (const r of rows) {
    const list = out.get(r.client_id) ?? [];
    list.push({ localDate: localDate(r.started_at, zone.get(r.client_id)!), activeS: r.active_s, distanceM: r.distance_m });
    out.set(r.client_id, list);
  }
  return out;
}

// A local day is at most 26 hours after the instant it began, in any zone: two days back holds all of today.
const TWO_DAYS_MS = 2 * 86_400_000;

async function remindersFor(knex: Db, clients: ClientRow[], now: Date, cache: RecipientCache): Promise<number> {
  let n = 0;
  const clock = wallClocks(now);
  const due = clients.filter((c) => clock(c.time_zone).hour >= REMINDER_HOUR);
  if (!due.length) return 0;
  const read = await readClients(knex, due, now, 1);
  const recent = await sessionsSince(knex, due, new Date(now.getTime() - TWO_DAYS_MS));
  for (const client of due) {
    const r = read.get(client.id)!;
    const today = clock(client.time_zone).toISODate()!;
    const version = prescriptionTimeline(r.prescriptions).versionOn(today);
    if (!version) continue;
    const next = nextSessionDue({
      timeZone: client.time_zone,
      now,
      sessionsPerWeek: version.sessionsPerWeek,
      countedThisWeek: r.adherence.weeks[0].counted,
      lastSessionAt: r.lastSessionAt,
      pauses: r.pauses.map((p) => ({ start: p.from, end: p.to })),
    });
    const sessionsToday = (recent.get(client.id) ?? []).filter((s) => s.localDate === today).length;
    if (!reminderDue({ timeZone: client.time_zone, now, eveningHour: REMINDER_HOUR, nextDue: next.dueLocalDate, sessionsToday })) continue;
    for (const to of await riderAndCarers(knex, client, 'reminders', cache)) {
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

// Last week's Monday is at most 15 days before now, in any zone.
const FIFTEEN_DAYS_MS = 15 * 86_400_000;

async function weeklySummaries(knex: Db, clients: ClientRow[], now: Date, clinics: Clinics, cache: RecipientCache): Promise<number> {
  let n = 0;
  const clock = wallClocks(now);
  const due = clients.filter((c) => c.user_id && clock(c.time_zone).weekday === 1 && clock(c.time_zone).hour >= WEEKLY_HOUR);
  if (!due.length) return 0;
  const read = await readClients(knex, due, now, 2);
  const recent = await sessionsSince(knex, due, new Date(now.getTime() - FIFTEEN_DAYS_MS));
  for (const client of due) {
    const local = clock(client.time_zone);
    const recipients = await riderOnly(knex, client, 'weekly_summary', cache);
    if (!recipients.length) continue;
    const adherence = read.get(client.id)!.adherence;
    const thisWeek = adherence.weeks[0];
    const lastWeek = isoWeekOf(local.minus({ weeks: 1 }).toISODate()!, client.time_zone);
    const rides = (recent.get(client.id) ?? []).filter((s) => s.localDate >= lastWeek.monday && s.localDate <= lastWeek.sunday);
    const metres = rides.reduce((sum, r) => sum + (r.distanceM ?? 0), 0);
    const minutes = Math.round(rides.reduce((sum, r) => sum + r.activeS, 0) / 60);
    const clinic = clinics.get(client.clinic_id);
    const locale = clinic ? clinicLocale(clinic) : FALLBACK_LOCALE;
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
