import type { Knex } from 'knex';
import { z } from 'zod';
import { auditListed, type RequestContext } from '../auth/context';
import type { ClientRow, FlagRow } from '../db/tables';
import { forbidden } from '../http/errors';
import { FLAG_KINDS, FLAG_SEVERITIES } from '../flags';
import { byNameSql, whereNameHasWords } from '../db/name-search';
import { line } from '../validation/fields';
import { flagView, type FlagView } from './flags';
import { figuresOf, type ClientOverview } from './overview';

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

/** A flag's place in the order triage takes, most urgent first: by severity (FLAG_SEVERITIES). */
export function flagRank(f: Pick<FlagRow, 'kind' | 'severity'>): number {
  return FLAG_SEVERITIES.indexOf(f.severity);
}
// The same rank in SQL, for ordering the whole list in PostgreSQL; the
// caseload-pages integration test holds the two to the same order.
const FLAG_RANK_SQL = `array_position(ARRAY[${FLAG_SEVERITIES.map((s) => `'${s}'`).join(', ')}]::text[], f.severity) - 1`;

const byUrgency = (a: FlagRow, b: FlagRow) => flagRank(a) - flagRank(b) || a.raised_at.getTime() - b.raised_at.getTime();

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

/** Open flags that are not snoozed, of listed clients: what triage shows. */
function openFlags(knex: Knex, clinics: string[]) {
  return knex<FlagRow>('flags as f')
    .join('clients as c', 'c.id', 'f.client_id')
    .whereIn('f.clinic_id', clinics)
    .where('f.state', 'open')
    .whereNull('c.archived_at')
    .where((q) => q.whereNull('f.snoozed_until').orWhere('f.snoozed_until', '<', knex.raw('current_date')));
}

type Listed = Pick<ClientRow, 'id' | 'clinic_id' | 'display_name' | 'time_zone'>;

/**
 * The staff caseload: every client of the caller's clinics with their open
 * flags (open, not snoozed), last session, 4-week adherence, streak and power
 * trend, a page at a time. Triage is the same rows limited to clients with
 * open flags, most severe and oldest first. PostgreSQL searches, filters,
 * orders by flags or name and counts the whole list; the figures are worked
 * out for the page shown (for every match only when the order is by a
 * figure), from the stored weeks (adherence-store.ts).
 */
export async function caseload(ctx: RequestContext, { onlyFlagged }: { onlyFlagged: boolean }, query: CaseloadQuery = caseloadQuerySchema.parse({})): Promise<CaseloadPage> {
  const clinics = ctx.viewer.memberships.map((m) => m.clinicId);
  if (!clinics.length) throw forbidden('Triage and the caseload are for clinic staff.');
  const { knex } = ctx;
  const now = new Date();

  // The filter menus count every open flag of the list, before any search or filter.
  const counted: { kind: string; severity: string; n: string; clients: string }[] = await openFlags(knex, clinics)
    .groupBy('f.kind', 'f.severity')
    .select('f.kind', 'f.severity', knex.raw('count(*) AS n'));
  const all = { clients: 0, flags: 0, byKind: {} as Record<string, number>, bySeverity: {} as Record<string, number> };
  for (const r of counted) {
    const n = Number(r.n);
    all.flags += n;
    all.byKind[r.kind] = (all.byKind[r.kind] ?? 0) + n;
    all.bySeverity[r.severity] = (all.bySeverity[r.severity] ?? 0) + n;
  }
  all.clients = onlyFlagged
    ? Number((await openFlags(knex, clinics).countDistinct({ n: 'f.client_id' }))[0].n)
    : Number((await knex('clients').whereIn('clinic_id', clinics).whereNull('archived_at').count({ n: '*' }))[0].n);

  // Each listed client with the rank and time of their most urgent matching flag.
  const byFlag = Boolean(query.kind || query.severity);
  const firstFlags = openFlags(knex, clinics)
    .modify((q) => {
      if (query.kind) q.where('f.kind', query.kind);
      if (query.severity) q.where('f.severity', query.severity);
    })
    .distinctOn('f.client_id')
    .select('f.client_id', knex.raw(`${FLAG_RANK_SQL} AS rank`), 'f.raised_at')
    .orderByRaw(`f.client_id, ${FLAG_RANK_SQL}, f.raised_at`);
  const sort = query.sort ?? (onlyFlagged ? 'flags' : 'client');
  const desc = query.desc === '1' || query.desc === 'true';
  const dir = desc ? 'DESC' : 'ASC';
  const byName = byNameSql('c.display_name', 'c.id', desc);
  const matching = () =>
    knex('clients as c')
      .whereIn('c.clinic_id', clinics)
      .whereNull('c.archived_at')
      .modify((q) => {
        whereNameHasWords(q, 'c.display_name', query.q);
        if (onlyFlagged || byFlag) q.join(firstFlags.as('ff'), 'ff.client_id', 'c.id');
        else q.leftJoin(firstFlags.as('ff'), 'ff.client_id', 'c.id');
      });
  const total = Number((await matching().count({ n: '*' }))[0].n);
  const listed = (q: Knex.QueryBuilder) =>
    q.select('c.id', 'c.clinic_id', 'c.display_name', 'c.time_zone').orderByRaw(sort === 'flags' ? `ff.rank ${dir}, ff.raised_at ${dir}, ${byName}` : byName);

  let page: Listed[];
  let figures: Map<string, ClientOverview>;
  if (sort === 'flags' || sort === 'client') {
    page = await listed(matching()).offset(query.offset).limit(query.limit);
    figures = await figuresOf(knex, page, now);
  } else {
    // By a figure: every match's figures, in name order for the ties.
    const everyone: Listed[] = await listed(matching());
    figures = await figuresOf(knex, everyone, now);
    const { figure, nullsFirst } = FIGURE_SORTS[sort];
    const compare = byFigure(figure, nullsFirst, desc);
    page = everyone.sort((a, b) => compare(figures.get(a.id)!, figures.get(b.id)!)).slice(query.offset, query.offset + query.limit);
  }

  const flags: FlagRow[] = page.length
    ? await knex<FlagRow>('flags as f')
        .whereIn('f.client_id', page.map((c) => c.id))
        .where('f.state', 'open')
        .where((q) => q.whereNull('f.snoozed_until').orWhere('f.snoozed_until', '<', knex.raw('current_date')))
        .modify((q) => {
          if (query.kind) q.where('f.kind', query.kind);
          if (query.severity) q.where('f.severity', query.severity);
        })
        .select('f.*')
    : [];
  const flagsOf = new Map<string, FlagRow[]>();
  for (const f of flags) flagsOf.set(f.client_id, [...(flagsOf.get(f.client_id) ?? []), f]);
  await auditListed(ctx, onlyFlagged ? 'triage.view' : 'caseload.view', page);
  const next = query.offset + page.length;
  return {
    clients: page.map((c) => ({ clientId: c.id, clientName: c.display_name, flags: (flagsOf.get(c.id) ?? []).sort(byUrgency).map(flagView), ...figures.get(c.id)! })),
    total,
    offset: query.offset,
    limit: query.limit,
    nextOffset: next < total ? next : null,
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
    )
    .orderByRaw(byNameSql('c.display_name', 'c.id'));
  await auditListed(ctx, 'caseload.view', rows);
  return rows.map((r) => ({ clientId: r.id, clientName: r.display_name, openFlags: Number(r.open_flags) }));
}
