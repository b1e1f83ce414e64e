import { z } from 'zod';
import { auditListed, type RequestContext } from '../auth/context';
import type { ClientRow, FlagRow } from '../db/tables';
import { forbidden } from '../http/errors';
import { FLAG_KINDS, FLAG_SEVERITIES } from '../flags';
import { line } from '../validation/fields';
import { flagView, type FlagView } from './flags';
import { filterRows, flagCounts } from './list-filter';
import { figuresOf, type ClientOverview } from './overview';

const severityRank = (s: FlagRow['severity']) => FLAG_SEVERITIES.indexOf(s);

export const CASELOAD_SORTS = ['flags', 'client', 'lastSession', 'adherence', 'streak', 'powerTrend'] as const;
export type CaseloadSort = (typeof CASELOAD_SORTS)[number];

/** A page of triage or the caseload: who, narrowed how, in which order. */
export const caseloadQuerySchema = z
  .object({
    limit: z.coerce.number({ message: 'limit: a whole number from 1 to 200.' }).int('limit: a whole number from 1 to 200.').min(1).max(200).default(50),
    offset: z.coerce.number({ message: 'offset: a whole number from 0.' }).int('offset: a whole number from 0.').min(0).max(1_000_000).default(0),
    q: line(z.string().max(100, 'Search: at most 100 characters.'), 'Search').default(''),
    kind: z.enum(['', ...FLAG_KINDS]).default(''),
    severity: z.enum(['', ...FLAG_SEVERITIES]).default(''),
    sort: z.enum(CASELOAD_SORTS).optional(),
    desc: z.enum(['0', '1', 'false', 'true']).default('0'),
  })
  .strict();
export type CaseloadQuery = z.infer<typeof caseloadQuerySchema>;

export interface CaseloadRow extends ClientOverview {
  clientId: string;
  clientName: string;
  /** Open, not snoozed; most severe first, then the oldest. */
  flags: FlagView[];
}

export interface CaseloadPage {
  clients: CaseloadRow[];
  /** Clients that match the search and filters. */
  total: number;
  offset: number;
  limit: number;
  /** The offset of the next page, or null on the last. */
  nextOffset: number | null;
  /** Before any search or filter: every client listed, their open flags, and those flags by kind and severity (the filter menus). */
  all: { clients: number; flags: number; byKind: Record<string, number>; bySeverity: Record<string, number> };
}

type FlagKey = Pick<FlagRow, 'id' | 'client_id' | 'kind' | 'severity' | 'raised_at'>;

interface Candidate {
  client: Pick<ClientRow, 'id' | 'clinic_id' | 'display_name' | 'time_zone'>;
  clientName: string;
  flags: FlagKey[];
}

const byUrgency = (a: FlagKey, b: FlagKey) => severityRank(a.severity) - severityRank(b.severity) || a.raised_at.getTime() - b.raised_at.getTime();

/** Most severe first, then the longest waiting; clients without flags last (as the table sorts them). */
function compareFlags(a: Candidate, b: Candidate): number {
  const [fa, fb] = [a.flags[0], b.flags[0]];
  if (!fa || !fb) return (fa ? 0 : 1) - (fb ? 0 : 1);
  return byUrgency(fa, fb);
}

// One collator for every comparison: String#localeCompare builds one per call.
const names = new Intl.Collator();
const byName = (a: Candidate, b: Candidate) => names.compare(a.client.display_name, b.client.display_name) || (a.client.id < b.client.id ? -1 : a.client.id > b.client.id ? 1 : 0);

/** Open flags that are not snoozed: what triage lists. */
const openFlags = (ctx: RequestContext, clinics: string[]) =>
  ctx.knex<FlagRow>('flags')
    .whereIn('clinic_id', clinics)
    .where({ state: 'open' })
    .where((q) => q.whereNull('snoozed_until').orWhere('snoozed_until', '<', ctx.knex.raw('current_date')));

/**
 * Orders by a figure; clients without it come where the table puts them:
 * never-ridden first for the last session (the longest since), last for the
 * others whatever the direction.
 */
function byFigure(figure: (c: ClientOverview) => number | string | null, nullsFirst: boolean, desc: boolean) {
  return (a: ClientOverview, b: ClientOverview) => {
    const [x, y] = [figure(a), figure(b)];
    if (x === null || y === null) {
      if (x === y) return 0;
      const nullFirst = x === null ? -1 : 1;
      return nullsFirst ? (desc ? -nullFirst : nullFirst) : -nullFirst;
    }
    const c = x < y ? -1 : x > y ? 1 : 0;
    return desc ? -c : c;
  };
}

const FIGURE_SORTS: Record<Exclude<CaseloadSort, 'flags' | 'client'>, { figure: (c: ClientOverview) => number | string | null; nullsFirst: boolean }> = {
  lastSession: { figure: (c) => c.lastSessionAt, nullsFirst: true },
  adherence: { figure: (c) => c.adherence4wPct, nullsFirst: false },
  streak: { figure: (c) => c.streakWeeks, nullsFirst: false },
  powerTrend: { figure: (c) => c.powerTrendWPerWeek, nullsFirst: false },
};

/**
 * The staff caseload: every client of the caller's clinics with their open
 * flags (open, not snoozed), last session, 4-week adherence, streak and power
 * trend, a page at a time. Triage is the same rows limited to clients with
 * open flags, most severe and oldest first. Searching, filtering and ordering
 * by name or flags read only the clients and their open flags; the figures
 * are worked out for the page shown (for every match only when the order is
 * by a figure), from the stored weeks (adherence-store.ts).
 */
export async function caseload(ctx: RequestContext, { onlyFlagged }: { onlyFlagged: boolean }, query: CaseloadQuery = caseloadQuerySchema.parse({})): Promise<CaseloadPage> {
  const clinics = ctx.viewer.memberships.map((m) => m.clinicId);
  if (!clinics.length) throw forbidden('Triage and the caseload are for clinic staff.');
  const now = new Date();
  // What ordering and filtering need of every open flag; the rest only for the page shown.
  const flags: FlagKey[] = await openFlags(ctx, clinics).select('id', 'client_id', 'kind', 'severity', 'raised_at');
  const flagsOf = new Map<string, FlagKey[]>();
  for (const f of flags) {
    const list = flagsOf.get(f.client_id);
    if (list) list.push(f);
    else flagsOf.set(f.client_id, [f]);
  }
  const clients: Candidate['client'][] = await ctx.knex<ClientRow>('clients')
    .whereIn('clinic_id', clinics)
    .whereNull('archived_at')
    .modify((q) => {
      if (onlyFlagged) q.whereIn('id', openFlags(ctx, clinics).distinct('client_id'));
    })
    .select('id', 'clinic_id', 'display_name', 'time_zone');
  const listed: Candidate[] = clients.map((client) => ({ client, clientName: client.display_name, flags: (flagsOf.get(client.id) ?? []).sort(byUrgency) }));
  const counts = flagCounts(listed);
  const all = {
    clients: listed.length,
    flags: listed.reduce((n, c) => n + c.flags.length, 0),
    byKind: Object.fromEntries(counts.kind),
    bySeverity: Object.fromEntries(counts.severity),
  };
  const matching = filterRows(listed, { search: query.q, kind: query.kind, severity: query.severity });

  const sort = query.sort ?? (onlyFlagged ? 'flags' : 'client');
  const desc = query.desc === '1' || query.desc === 'true';
  let figures = new Map<string, ClientOverview>();
  if (sort === 'flags' || sort === 'client') {
    const compare = sort === 'flags' ? (a: Candidate, b: Candidate) => compareFlags(a, b) || byName(a, b) : byName;
    matching.sort((a, b) => (desc ? -compare(a, b) : compare(a, b)));
  } else {
    figures = await figuresOf(ctx.knex, matching.map((c) => c.client), now);
    const { figure, nullsFirst } = FIGURE_SORTS[sort];
    const compare = byFigure(figure, nullsFirst, desc);
    matching.sort((a, b) => compare(figures.get(a.client.id)!, figures.get(b.client.id)!) || byName(a, b));
  }

  const page = matching.slice(query.offset, query.offset + query.limit);
  const missing = page.filter((c) => !figures.has(c.client.id)).map((c) => c.client);
  if (missing.length) for (const [id, f] of await figuresOf(ctx.knex, missing, now)) figures.set(id, f);
  const shownFlags = page.flatMap((c) => c.flags.map((f) => f.id));
  const full = new Map((shownFlags.length ? await ctx.knex<FlagRow>('flags').whereIn('id', shownFlags) : []).map((f) => [f.id, f]));
  await auditListed(ctx, onlyFlagged ? 'triage.view' : 'caseload.view', page.map((c) => c.client));
  const next = query.offset + page.length;
  return {
    clients: page.map((c) => ({ clientId: c.client.id, clientName: c.client.display_name, flags: c.flags.map((f) => flagView(full.get(f.id)!)), ...figures.get(c.client.id)! })),
    total: matching.length,
    offset: query.offset,
    limit: query.limit,
    nextOffset: next < matching.length ? next : null,
    all,
  };
}

/** Every client of the caller's clinics by name, with how many open flags each has: the list the reports page links from (no figures). */
export async function caseloadNames(ctx: RequestContext): Promise<{ clientId: string; clientName: string; openFlags: number }[]> {
  const clinics = ctx.viewer.memberships.map((m) => m.clinicId);
  if (!clinics.length) throw forbidden('Triage and the caseload are for clinic staff.');
  const rows: (Pick<ClientRow, 'id' | 'clinic_id' | 'display_name'> & { open_flags: string })[] = await ctx.knex('clients as c')
    .whereIn('c.clinic_id', clinics)
    .whereNull('c.archived_at')
    .select('c.id', 'c.clinic_id', 'c.display_name')
    .select(
      ctx.knex.raw(`(SELECT count(*) FROM flags f WHERE f.client_id = c.id AND f.state = 'open' AND (f.snoozed_until IS NULL OR f.snoozed_until < current_date)) AS open_flags`),
    );
  rows.sort((a, b) => names.compare(a.display_name, b.display_name) || (a.id < b.id ? -1 : 1));
  await auditListed(ctx, 'caseload.view', rows);
  return rows.map((r) => ({ clientId: r.id, clientName: r.display_name, openFlags: Number(r.open_flags) }));
}
