// What a signed-in caller may read of each table, as conditions on a query.
// One rule per table, written once: PRODUCT.md's "a therapist or admin sees
// only the clinic(s) they belong to; a carer sees only linked clients; a
// client sees only themself", with the clinic's own records (notes, flags,
// monitoring time) for its staff only. A table without a rule here cannot be
// read in a request at all, so a new table needs one before any page shows it.
import type { Knex } from 'knex';
import type { Viewer } from '../auth/viewer';
import type { Query } from './db';

/** An id no row has: `IN ()` of nothing, spelt so that PostgreSQL can plan it. */
const NONE = '00000000-0000-0000-0000-000000000000';
const some = (ids: string[]) => (ids.length ? ids : [NONE]);

export const staffClinicIds = (v: Viewer) => v.memberships.map((m) => m.clinicId);
export const adminClinicIds = (v: Viewer) => v.memberships.filter((m) => m.role === 'admin').map((m) => m.clinicId);
const linkedClientIds = (v: Viewer) => [...v.carerOf, ...(v.clientId ? [v.clientId] : [])];

/** Conditions on a query of `clients` under `alias`: the clients the caller may read (staff of the clinic, an active carer, the client). */
export function readableClients(q: Query, alias: string, v: Viewer): Query {
  const clinics = staffClinicIds(v);
  const linked = linkedClientIds(v);
  return q.whereNull(`${alias}.archived_at`).where((w) => {
    w.whereIn(`${alias}.clinic_id`, some(clinics));
    if (linked.length) w.orWhereIn(`${alias}.id`, linked);
  });
}

/** The ids of the clients the caller may read, as a subquery. */
export const readableClientIds = (k: Knex, v: Viewer) => readableClients(k('clients as rc').select('rc.id'), 'rc', v);

/** The ids of the clients whose program the caller manages: their clinic's, for its staff. */
export const managedClientIds = (k: Knex, v: Viewer) => k('clients as mc').select('mc.id').whereNull('mc.archived_at').whereIn('mc.clinic_id', some(staffClinicIds(v)));

/** Clinics the caller works in, or whose client they care for or are. */
const clinicsInView = (k: Knex, v: Viewer) => k('clients as vc').select('vc.clinic_id').whereIn('vc.id', readableClientIds(k, v));

/** The people of a clinic: its staff, the carers of its clients and its clients with an account. */
export function peopleOf(k: Knex, clinicIds: string[]) {
  const ids = some(clinicIds);
  return k('memberships')
    .select('user_id')
    .whereIn('clinic_id', ids)
    .union((u) => u.select('carer_user_id').from('carer_links').join('clients', 'clients.id', 'carer_links.client_id').whereIn('clients.clinic_id', ids))
    .union((u) => u.select('user_id').from('clients').whereIn('clinic_id', ids).whereNotNull('user_id'));
}

/**
 * The lower-cased e-mail addresses of the people who belong to `clinicIds`
 * and to no other clinic: staff, clients with an account, and the clients'
 * active carers. Someone who also belongs elsewhere is left out (a reset link
 * of theirs would open that clinic too). It reads every clinic's memberships
 * to decide, and returns only people of `clinicIds`.
 */
export function peopleOnlyOf(k: Knex, clinicIds: string[]) {
  return k
    .with('belongs', (b) =>
      b
        .select('user_id', 'clinic_id')
        .from('memberships')
        .union((u) => u.select('user_id', 'clinic_id').from('clients').whereNotNull('user_id').whereNull('archived_at'))
        .union((u) =>
          u
            .select('l.carer_user_id as user_id', 'c.clinic_id')
            .from('carer_links as l')
            .join('clients as c', 'c.id', 'l.client_id')
            .where('l.active', true)
            .whereNull('c.archived_at'),
        ),
    )
    .from('users as u')
    .join('belongs as b', 'b.user_id', 'u.id')
    .groupBy('u.id', 'u.email')
    .havingRaw('bool_and(b.clinic_id = ANY(?::uuid[]))', [clinicIds])
    .select(k.raw('lower(u.email) as email'));
}

/**
 * A clinic's audit log as its admins see it: its own entries, and entries
 * without a clinic (sign-ins, refused requests) made by its people.
 */
export function auditLogOf(q: Query, alias: string, k: Knex, clinicIds: string[]): Query {
  return q.where((w) =>
    w.whereIn(`${alias}.clinic_id`, some(clinicIds)).orWhere((x) => x.whereNull(`${alias}.clinic_id`).whereIn(`${alias}.actor_user_id`, peopleOf(k, clinicIds))),
  );
}

type Rule = (q: Query, alias: string, k: Knex, v: Viewer) => void;

const ofReadableClient: Rule = (q, a, k, v) => void q.where((w) => w.whereIn(`${a}.client_id`, readableClientIds(k, v)));
const ofManagedClient: Rule = (q, a, k, v) => void q.where((w) => w.whereIn(`${a}.client_id`, managedClientIds(k, v)));
const ofStaffClinic: Rule = (q, a, _k, v) => void q.where((w) => w.whereIn(`${a}.clinic_id`, some(staffClinicIds(v))));
const ownRow: Rule = (q, a, _k, v) => void q.where((w) => w.where(`${a}.user_id`, v.userId));

/** The read rule of every table a request may read. */
export const READ_RULES: Record<string, Rule> = {
  clients: (q, a, _k, v) => void q.where((w) => readableClients(w, a, v)),
  // A client's own records: whoever may read the client.
  rides: ofReadableClient,
  uploads: ofReadableClient,
  checks: ofReadableClient,
  pauses: ofReadableClient,
  prescriptions: ofReadableClient,
  distance_goals: ofReadableClient,
  carer_links: ofReadableClient,
  // The rider's own dysreflexia plan and the thread with the clinic: the rider, active carers and staff.
  ad_plans: ofReadableClient,
  messages: ofReadableClient,
  message_reads: ofReadableClient,
  // The stored weeks of a client's program (adherence-store.ts): figures whoever may read the client sees.
  adherence_state: ofReadableClient,
  adherence_weeks: ofReadableClient,
  ride_series: (q, a, k, v) => void q.where((w) => w.whereIn(`${a}.ride_id`, k('rides').select('id').whereIn('client_id', readableClientIds(k, v)))),
  // The clinic's records about a client: its staff only.
  client_notes: ofManagedClient,
  flags: ofManagedClient,
  // Screening, the physician's clearance and proposals for the therapist: the clinic's record.
  screening_versions: ofManagedClient,
  clearances: ofManagedClient,
  progression_proposals: ofManagedClient,
  // Its staff's time: the month's totals keep the time spent on a client who has left since.
  monitoring_entries: ofStaffClinic,
  flag_events: (q, a, k, v) => void q.where((w) => w.whereIn(`${a}.flag_id`, k('flags').select('id').whereIn('client_id', managedClientIds(k, v)))),
  // Clinics: where the caller works, or whose client they care for or are.
  clinics: (q, a, k, v) => void q.where((w) => w.whereIn(`${a}.id`, some(staffClinicIds(v))).orWhereIn(`${a}.id`, clinicsInView(k, v))),
  import_profiles: (q, a, k, v) => void q.where((w) => w.whereIn(`${a}.clinic_id`, some(staffClinicIds(v))).orWhereIn(`${a}.clinic_id`, clinicsInView(k, v))),
  devices: ofStaffClinic,
  invitations: ofStaffClinic,
  // People: colleagues, and those connected to a client the caller may read.
  memberships: (q, a, _k, v) => void q.where((w) => w.whereIn(`${a}.clinic_id`, some(staffClinicIds(v))).orWhere(`${a}.user_id`, v.userId)),
  users: (q, a, k, v) =>
    void q.where((w) =>
      w
        .where(`${a}.id`, v.userId)
        .orWhereIn(`${a}.id`, k('memberships').select('user_id').whereIn('clinic_id', some(staffClinicIds(v))))
        .orWhereIn(`${a}.id`, k('carer_links').select('carer_user_id').where('active', true).whereIn('client_id', readableClientIds(k, v)))
        .orWhereIn(`${a}.id`, readableClients(k('clients as uc').select('uc.user_id').whereNotNull('uc.user_id'), 'uc', v)),
    ),
  // The caller's own settings and sign-ins.
  notification_preferences: ownRow,
  auth_sessions: ownRow,
  // The audit log: admins, for their clinics.
  audit_log: (q, a, k, v) => void auditLogOf(q, a, k, adminClinicIds(v)),
};

/** Tables with a client's id, and those that also carry its clinic's. */
export const CLIENT_TABLES = new Set([
  'rides',
  'uploads',
  'checks',
  'pauses',
  'prescriptions',
  'distance_goals',
  'carer_links',
  'client_notes',
  'flags',
  'monitoring_entries',
  'invitations',
  'screening_versions',
  'clearances',
  'ad_plans',
  'progression_proposals',
  'messages',
  'message_reads',
  'adherence_state',
  'adherence_weeks',
]);
export const CLINIC_TABLES = new Set([
  'clients',
  'rides',
  'uploads',
  'checks',
  'flags',
  'monitoring_entries',
  'import_profiles',
  'devices',
  'invitations',
  'memberships',
  'screening_versions',
  'clearances',
  'ad_plans',
  'progression_proposals',
  'messages',
]);
