import { z } from 'zod';
import type { RequestContext } from '../auth/context';
import { byNameSql, scope, whereNameHasWords, type Query, type Scope } from '../data';
import type { ClientRow, FlagRow } from '../db/tables';
import { forbidden } from '../http/errors';
import { FLAG_KINDS, FLAG_SEVERITIES } from '../flags';
import { compareUrgency, urgencyGroupSql } from '../flags/urgency';
import { line } from '../validation/fields';
import { flagView, type FlagView } from './flags';
import { figuresOf, type ClientOverview } from './overview';
import { careStatuses, type CareStatus } from '../care/care-status';

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
  /** The client's time zone: "today" and "3 days ago" are their calendar days. */
  timeZone: string;
  /** Open, not snoozed; most urgent first (src/lib/flags/urgency.ts). */
  flags: FlagView[];
  /** Readiness, "no plan on file" and a missing baseline (care-status.ts). */
  care: CareStatus;
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
function openFlags(s: Scope, clinics: string[]): Query<FlagRow> {
  return s.flags('f')
    .join('clients as c', 'c.id', 'f.client_id')
    .whereIn('f.clinic_id', clinics)
    .where('f.state', 'open')
    .whereNull('c.archived_at')
    .where((q) => q.whereNull('f.snoozed_until').orWhereRaw('?? < current_date', ['f.snoozed_until']));
}

type Listed = Pick<ClientRow, 'id' | 'clinic_id' | 'display_name' | 'time_zone' | 'injury_level' | 'ad_risk' | 'baseline_systolic'>;

/**
 * The staff caseload: every client of the caller's clinics with their open
 * flags (open, not snoozed), last session, 4-week adherence, streak and power
 * trend, a page at a time. Triage is the same rows limited to clients with
 * open flags, in order of clinical urgency (src/lib/flags/urgency.ts). PostgreSQL searches, filters,
 * orders by flags or name and counts the whole list; the figures are worked
 * out for the page shown (for every match only when the order is by a
 * figure), from the stored weeks (adherence-store.ts).
 */
export async function caseload(ctx: RequestContext, { onlyFlagged }: { onlyFlagged: boolean }, query: CaseloadQuery = caseloadQuerySchema.parse({})): Promise<CaseloadPage> {
  const clinics = ctx.viewer.memberships.map((m) => m.clinicId);
  if (!clinics.length) throw forbidden('Triage and the caseload are for clinic staff.');
  const s = scope(ctx);
  const now = new Date();

  // The filter menus count every open flag of the list, before any search or filter.
  const counted: { kind: string; severity: string; n: string }[] = await openFlags(s, clinics)
    .groupBy('f.kind', 'f.severity')
    .select('f.kind', 'f.severity')
    .count({ n: '*' });
  const all = { clients: 0, flags: 0, byKind: {} as Record<string, number>, bySeverity: {} as Record<string, number> };
  for (const r of counted) {
    const n = Number(r.n);
    all.flags += n;
    all.byKind[r.kind] = (all.byKind[r.kind] ?? 0) + n;
    all.bySeverity[r.severity] = (all.bySeverity[r.severity] ?? 0) + n;
  }
  all.clients = onlyFlagged
    ? Number(((await openFlags(s, clinics).countDistinct({ n: 'f.client_id' })) as { n: string }[])[0].n)
    : Number(((await s.clients().whereIn('clinic_id', clinics).count({ n: '*' })) as { n: string }[])[0].n);

  // Each listed client with their most urgent matching flag.
  const byFlag = Boolean(query.kind || query.severity);
  const firstFlags = openFlags(s, clinics)
    .modify((q) => {
      if (query.kind) q.where('f.kind', query.kind);
      if (query.severity) q.where('f.severity', query.severity);
    })
    .distinctOn('f.client_id')
    .select('f.client_id', 'f.kind', 'f.severity', 'f.raised_at')
    .orderByRaw(`f.client_id, ${urgencyGroupSql('f')}, f.raised_at`);
  const sort = query.sort ?? (onlyFlagged ? 'flags' : 'client');
  const desc = query.desc === '1' || query.desc === 'true';
  const dir = desc ? 'DESC' : 'ASC';
  const byName = byNameSql('c.display_name', 'c.id', desc);
  const matching = () =>
    s.clients('c')
      .whereIn('c.clinic_id', clinics)
      .modify((q) => {
        whereNameHasWords(q, 'c.display_name', query.q);
        if (onlyFlagged || byFlag) q.join(firstFlags.as('ff'), 'ff.client_id', 'c.id');
        else q.leftJoin(firstFlags.as('ff'), 'ff.client_id', 'c.id');
      });
  const total = Number((await matching().count({ n: '*' }))[0].n);
  const listed = (q: Query) =>
    q.select('c.id', 'c.clinic_id', 'c.display_name', 'c.time_zone', 'c.injury_level', 'c.ad_risk', 'c.baseline_systolic').orderByRaw(sort === 'flags' ? `${urgencyGroupSql('ff')} ${dir}, ff.raised_at ${dir}, ${byName}` : byName);

  let page: Listed[];
  let figures: Map<string, ClientOverview>;
  if (sort === 'flags' || sort === 'client') {
    page = await listed(matching()).offset(query.offset).limit(query.limit);
    figures = await figuresOf(s.db, page, now);
  } else {
    // By a figure: every match's figures, in name order for the ties.
    const everyone: Listed[] = await listed(matching());
    figures = await figuresOf(s.db, everyone, now);
    const { figure, nullsFirst } = FIGURE_SORTS[sort];
    const compare = byFigure(figure, nullsFirst, desc);
    page = everyone.sort((a, b) => compare(figures.get(a.id)!, figures.get(b.id)!)).slice(query.offset, query.offset + query.limit);
  }

  const flags: FlagRow[] = page.length
    ? await s.flags('f')
        .whereIn('f.client_id', page.map((c) => c.id))
        .where('f.state', 'open')
        .where((q) => q.whereNull('f.snoozed_until').orWhereRaw('?? < current_date', ['f.snoozed_until']))
        .modify((q) => {
          if (query.kind) q.where('f.kind', query.kind);
          if (query.severity) q.where('f.severity', query.severity);
        })
        .select('f.*')
    : [];
  const flagsOf = new Map<string, FlagRow[]>();
  for (const f of flags) flagsOf.set(f.client_id, [...(flagsOf.get(f.client_id) ?? []), f]);
  // Readiness and the care badges of the page shown: one small read per table.
  const care = await careStatuses(s.db, page, now);
  await s.listed(onlyFlagged ? 'triage.view' : 'caseload.view', page);
  const next = query.offset + page.length;
  return {
    clients: page.map((c) => ({ clientId: c.id, clientName: c.display_name, timeZone: c.time_zone, flags: (flagsOf.get(c.id) ?? []).map(flagView).sort(compareUrgency), ...figures.get(c.id)!, care: care.get(c.id)! })),
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
  const s = scope(ctx);
  const counts = openFlags(s, clinics).groupBy('f.client_id').select('f.client_id').count({ n: '*' });
  const rows: (Pick<ClientRow, 'id' | 'clinic_id' | 'display_name'> & { n: string | null })[] = await s.clients('c')
    .whereIn('c.clinic_id', clinics)
    .leftJoin(counts.as('oc'), 'oc.client_id', 'c.id')
    .select('c.id', 'c.clinic_id', 'c.display_name', 'oc.n')
    .orderByRaw(byNameSql('c.display_name', 'c.id'));
  await s.listed('caseload.view', rows);
  return rows.map((r) => ({ clientId: r.id, clientName: r.display_name, openFlags: Number(r.n ?? 0) }));
}
