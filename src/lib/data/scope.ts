// The request-scoped data layer. `scope(ctx)` is the only way a request reads
// or writes: every table it hands out is already restricted to what the caller
// may see (visibility.ts), single records come through `client()` and
// `record()` with the access rules of auth/access.ts (404 for what the caller
// may not see, the same answer as for a missing record; 403 for actions beyond
// their role; every refusal audited), and each client a request reads is
// audited once. Changes go through a grant: `client()` and `clinic()` hand one
// out, restricted to that client or clinic, writable only as far as the need
// or role it was granted for.
import type { Knex } from 'knex';
import { audit, type AuditEntry } from '../audit/audit';
import { canManageClient, canReadClient, staffClinic, type AskedRecord, type ClientNeed } from '../auth/access';
import type { RequestContext } from '../auth/context';
import type { Viewer } from '../auth/viewer';
import { db as pool } from '../db/knex';
import type {
  AuditRow,
  CarerLinkRow,
  CheckRow,
  ClientNoteRow,
  ClientRow,
  ClinicRow,
  DeviceRow,
  DistanceGoalRow,
  FlagEventRow,
  FlagRow,
  ImportProfileRow,
  InvitationRow,
  MembershipRow,
  MonitoringEntryRow,
  PauseRow,
  PrescriptionRow,
  RideRow,
  StaffRole,
  UploadRow,
  UserRow,
} from '../db/tables';
import { forbidden, notFound } from '../http/errors';
import { lock, makeDb, type Db, type Query, type TablePolicy } from './db';
import { systemPolicy } from './system';
import { adminClinicIds, auditLogOf, CLIENT_TABLES, CLINIC_TABLES, peopleOnlyOf, READ_RULES } from './visibility';

const isUuid = (id: string) => /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(id);
const table = (name: string, alias?: string) => (alias ? `${name} as ${alias}` : name);

function readRule(t: string, holder: string) {
  const rule = READ_RULES[t];
  if (!rule) throw new Error(`${holder} may not read ${t}: it has no read rule in src/lib/data/visibility.ts.`);
  return rule;
}

/** Reads only, each table restricted by its rule. */
function readPolicy(viewer: Viewer): TablePolicy {
  const holder = 'A request';
  return {
    holder,
    restrict(t, alias, q, conn) {
      readRule(t, holder)(q, alias, conn, viewer);
      return true;
    },
    writes: () => 'read',
  };
}

const NEED_RANK: Record<ClientNeed, number> = { read: 0, contribute: 1, manage: 2 };

/** The need a change to a client's table asks for: riders and carers add ride files, checks and goals; the rest is the clinic's. */
const CLIENT_WRITE_NEED: Record<string, ClientNeed> = {
  uploads: 'contribute',
  checks: 'contribute',
  distance_goals: 'contribute',
  clients: 'manage',
  client_notes: 'manage',
  pauses: 'manage',
  prescriptions: 'manage',
  flags: 'manage',
  flag_events: 'manage',
  monitoring_entries: 'manage',
  invitations: 'manage',
  carer_links: 'manage',
};

/** A row for `table` that names `column` as `value`: filled in when absent, refused when it names another. */
function stamp(row: Record<string, unknown>, column: string, value: string, holder: string, t: string) {
  if (row[column] === undefined) return { ...row, [column]: value };
  if (row[column] !== value) throw new Error(`${holder} may not write a row of ${t} for another ${column.replace('_id', '')}.`);
  return row;
}

function clientPolicy(viewer: Viewer, client: ClientRow, need: ClientNeed): TablePolicy {
  const holder = `A ${need} grant on a client`;
  return {
    holder,
    restrict(t, a, q, conn) {
      readRule(t, holder)(q, a, conn, viewer);
      if (t === 'clients') q.where(`${a}.id`, client.id);
      else if (CLIENT_TABLES.has(t)) q.where(`${a}.client_id`, client.id);
      else if (t === 'ride_series') q.whereIn(`${a}.ride_id`, conn('rides').select('id').where('client_id', client.id));
      else if (t === 'flag_events') q.whereIn(`${a}.flag_id`, conn('flags').select('id').where('client_id', client.id));
      return true;
    },
    writes(t) {
      const asks = CLIENT_WRITE_NEED[t];
      if (!asks || NEED_RANK[need] < NEED_RANK[asks]) return 'read';
      if (t === 'clients') return { insert: () => forbiddenWrite(holder, t), change: true };
      // An event names its flag, which the grant's own query found.
      if (t === 'flag_events') return { insert: (row) => row, change: false };
      return {
        insert: (row) => {
          const own = stamp(row, 'client_id', client.id, holder, t);
          return CLINIC_TABLES.has(t) ? stamp(own, 'clinic_id', client.clinic_id, holder, t) : own;
        },
        change: true,
      };
    },
  };
}

const ROLE_RANK: Record<StaffRole, number> = { therapist: 0, admin: 1 };

/** The role a change to a clinic's table asks for. */
const CLINIC_WRITE_ROLE: Record<string, StaffRole> = {
  clinics: 'admin',
  import_profiles: 'admin',
  devices: 'admin',
  memberships: 'admin',
  users: 'admin',
  clients: 'therapist',
  invitations: 'therapist',
};

function forbiddenWrite(holder: string, t: string): never {
  throw new Error(`${holder} may not add rows to ${t}.`);
}

function clinicPolicy(viewer: Viewer, clinicId: string, role: StaffRole): TablePolicy {
  const holder = `A ${role} grant on a clinic`;
  return {
    holder,
    restrict(t, a, q, conn) {
      readRule(t, holder)(q, a, conn, viewer);
      if (t === 'clinics') q.where(`${a}.id`, clinicId);
      else if (CLINIC_TABLES.has(t)) q.where(`${a}.clinic_id`, clinicId);
      else if (CLIENT_TABLES.has(t)) q.whereIn(`${a}.client_id`, conn('clients').select('id').where('clinic_id', clinicId));
      else if (t === 'users') q.whereIn(`${a}.id`, conn('memberships').select('user_id').where('clinic_id', clinicId));
      return true;
    },
    writes(t) {
      const asks = CLINIC_WRITE_ROLE[t];
      if (!asks || ROLE_RANK[role] < ROLE_RANK[asks]) return 'read';
      if (t === 'clinics' || t === 'users') return { insert: () => forbiddenWrite(holder, t), change: true };
      return { insert: (row) => stamp(row, 'clinic_id', clinicId, holder, t), change: true };
    },
  };
}

/** The caller's own rows (notification settings, sign-in sessions): read and changed by them alone. */
function ownPolicy(viewer: Viewer): TablePolicy {
  const holder = 'A grant on the caller’s own settings';
  return {
    holder,
    restrict(t, a, q, conn) {
      readRule(t, holder)(q, a, conn, viewer);
      return true;
    },
    writes(t) {
      if (t === 'notification_preferences') return { insert: (row) => stamp(row, 'user_id', viewer.userId, holder, t), change: true };
      // Signing out ends one of the caller's sessions; sessions are made by signing in.
      if (t === 'auth_sessions') return { insert: () => forbiddenWrite(holder, t), change: true };
      return 'read';
    },
  };
}

/** What every grant can do besides its tables: a transaction, a lock, an audit entry in the same transaction, and the system's rights for a change's consequences. */
abstract class Grant<Self> {
  constructor(
    protected readonly scope: Scope,
    protected readonly conn: Knex,
  ) {}
  abstract readonly db: Db;
  protected abstract on(conn: Knex): Self;

  /** Runs `fn` in one transaction with this grant bound to it. */
  transaction<T>(fn: (tx: Self) => Promise<T>): Promise<T> {
    return this.conn.transaction((trx) => fn(this.on(trx))) as Promise<T>;
  }

  /** Holds `key` until this grant's transaction ends (see db.ts). */
  lock(key: string): Promise<void> {
    return lock(this.db, key);
  }

  /** An audit entry by the caller, in this grant's transaction when it has one. */
  audit(entry: ScopeAuditEntry): Promise<void> {
    return this.scope.audit(entry, this.conn);
  }

  /**
   * The whole database, on this grant's connection, for what a permitted
   * change sets off that the caller could not do or see themselves: the flag
   * a carer's check raises, the e-mail to the therapist, the sessions a
   * disabled account loses. `why` names it (it shows in errors and reviews).
   */
  system(why: string): Db {
    return makeDb(this.conn, systemPolicy(`The consequence "${why}"`));
  }
}

/** A client the caller was given `need` on: the row, and that client's tables. */
export class ClientGrant extends Grant<ClientGrant> {
  readonly db: Db;
  constructor(
    scope: Scope,
    conn: Knex,
    readonly row: ClientRow,
    readonly need: ClientNeed,
  ) {
    super(scope, conn);
    this.db = makeDb(conn, clientPolicy(scope.viewer, row, need));
  }
  get id() {
    return this.row.id;
  }
  get clinicId() {
    return this.row.clinic_id;
  }
  /** Whether the caller also manages this client (staff of its clinic). */
  get managed() {
    return canManageClient(this.scope.viewer, this.row);
  }
  protected on(conn: Knex) {
    return new ClientGrant(this.scope, conn, this.row, this.need);
  }
  /** An audit entry about this client (its clinic and id filled in). */
  override audit(entry: ScopeAuditEntry): Promise<void> {
    return super.audit({ clinicId: this.row.clinic_id, clientId: this.row.id, ...entry });
  }
}

/** A clinic where the caller holds `role`: its tables, writable as that role allows. */
export class ClinicGrant extends Grant<ClinicGrant> {
  readonly db: Db;
  constructor(
    scope: Scope,
    conn: Knex,
    readonly id: string,
    readonly role: StaffRole,
  ) {
    super(scope, conn);
    this.db = makeDb(conn, clinicPolicy(scope.viewer, id, role));
  }
  protected on(conn: Knex) {
    return new ClinicGrant(this.scope, conn, this.id, this.role);
  }
  /** The clinic's row. */
  clinic(): Promise<ClinicRow & { flag_thresholds: unknown }> {
    return this.db('clinics').first();
  }
  /** An audit entry about this clinic. */
  override audit(entry: ScopeAuditEntry): Promise<void> {
    return super.audit({ clinicId: this.id, ...entry });
  }
}

/** The caller's own settings and sessions. */
export class OwnGrant extends Grant<OwnGrant> {
  readonly db: Db;
  constructor(scope: Scope, conn: Knex) {
    super(scope, conn);
    this.db = makeDb(conn, ownPolicy(scope.viewer));
  }
  protected on(conn: Knex) {
    return new OwnGrant(this.scope, conn);
  }
}

export type ScopeAuditEntry = Omit<AuditEntry, 'actorUserId' | 'ip' | 'userAgent'>;

/** Records asked for by their own id: where they live and what a refusal calls them. */
const RECORDS = {
  session: { table: 'rides', what: 'That session' },
  upload: { table: 'uploads', what: 'That upload' },
  flag: { table: 'flags', what: 'That flag' },
} as const;
type RecordKind = keyof typeof RECORDS;
interface RecordRows {
  session: RideRow;
  upload: UploadRow;
  flag: FlagRow;
}

export class Scope {
  readonly viewer: Viewer;
  /** Every table, read only, each restricted to what the caller may see. */
  readonly db: Db;
  /** Clients whose read this request has audited already. */
  private readonly audited = new Set<string>();

  constructor(
    private readonly ctx: Pick<RequestContext, 'viewer' | 'ip' | 'userAgent'>,
    private readonly conn: Knex = pool(),
  ) {
    this.viewer = ctx.viewer;
    this.db = makeDb(conn, readPolicy(ctx.viewer));
  }

  // Lists: composable queries (join, aggregate, page), restricted already.
  clients = (alias?: string): Query<ClientRow> => this.db(table('clients', alias));
  sessions = (alias?: string): Query<RideRow> => this.db(table('rides', alias));
  series = (alias?: string): Query<{ ride_id: string; data: Buffer }> => this.db(table('ride_series', alias));
  uploads = (alias?: string): Query<UploadRow> => this.db(table('uploads', alias));
  flags = (alias?: string): Query<FlagRow> => this.db(table('flags', alias));
  flagEvents = (alias?: string): Query<FlagEventRow> => this.db(table('flag_events', alias));
  checks = (alias?: string): Query<CheckRow> => this.db(table('checks', alias));
  notes = (alias?: string): Query<ClientNoteRow> => this.db(table('client_notes', alias));
  pauses = (alias?: string): Query<PauseRow> => this.db(table('pauses', alias));
  prescriptions = (alias?: string): Query<PrescriptionRow> => this.db(table('prescriptions', alias));
  goals = (alias?: string): Query<DistanceGoalRow> => this.db(table('distance_goals', alias));
  carers = (alias?: string): Query<CarerLinkRow> => this.db(table('carer_links', alias));
  monitoring = (alias?: string): Query<MonitoringEntryRow> => this.db(table('monitoring_entries', alias));
  profiles = (alias?: string): Query<ImportProfileRow> => this.db(table('import_profiles', alias));
  devices = (alias?: string): Query<DeviceRow> => this.db(table('devices', alias));
  invitations = (alias?: string): Query<InvitationRow> => this.db(table('invitations', alias));
  /** Memberships of the caller's clinics (and the caller's own). */
  staff = (alias?: string): Query<MembershipRow> => this.db(table('memberships', alias));
  people = (alias?: string): Query<UserRow> => this.db(table('users', alias));
  clinics = (alias?: string): Query<ClinicRow> => this.db(table('clinics', alias));
  /** One clinic's audit log, for its admins (others: 403). */
  auditLog(clinicId: string | undefined, alias = 'audit_log'): { clinicId: string; query: Query<AuditRow> } {
    const id = staffClinic(this.viewer, ['admin'], clinicId);
    return { clinicId: id, query: auditLogOf(this.db(table('audit_log', alias)), alias, this.conn, [id]) };
  }

  /** The clinics the caller administers and the e-mail addresses of the people who belong to them alone (the dev mailbox's rule); 403 for anyone else. */
  async adminsPeople(): Promise<{ clinics: string[]; addresses: Set<string> }> {
    staffClinic(this.viewer, ['admin']);
    const clinics = adminClinicIds(this.viewer);
    const rows: { email: string }[] = await peopleOnlyOf(this.conn, clinics);
    return { clinics, addresses: new Set(rows.map((r) => r.email)) };
  }

  /**
   * A client the caller needs `need` on, or 404 (missing, or not theirs) /
   * 403 (theirs to read, not to change); refusals are audited. The first
   * access to a client in a request writes `action` to the audit log; later
   * ones in the same request are covered by it. `asked` is the record the
   * request named when it was not the client itself.
   */
  async client(
    clientId: string,
    need: ClientNeed,
    action: string,
    detail: Record<string, unknown> = {},
    asked: AskedRecord = { what: 'That client', type: 'client', id: clientId },
  ): Promise<ClientGrant> {
    const row = isUuid(clientId) ? await this.conn<ClientRow>('clients').where({ id: clientId }).whereNull('archived_at').first() : undefined;
    if (!row || !canReadClient(this.viewer, row)) {
      await this.refused(404, asked, need, action);
      throw notFound(asked.what);
    }
    if (need === 'manage' && !canManageClient(this.viewer, row)) {
      await this.refused(403, asked, need, action, row);
      throw forbidden();
    }
    if (!this.audited.has(row.id)) {
      await this.audit({ action, clinicId: row.clinic_id, clientId: row.id, detail });
      this.audited.add(row.id);
    }
    return new ClientGrant(this, this.conn, row, need);
  }

  /**
   * A client's record asked for by its own id (a session, an upload, a flag):
   * a missing record and one of a client the caller may not see answer the
   * same 404 with the same words, so ids cannot be probed for existence.
   */
  async record<K extends RecordKind>(
    kind: K,
    id: string,
    need: ClientNeed,
    action: string,
    detail: Record<string, unknown> = {},
  ): Promise<{ row: RecordRows[K]; client: ClientGrant }> {
    const spec = RECORDS[kind];
    const asked: AskedRecord = { what: spec.what, type: kind, id };
    const row = isUuid(id) ? await this.conn(spec.table).where({ id }).first() : undefined;
    if (!row) {
      await this.refused(404, asked, need, action);
      throw notFound(spec.what);
    }
    return { row, client: await this.client(row.client_id, need, action, detail, asked) };
  }

  /** A clinic where the caller holds one of `roles` (the one asked for, or their first); 403 otherwise. */
  clinic(roles: StaffRole[], clinicId?: string | null): ClinicGrant {
    const id = staffClinic(this.viewer, roles, clinicId);
    return new ClinicGrant(this, this.conn, id, this.viewer.memberships.find((m) => m.clinicId === id)!.role);
  }

  /** The caller's own settings and sessions. */
  own(): OwnGrant {
    return new OwnGrant(this, this.conn);
  }

  /** Appends to the audit log as the caller (on `conn`, a grant's transaction, when given). */
  async audit(entry: ScopeAuditEntry, conn: Knex = this.conn): Promise<void> {
    await audit(makeDb(conn, systemPolicy('The audit log')), { ...entry, actorUserId: this.viewer.userId, ip: this.ctx.ip, userAgent: this.ctx.userAgent });
  }

  /**
   * Records which clients a list (triage, caseload, client list) showed: one
   * entry per clinic, so each clinic's admins see what was shown of their own
   * clinic and nothing of another's. Filtering the log by a client finds them.
   */
  async listed(action: string, shown: { id: string; clinic_id: string }[]): Promise<void> {
    const byClinic = new Map<string, string[]>();
    for (const c of shown) byClinic.set(c.clinic_id, [...(byClinic.get(c.clinic_id) ?? []), c.id]);
    if (!byClinic.size) return this.audit({ action, detail: { count: 0, clientIds: [] } });
    for (const [clinicId, clientIds] of byClinic) await this.audit({ action, clinicId, detail: { count: clientIds.length, clientIds } });
  }

  /**
   * A refused request for a client's record leaves a trace. A record the
   * caller may not see (404) is logged without its clinic, so that no clinic's
   * admins learn of another clinic's records; the caller's own clinic sees that
   * they were refused. A role refusal (403) on a record they may see names it.
   */
  private refused(status: 403 | 404, asked: AskedRecord, need: ClientNeed, action: string, client?: ClientRow) {
    return this.audit({
      action: 'access.denied',
      clinicId: client?.clinic_id ?? null,
      clientId: client?.id ?? null,
      recordType: asked.type,
      recordId: asked.id,
      detail: { status, need, action },
    });
  }
}

const scopes = new WeakMap<RequestContext, Scope>();

/** The request's data layer: one per request context, so each client read is audited once however many services read it. */
export function scope(ctx: RequestContext): Scope {
  let s = scopes.get(ctx);
  if (!s) scopes.set(ctx, (s = new Scope(ctx)));
  return s;
}
