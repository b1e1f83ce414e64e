import type { Db, Query } from '../data/db';
import { DateTime } from 'luxon';
import { hashPassword } from '../auth/password';
import { DEMO_CARERS, DEMO_CLIENTS, DEMO_CLINIC, DEMO_STAFF } from './scenario';
import { seedDemoRides } from './seed-rides';

export interface SeedOptions {
  password: string;
  /** The seed's "today"; the scenario's dates are relative to it. */
  now?: Date;
}

export interface SeededIds {
  clinicId: string;
  users: Record<string, string>;
  clients: Record<string, string>;
}

/** Seeds the demo scenario (people, then six months of rides) into an empty database; null when it already has a clinic. */
export async function seedDemoIfEmpty(knex: Db, options: SeedOptions): Promise<(SeededIds & { files: number; flags: number }) | null> {
  const existing = await knex('clinics').first('id');
  if (existing) return null;
  const now = options.now ?? new Date();
  const ids = await seedDemoPeople(knex, { ...options, now });
  return { ...ids, ...(await seedDemoRides(knex, ids, now)) };
}

export async function seedDemoPeople(knex: Db, { password, now = new Date() }: SeedOptions): Promise<SeededIds> {
  const passwordHash = await hashPassword(password);
  return knex.transaction(async (trx) => {
    const [clinic] = await trx('clinics').insert({ name: DEMO_CLINIC.name, time_zone: DEMO_CLINIC.timeZone }).returning('id');
    const users: Record<string, string> = {};
    const addUser = async (key: string, email: string, name: string) => {
      const [u] = await trx('users').insert({ email, name, password_hash: passwordHash }).returning('id');
      users[key] = u.id;
    };
    for (const s of DEMO_STAFF) {
      await addUser(s.key, s.email, s.name);
      await trx('memberships').insert({ user_id: users[s.key], clinic_id: clinic.id, role: s.role });
    }
    const clients: Record<string, string> = {};
    for (const c of DEMO_CLIENTS) {
      if (c.account) await addUser(c.key, c.account.email, c.name);
      const [row] = await trx('clients')
        .insert({
          clinic_id: clinic.id,
          display_name: c.name,
          date_of_birth: c.dateOfBirth,
          diagnosis: c.diagnosis,
          injury_level: c.injuryLevel,
          ais_grade: c.aisGrade,
          ad_risk: c.adRisk,
          time_zone: c.timeZone,
          body_mass_kg: c.bodyMassKg,
          volitional_control: c.volitionalControl,
          program_start: DateTime.fromJSDate(now).setZone(c.timeZone).minus({ days: c.startedDaysAgo }).toISODate(),
          user_id: c.account ? users[c.key] : null,
          primary_therapist_id: users[c.therapist],
        })
        .returning('id');
      clients[c.key] = row.id;
    }
    for (const carer of DEMO_CARERS) {
      await addUser(carer.key, carer.email, carer.name);
      for (const link of carer.links) {
        await trx('carer_links').insert({ carer_user_id: users[carer.key], client_id: clients[link.client], relationship: link.relationship });
      }
    }
    return { clinicId: clinic.id, users, clients };
  });
}
