import { randomUUID } from 'node:crypto';
import type { Knex } from 'knex';
import { hashPassword } from '../../src/lib/auth/password';
import { db } from '../../src/lib/db/knex';
import { Http } from './http';

export const PASSWORD = 'world-password-2026';
let hashed: Promise<string> | null = null;
const passwordHash = () => (hashed ??= hashPassword(PASSWORD));

export type Role = 'anonymous' | 'client' | 'carer' | 'therapist' | 'admin' | 'otherTherapist';
export const ROLES: Role[] = ['anonymous', 'client', 'carer', 'therapist', 'admin', 'otherTherapist'];

export interface WorldUser {
  id: string;
  email: string;
  name: string;
}

/**
 * Two clinics of a test's own, written straight to the database: clinic A with
 * an admin, a therapist, a client who has an account and that client's carer;
 * clinic B with a therapist who must never see clinic A's records.
 */
export interface World {
  tag: string;
  clinicId: string;
  otherClinicId: string;
  clientId: string;
  /** A second client of clinic A, without account or carer. */
  otherClientId: string;
  users: Record<Exclude<Role, 'anonymous'>, WorldUser>;
  knex: Knex;
  /** A signed-in HTTP client for a role (anonymous: no session). Cached per role. */
  as(role: Role): Promise<Http>;
  /** A new user in clinic A with the given staff role. */
  addStaff(role: 'admin' | 'therapist'): Promise<WorldUser>;
}

export async function createWorld(label = 'w'): Promise<World> {
  const knex = db();
  const tag = `${label}-${randomUUID().slice(0, 8)}`;
  const hash = await passwordHash();
  const user = async (key: string, name: string): Promise<WorldUser> => {
    const email = `${key}.${tag}@example.test`;
    const [row] = await knex('users').insert({ email, name, password_hash: hash }).returning('id');
    return { id: row.id, email, name };
  };
  const [clinic] = await knex('clinics').insert({ name: `Clinic A ${tag}`, time_zone: 'Europe/London' }).returning('id');
  const [other] = await knex('clinics').insert({ name: `Clinic B ${tag}`, time_zone: 'Europe/London' }).returning('id');
  const admin = await user('admin', 'Avery Admin');
  const therapist = await user('therapist', 'Theo Therapist');
  const otherTherapist = await user('other', 'Olive Elsewhere');
  const clientUser = await user('client', 'Cal Client');
  const carer = await user('carer', 'Cara Carer');
  await knex('memberships').insert([
    { user_id: admin.id, clinic_id: clinic.id, role: 'admin' },
    { user_id: therapist.id, clinic_id: clinic.id, role: 'therapist' },
    { user_id: otherTherapist.id, clinic_id: other.id, role: 'therapist' },
  ]);
  const [client] = await knex('clients')
    .insert({ clinic_id: clinic.id, display_name: 'Cal Client', diagnosis: 'sci', injury_level: 'T4', ais_grade: 'A', ad_risk: 'at_risk', time_zone: 'Europe/London', user_id: clientUser.id, primary_therapist_id: therapist.id, program_start: '2026-06-01' })
    .returning('id');
  const [otherClient] = await knex('clients')
    .insert({ clinic_id: clinic.id, display_name: 'Oona Second', diagnosis: 'ms', time_zone: 'Europe/London' })
    .returning('id');
  await knex('carer_links').insert({ carer_user_id: carer.id, client_id: client.id, relationship: 'partner' });
  const users = { admin, therapist, otherTherapist, client: clientUser, carer };
  const sessions = new Map<Role, Promise<Http>>();
  return {
    tag,
    clinicId: clinic.id,
    otherClinicId: other.id,
    clientId: client.id,
    otherClientId: otherClient.id,
    users,
    knex,
    as(role) {
      if (!sessions.has(role)) {
        sessions.set(role, role === 'anonymous' ? Promise.resolve(new Http()) : new Http().signIn(users[role].email, PASSWORD));
      }
      return sessions.get(role)!;
    },
    async addStaff(role) {
      const u = await user(`${role}-${randomUUID().slice(0, 6)}`, `Extra ${role}`);
      await knex('memberships').insert({ user_id: u.id, clinic_id: clinic.id, role });
      return u;
    },
  };
}

/** A fresh session for a role, for requests that end the session they use. */
export async function freshSession(world: World, role: Role): Promise<Http> {
  return role === 'anonymous' ? new Http() : new Http().signIn(world.users[role].email, PASSWORD);
}
