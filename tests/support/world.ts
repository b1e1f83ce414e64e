import { randomUUID } from 'node:crypto';
import type { Knex } from 'knex';
import { hashPassword } from '../../src/lib/auth/password';
import { db } from '../../src/lib/db/knex';
import { Http } from './http';

export const PASSWORD = 'world-password-2026';
let hashed: Promise<string> | null = null;
const passwordHash = () => (hashed ??= hashPassword(PASSWORD));

export type Role = 'anonymous' | 'client' | 'carer' | 'therapist' | 'admin' | 'otherTherapist' | 'otherAdmin';
export const ROLES: Role[] = ['anonymous', 'client', 'carer', 'therapist', 'admin', 'otherTherapist', 'otherAdmin'];
const CLINIC_A: Role[] = ['client', 'carer', 'therapist', 'admin'];
const CLINIC_B: Role[] = ['otherTherapist', 'otherAdmin'];

/**
 * Text that must never reach a caller outside `seenBy` (ids, names, e-mail
 * addresses, notes): the authorization tests look for every one of them in
 * every answer. Records a new test adds to the world can be added here.
 */
export interface Secret {
  text: string;
  what: string;
  seenBy: Role[];
}

export interface WorldUser {
  id: string;
  email: string;
  name: string;
}

/**
 * Two clinics of a test's own, written straight to the database: clinic A with
 * an admin, a therapist, a client who has an account and that client's carer,
 * and a second client with a carer of her own; clinic B with an admin, a
 * therapist and a client with records of every kind. Nobody of one clinic may
 * see the other's records, and the first client and carer must not see the
 * second client's.
 */
export interface World {
  tag: string;
  clinicId: string;
  otherClinicId: string;
  clientId: string;
  /** A second client of clinic A, without account; her carer is `secondCarer`. */
  otherClientId: string;
  /** A client of clinic B, with a session, note, check, flag, pause and prescription. */
  otherClinicClientId: string;
  otherClinicSessionId: string;
  /** The carer of the second client of clinic A (not a role of the matrix). */
  secondCarer: WorldUser;
  users: Record<Exclude<Role, 'anonymous'>, WorldUser>;
  /** What each caller must never see; see `Secret`. */
  secrets: Secret[];
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
  const otherAdmin = await user('farclinic', `Bram Farclinic ${tag}`);
  const clientUser = await user('client', 'Cal Client');
  const carer = await user('carer', 'Cara Carer');
  const secondCarer = await user('sibling', `Dilys Secondcarer ${tag}`);
  await knex('memberships').insert([
    { user_id: admin.id, clinic_id: clinic.id, role: 'admin' },
    { user_id: therapist.id, clinic_id: clinic.id, role: 'therapist' },
    { user_id: otherTherapist.id, clinic_id: other.id, role: 'therapist' },
    { user_id: otherAdmin.id, clinic_id: other.id, role: 'admin' },
  ]);
  const [client] = await knex('clients')
    .insert({ clinic_id: clinic.id, display_name: 'Cal Client', diagnosis: 'sci', injury_level: 'T4', ais_grade: 'A', ad_risk: 'at_risk', time_zone: 'Europe/London', user_id: clientUser.id, primary_therapist_id: therapist.id, program_start: '2026-06-01' })
    .returning('id');
  const [otherClient] = await knex('clients')
    .insert({ clinic_id: clinic.id, display_name: 'Oona Second', diagnosis: 'ms', time_zone: 'Europe/London' })
    .returning('id');
  await knex('carer_links').insert([
    { carer_user_id: carer.id, client_id: client.id, relationship: 'partner' },
    { carer_user_id: secondCarer.id, client_id: otherClient.id, relationship: 'sister' },
  ]);
  const secondMessage = `Message to Oona ${tag}`;
  await knex('messages').insert({ clinic_id: clinic.id, client_id: otherClient.id, author_id: therapist.id, body: secondMessage });
  const staffNote = `Staff-only note on Cal ${tag}`;
  await knex('client_notes').insert({ client_id: client.id, author_id: therapist.id, body: staffNote });
  const b = await otherClinicRecords(knex, tag, other.id, otherTherapist.id);
  const users = { admin, therapist, otherTherapist, otherAdmin, client: clientUser, carer };
  const person = (u: WorldUser, seenBy: Role[]): Secret[] => [
    { text: u.id, what: `${u.name}'s id`, seenBy },
    { text: u.email, what: `${u.name}'s e-mail`, seenBy },
  ];
  const secrets: Secret[] = [
    // Clinic A, never for clinic B.
    { text: clinic.id, what: 'clinic A id', seenBy: CLINIC_A },
    { text: `Clinic A ${tag}`, what: 'clinic A name', seenBy: CLINIC_A },
    { text: client.id, what: 'client id', seenBy: CLINIC_A },
    { text: 'Cal Client', what: 'client name', seenBy: CLINIC_A },
    ...[admin, therapist, clientUser, carer].flatMap((u) => person(u, CLINIC_A)),
    // The second client of clinic A and her carer: staff of A only.
    { text: otherClient.id, what: 'second client id', seenBy: ['therapist', 'admin'] },
    { text: 'Oona Second', what: 'second client name', seenBy: ['therapist', 'admin'] },
    ...person(secondCarer, ['therapist', 'admin']),
    { text: secondCarer.name, what: 'second carer name', seenBy: ['therapist', 'admin'] },
    { text: staffNote, what: 'staff note', seenBy: ['therapist', 'admin'] },
    { text: secondMessage, what: 'second client message', seenBy: ['therapist', 'admin'] },
    // Clinic B, never for clinic A.
    { text: other.id, what: 'clinic B id', seenBy: CLINIC_B },
    { text: `Clinic B ${tag}`, what: 'clinic B name', seenBy: CLINIC_B },
    ...[otherTherapist, otherAdmin].flatMap((u) => person(u, CLINIC_B)),
    { text: otherAdmin.name, what: 'clinic B admin name', seenBy: CLINIC_B },
    ...b.secrets.map((x) => ({ ...x, seenBy: CLINIC_B })),
  ];
  const sessions = new Map<Role, Promise<Http>>();
  return {
    tag,
    clinicId: clinic.id,
    otherClinicId: other.id,
    clientId: client.id,
    otherClientId: otherClient.id,
    otherClinicClientId: b.clientId,
    otherClinicSessionId: b.sessionId,
    secondCarer,
    users,
    secrets,
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

/**
 * The secrets of the world that `role` must not see and that `body` holds,
 * described. Text the caller sent themselves (`sent`, e.g. the address they
 * asked for) is theirs already and not counted.
 */
export function leaks(world: World, role: Role, body: string, sent = ''): string[] {
  return world.secrets.filter((s) => !s.seenBy.includes(role) && body.includes(s.text) && !sent.includes(s.text)).map((s) => `${s.what} (${s.text})`);
}

/** A fresh session for a role, for requests that end the session they use. */
export async function freshSession(world: World, role: Role): Promise<Http> {
  return role === 'anonymous' ? new Http() : new Http().signIn(world.users[role].email, PASSWORD);
}

/** Clinic B's client with one record of every kind, each with text found nowhere else. */
async function otherClinicRecords(knex: Knex, tag: string, clinicId: string, therapistId: string) {
  const mark = (what: string) => `${what} Quillfeather ${tag}`;
  const [client] = await knex('clients')
    .insert({ clinic_id: clinicId, display_name: mark('Zephyrine'), diagnosis: 'stroke', time_zone: 'Europe/Paris', primary_therapist_id: therapistId })
    .returning('id');
  const [upload] = await knex('uploads')
    .insert({ client_id: client.id, clinic_id: clinicId, uploaded_by: therapistId, original_name: `${mark('ride')}.csv`, byte_size: 10, sha256: randomUUID(), storage_key: `world/${randomUUID()}`, status: 'accepted' })
    .returning('id');
  const [ride] = await knex('rides')
    .insert({ client_id: client.id, clinic_id: clinicId, upload_id: upload.id, started_at: new Date('2026-03-03T10:00:00Z'), started_at_source: 'file', duration_s: 1800, active_s: 1500, passive_s: 200, cooldown_s: 100, samples: 1800 })
    .returning('id');
  await knex('uploads').where({ id: upload.id }).update({ ride_id: ride.id });
  const [note] = await knex('client_notes').insert({ client_id: client.id, author_id: therapistId, body: mark('Note') }).returning('id');
  const [check] = await knex('checks')
    .insert({ client_id: client.id, clinic_id: clinicId, recorded_by: therapistId, taken_at: new Date(), comment: mark('Check comment'), evaluation: '{}' })
    .returning('id');
  const [flag] = await knex('flags')
    .insert({ client_id: client.id, clinic_id: clinicId, kind: 'skin_concern', severity: 'review', state: 'resolved', anchor: randomUUID(), reason: mark('Flag reason'), evidence: '{}' })
    .returning('id');
  const [pause] = await knex('pauses').insert({ client_id: client.id, starts_on: '2030-02-01', ends_on: '2030-02-05', reason: mark('Pause'), created_by: therapistId }).returning('id');
  await knex('prescriptions').insert({ client_id: client.id, version: 1, effective_from: '2026-01-05', sessions_per_week: 3, minutes_per_session: 30, notes: mark('Prescription'), created_by: therapistId });
  // Care records (issue 12): a screening, a clearance, the rider's plan, a progression proposal and a message.
  const [screening] = await knex('screening_versions')
    .insert({ clinic_id: clinicId, client_id: client.id, version: 1, items: JSON.stringify([{ id: 'epilepsy', status: 'concern', note: mark('Screening note') }]), assessed_on: '2026-01-02', assessed_by: therapistId })
    .returning('id');
  const [clearance] = await knex('clearances')
    .insert({ clinic_id: clinicId, client_id: client.id, storage_key: `world/${randomUUID()}`, sha256: randomUUID(), byte_size: 10, content_type: 'application/pdf', original_name: `${mark('clearance')}.pdf`, cleared_on: '2026-01-03', clinician: mark('Dr'), review_on: '2027-01-03', uploaded_by: therapistId })
    .returning('id');
  const [plan] = await knex('ad_plans')
    .insert({ clinic_id: clinicId, client_id: client.id, version: 1, signs: mark('Plan signs'), first_steps: mark('Plan steps'), who_to_call: mark('Plan call'), contacts: JSON.stringify([{ name: mark('Contact'), relationship: null, phone: '+33 1 23 45 67 89' }]), created_by: therapistId })
    .returning('id');
  const [rx] = await knex('prescriptions').where({ client_id: client.id }).select('id');
  const [proposal] = await knex('progression_proposals')
    .insert({ clinic_id: clinicId, client_id: client.id, prescription_id: rx.id, iso_week: '2026-W02', proposed: JSON.stringify({ minutesPerSession: 35 }), evidence: JSON.stringify({ note: mark('Evidence') }) })
    .returning('id');
  const [message] = await knex('messages').insert({ clinic_id: clinicId, client_id: client.id, author_id: therapistId, body: mark('Message') }).returning('id');
  const [device] = await knex('devices').insert({ clinic_id: clinicId, serial: mark('SN') }).returning('id');
  const [profile] = await knex('import_profiles').insert({ clinic_id: clinicId, name: mark('Profile'), mapping: JSON.stringify({ name: 'p', columns: { Zeit: { field: 'time' } } }) }).returning('id');
  const [invitation] = await knex('invitations')
    .insert({ email: `invitee.${tag}@elsewhere.test`, role: 'therapist', clinic_id: clinicId, token_hash: randomUUID(), invited_by: therapistId, expires_at: new Date(Date.now() + 86_400_000) })
    .returning('id');
  const ids: [string, string][] = [
    ['clinic B client id', client.id],
    ['clinic B upload id', upload.id],
    ['clinic B session id', ride.id],
    ['clinic B note id', note.id],
    ['clinic B check id', check.id],
    ['clinic B flag id', flag.id],
    ['clinic B pause id', pause.id],
    ['clinic B device id', device.id],
    ['clinic B profile id', profile.id],
    ['clinic B invitation id', invitation.id],
    ['clinic B invitee', `invitee.${tag}@elsewhere.test`],
    ['clinic B screening id', screening.id],
    ['clinic B clearance id', clearance.id],
    ['clinic B plan id', plan.id],
    ['clinic B proposal id', proposal.id],
    ['clinic B message id', message.id],
  ];
  return {
    clientId: client.id as string,
    sessionId: ride.id as string,
    // Every distinctive text contains the mark; the ids are listed one by one.
    secrets: [{ text: `Quillfeather ${tag}`, what: 'clinic B record text' }, ...ids.map(([what, text]) => ({ what, text }))],
  };
}
