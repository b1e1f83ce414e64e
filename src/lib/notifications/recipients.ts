import type { Db, Query } from '../data/db';
import type { ClientRow } from '../db/tables';
import type { Recipient } from './compose';
import { preferencesOf, type Topic } from './preferences';

type Staff = { id: string; email: string; name: string; role: string };

/**
 * What one run of the hourly mail has read already: each clinic's staff and
 * each user's preferences, read once per run rather than once per client
 * (a clinic of a thousand clients has forty therapists).
 */
export interface RecipientCache {
  staff: Map<string, Promise<Staff[]>>;
  preferences: Map<string, ReturnType<typeof preferencesOf>>;
}

export const recipientCache = (): RecipientCache => ({ staff: new Map(), preferences: new Map() });

function memo<T>(map: Map<string, Promise<T>> | undefined, key: string, read: () => Promise<T>): Promise<T> {
  if (!map) return read();
  let p = map.get(key);
  if (!p) {
    p = read();
    map.set(key, p);
  }
  return p;
}

async function withPreference(knex: Db, users: { id: string; email: string; name: string }[], topic: Topic, cache?: RecipientCache): Promise<Recipient[]> {
  const out: Recipient[] = [];
  for (const u of users) {
    const prefs = await memo(cache?.preferences, u.id, () => preferencesOf(knex, u.id));
    if (prefs[topic]) out.push({ userId: u.id, email: u.email, name: u.name, unsubscribeToken: prefs.unsubscribe_token });
  }
  return out;
}

const active = (q: Query) => q.whereNull('u.disabled_at').whereNotNull('u.password_hash');

/**
 * The therapists who look after a client: the primary therapist when the
 * client has one, else every therapist of the clinic (else its admins).
 */
export async function therapistsOf(knex: Db, client: Pick<ClientRow, 'clinic_id' | 'primary_therapist_id'>, topic: Topic, cache?: RecipientCache): Promise<Recipient[]> {
  const staff = await memo(cache?.staff, client.clinic_id, () =>
    knex('memberships as m').join('users as u', 'u.id', 'm.user_id').where('m.clinic_id', client.clinic_id).modify(active).select('u.id', 'u.email', 'u.name', 'm.role') as Promise<Staff[]>,
  );
  const primary = staff.filter((s) => s.id === client.primary_therapist_id);
  const therapists = staff.filter((s) => s.role === 'therapist');
  return withPreference(knex, primary.length ? primary : therapists.length ? therapists : staff, topic, cache);
}

/** The rider (when they have an account) and their active carers. */
export async function riderAndCarers(knex: Db, client: Pick<ClientRow, 'id' | 'user_id'>, topic: Topic, cache?: RecipientCache): Promise<Recipient[]> {
  const carers = await knex('carer_links as l').join('users as u', 'u.id', 'l.carer_user_id').where({ 'l.client_id': client.id, 'l.active': true }).modify(active).select('u.id', 'u.email', 'u.name');
  const self = client.user_id ? await knex('users as u').where('u.id', client.user_id).modify(active).select('u.id', 'u.email', 'u.name') : [];
  return withPreference(knex, [...self, ...carers], topic, cache);
}

export async function riderOnly(knex: Db, client: Pick<ClientRow, 'user_id'>, topic: Topic, cache?: RecipientCache): Promise<Recipient[]> {
  if (!client.user_id) return [];
  return withPreference(knex, await knex('users as u').where('u.id', client.user_id).modify(active).select('u.id', 'u.email', 'u.name'), topic, cache);
}
