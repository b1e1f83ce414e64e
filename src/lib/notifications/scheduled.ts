// The e-mails that go out on a clock rather than on an event: the therapists'
// daily digest (from 07:00 clinic time), "a session is due" reminders (from
// 18:00 in the client's time zone, when none has arrived that day) and the
// rider's weekly summary (Monday from 08:00). The job runs every hour; dedupe
// keys make each go out once per day or week even when a run is missed or repeated.
import type { Knex } from 'knex';
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
import { isoWeekOf, localDate } from '../time/iso-week';
import { notificationEmail, type Recipient } from './compose';
import { riderAndCarers, riderOnly, therapistsOf } from './recipients';
import { FLAG_KIND_WORDS } from '../flags/words';
import { clearanceReviewLines } from '../care/care-status';

export const DIGEST_HOUR = 7;
export const REMINDER_HOUR = 18;
export const WEEKLY_HOUR = 8;

/**
 * Queues what is due at `now`, for every clinic or for the clinics named, and
 * says how many of each it queued (not counting those queued before).
 */
export async function sendScheduledEmails(
  knex: Knex,
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

async function digests(knex: Knex, clients: ClientRow[], now: Date): Promise<number> {
  const flags = await knex<FlagRow>('flags').whereIn('state', ['open', 'acknowledged']).orderBy('raised_at');
  const clinicZones = new Map((await knex('clinics').select('id', 'time_zone')).map((c) => [c.id, c.time_zone as string]));
  const byRecipient = new Map<string, { to: Recipient; date: string; lines: { fresh: boolean; text: string }[]; reviews: string[] }>();
  // Clearances falling due for review go into the same digest (issue 12).
  const reviews = await clearanceReviewLines(knex, clients, now);
  for (const client of clients) {
    const own = flags.filter((f) => f.client_id === client.id);
    const review = reviews.get(client.id);
    if (!own.length && !review) continue;
    const local = DateTime.fromJSDate(now).setZone(clinicZones.get(client.clinic_id) ?? 'UTC');
    if (local.hour < DIGEST_HOUR) continue;
    for (const to of await therapistsOf(knex, client, 'daily_digest')) {
      const entry = byRecipient.get(to.userId) ?? { to, date: local.toISODate()!, lines: [], reviews: [] };
      if (review) entry.reviews.push(review);
      for (const f of own) {
        const fresh = now.getTime() - f.raised_at.getTime() < 86_400_000;
        entry.lines.push({ fresh, text: `${client.display_name} — ${FLAG_KIND_WORDS[f.kind]} (${f.severity}${f.state === 'acknowledged' ? ', acknowledged' : ''}): ${f.reason}` });
      }
      byRecipient.set(to.userId, entry);
    }
  }
  let n = 0;
  for (const { to, date, lines, reviews: due } of byRecipient.values()) {
    const fresh = lines.filter((l) => l.fresh).map((l) => `New: ${l.text}`);
    const open = lines.filter((l) => !l.fresh).map((l) => `Still open: ${l.text}`);
    const reviewText = due.length ? `, ${due.length} clearance review${due.length === 1 ? '' : 's'}` : '';
    const id = await enqueueEmail(
      knex,
      notificationEmail(to, 'daily_digest', {
        kind: 'daily_digest',
        subject: `Kinloop: ${fresh.length} new and ${open.length} open flag${fresh.length + open.length === 1 ? '' : 's'}${reviewText} today`,
        paragraphs: [`Here are the flags for your clients on ${date}.`, ...fresh, ...open, ...due.map((r) => `Clearance: ${r}`)],
        action: { label: 'Open triage', url: `${config().publicUrl}/triage` },
        dedupeKey: `digest:${to.userId}:${date}`,
        caution: true,
      }),
    );
    if (id) n++;
  }
  return n;
}

async function reminders(knex: Knex, clients: ClientRow[], now: Date): Promise<number> {
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
    if (!reminderDue({ timeZone: client.time_zone, now, eveningHour: REMINDER_HOUR, nextDue: next.dueLocalDate, lastReminderSentAt: null, sessionsToday })) continue;
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

async function weeklySummaries(knex: Knex, clients: ClientRow[], now: Date): Promise<number> {
  let n = 0;
  const localOf = (c: ClientRow) => DateTime.fromJSDate(now).setZone(c.time_zone);
  const due = clients.filter((c) => c.user_id && localOf(c).weekday === 1 && localOf(c).hour >= WEEKLY_HOUR);
  for (const h of await loadHistories(knex, due)) {
    const client = h.client;
    const local = localOf(client);
    const recipients = await riderOnly(knex, client, 'weekly_summary');
    if (!recipients.length) continue;
    const adherence = computeAdherence({ timeZone: client.time_zone, now: now.toISOString(), prescriptions: h.prescriptions, pauses: h.pauses, sessions: h.sessions, countThresholdPct: h.thresholds.countThresholdPct, weeks: 2 });
    const week = adherence.weeks[0];
    const lastWeek = isoWeekOf(local.minus({ weeks: 1 }).toISODate()!, client.time_zone);
    const rides = h.sessions.filter((s) => {
      const d = localDate(s.startedAt, client.time_zone);
      return d >= lastWeek.monday && d <= lastWeek.sunday;
    });
    const km = rides.reduce((sum, r) => sum + (r.row.distance_m ?? 0), 0) / 1000;
    const minutes = Math.round(rides.reduce((sum, r) => sum + r.row.active_s, 0) / 60);
    const goal = await goalLine(knex, client);
    for (const to of recipients) {
      const id = await enqueueEmail(
        knex,
        notificationEmail(to, 'weekly_summary', {
          kind: 'weekly_summary',
          subject: `Your riding last week: ${rides.length} session${rides.length === 1 ? '' : 's'}`,
          paragraphs: [
            week.paused
              ? `Last week (${lastWeek.isoWeek}) your program was paused.`
              : `Last week (${lastWeek.isoWeek}) you rode ${rides.length} time${rides.length === 1 ? '' : 's'}${week.prescribed ? ` of the ${week.prescribed} planned` : ''}: ${minutes} active minutes and ${km.toFixed(1)} km.`,
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

async function goalLine(knex: Knex, client: ClientRow): Promise<string | null> {
  const g = await readGoalFor(knex, client);
  if (!g) return null;
  return g.progress.finished
    ? `You have reached the end of ${g.route.name}. Well done!`
    : `Distance goal, ${g.route.name}: ${(g.progress.travelledM / 1000).toFixed(1)} of ${(g.progress.totalM / 1000).toFixed(0)} km${g.progress.next ? `; next: ${g.progress.next.name} in ${(g.progress.next.remainingM / 1000).toFixed(1)} km` : ''}.`;
}
