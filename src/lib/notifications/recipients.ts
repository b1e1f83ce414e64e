import type { Db, Query } from '../data/db';
import type { ClientRow } from '../db/tables';
import type { Recipient } from './compose';
import { preferencesOf, type Topic } from './preferences';

async function withPreference(knex: Db, users: { id: string; email: string; name: string }[], topic: Topic): Promise<Recipient[]> {
  const out: Recipient[] = [];
  for (const u of users) {
    const prefs = await preferencesOf(knex, u.id);
    if (prefs[topic]) out.push({ userId: u.id, email: u.email, name: u.name, unsubscribeToken: prefs.unsubscribe_token });
  }
  return out;
}

const active = (q: Query) => q.whereNull('u.disabled_at').whereNotNull('u.password_hash');

/**
 * The therapists who look after a client: the primary therapist when the
 * client has one, else every therapist of the clinic (else its admins).
 */
export async function therapistsOf(knex: Db, client: Pick<ClientRow, 'clinic_id' | 'primary_therapist_id'>, topic: Topic): Promise<Recipient[]> {
  const staff: { id: string; email: string; name: string; role: string }[] = await knex('memberships as m').join('users as u', 'u.id', 'm.user_id').where('m.clinic_id', client.clinic_id).modify(active).select('u.id', 'u.email', 'u.name', 'm.role');
  const primary = staff.filter((s) => s.id === client.primary_therapist_id);
  const therapists = staff.filter((s) => s.role === 'therapist');
  return withPreference(knex, primary.length ? primary : therapists.length ? therapists : staff, topic);
}

/** The rider (when they have an account) and their active carers. */
export async function riderAndCarers(knex: Db, client: Pick<ClientRow, 'id' | 'user_id'>, topic: Topic): Promise<Recipient[]> {
  const carers = await knex('carer_links as l').join('users as u', 'u.id', 'l.carer_user_id').where({ 'l.client_id': client.id, 'l.active': true }).modify(active).select('u.id', 'u.email', 'u.name');
  const self = client.user_id ? await knex('users as u').where('u.id', client.user_id).modify(active).select('u.id', 'u.email', 'u.name') : [];
  return withPreference(knex, [...self, ...carers], topic);
}

export async function riderOnly(knex: Db, client: Pick<ClientRow, 'user_id'>, topic: Topic): Promise<Recipient[]> {
  if (!client.user_id) return [];
  return withPreference(knex, await knex('users as u').where('u.id', client.user_id).modify(active).select('u.id', 'u.email', 'u.name'), topic);
}
