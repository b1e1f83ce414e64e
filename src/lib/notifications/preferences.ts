import { randomBytes } from 'node:crypto';
import { scope, type Db } from '../data';
import { z } from 'zod';
import type { RequestContext } from '../auth/context';
import type { NotificationPreferencesRow } from '../db/tables';

export const TOPICS = ['reminders', 'weekly_summary', 'daily_digest', 'urgent_alerts'] as const;
export type Topic = (typeof TOPICS)[number];

export const TOPIC_WORDS: Record<Topic, string> = {
  reminders: 'reminders when a session is due',
  weekly_summary: 'the weekly summary of your riding',
  daily_digest: 'the daily digest of flags',
  urgent_alerts: 'immediate alerts for urgent flags',
};

export const preferencesInputSchema = z.object({ reminders: z.boolean(), weeklySummary: z.boolean(), dailyDigest: z.boolean(), urgentAlerts: z.boolean() }).strict();

/** A user's e-mail choices; the row (and its unsubscribe token) is made on first use, everything on. */
export async function preferencesOf(knex: Db, userId: string): Promise<NotificationPreferencesRow> {
  const existing = await knex<NotificationPreferencesRow>('notification_preferences').where({ user_id: userId }).first();
  if (existing) return existing;
  await knex('notification_preferences').insert({ user_id: userId, unsubscribe_token: randomBytes(24).toString('base64url') }).onConflict('user_id').ignore();
  return (await knex<NotificationPreferencesRow>('notification_preferences').where({ user_id: userId }).first())!;
}

export function wants(p: NotificationPreferencesRow, topic: Topic): boolean {
  return p[topic];
}

function view(p: NotificationPreferencesRow, ctx: RequestContext) {
  const staff = ctx.viewer.memberships.length > 0;
  const rider = ctx.viewer.clientId !== null;
  return {
    reminders: p.reminders,
    weeklySummary: p.weekly_summary,
    dailyDigest: p.daily_digest,
    urgentAlerts: p.urgent_alerts,
    applicable: { reminders: rider || ctx.viewer.carerOf.length > 0, weeklySummary: rider, dailyDigest: staff, urgentAlerts: staff },
  };
}

export async function readPreferences(ctx: RequestContext) {
  return view(await preferencesOf(scope(ctx).own().db, ctx.viewer.userId), ctx);
}

export async function savePreferences(ctx: RequestContext, input: z.infer<typeof preferencesInputSchema>) {
  const own = scope(ctx).own().db;
  await preferencesOf(own, ctx.viewer.userId);
  const [row] = await own<NotificationPreferencesRow>('notification_preferences')
    .where({ user_id: ctx.viewer.userId })
    .update({ reminders: input.reminders, weekly_summary: input.weeklySummary, daily_digest: input.dailyDigest, urgent_alerts: input.urgentAlerts, updated_at: own.fn.now() as never })
    .returning('*');
  return view(row, ctx);
}

// Tokens are 24 random bytes in base64url; anything else in the link names no one.
const TOKEN = /^[A-Za-z0-9_-]{16,64}$/;

/** The unsubscribe link's action: works without signing in, with the token from the e-mail. */
export async function unsubscribe(knex: Db, token: string, topic: Topic): Promise<{ email: string } | null> {
  if (!TOKEN.test(token)) return null;
  const row = await knex('notification_preferences as p').join('users as u', 'u.id', 'p.user_id').where('p.unsubscribe_token', token).first('p.user_id', 'u.email');
  if (!row) return null;
  await knex('notification_preferences').where({ user_id: row.user_id }).update({ [topic]: false, updated_at: knex.fn.now() });
  await knex('audit_log').insert({ actor_user_id: row.user_id, action: 'notifications.unsubscribe', detail: JSON.stringify({ topic }) });
  return { email: row.email };
}

export async function tokenOwner(knex: Db, token: string) {
  if (!TOKEN.test(token)) return undefined;
  return knex('notification_preferences as p').join('users as u', 'u.id', 'p.user_id').where('p.unsubscribe_token', token).first('u.email', 'p.*');
}
