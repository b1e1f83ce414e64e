// The clinic's screening of a client before (and during) a home program: one
// status per item of PRODUCT.md's "Safety" list, with a note. Every save is a
// new version; earlier versions stay as they were.
import { z } from 'zod';
import type { RequestContext } from '../auth/context';
import { scope, type Db } from '../data';
import { badRequest } from '../http/errors';
import { PRE_PROGRAM_SCREENING } from '../checks/safety-text';
import { calendarDate, paragraph } from '../validation/fields';
import { localDate } from '../time/local-date';
import type { ScreeningStatus } from './readiness';

export const SCREENING_ITEM_IDS = PRE_PROGRAM_SCREENING.items.map((i) => i.id) as [string, ...string[]];
export const SCREENING_STATUSES = ['not_assessed', 'no_concern', 'concern'] as const;

export { SCREENING_STATUS_LABELS } from './screening-labels';

const itemSchema = z
  .object({
    id: z.enum(SCREENING_ITEM_IDS, { errorMap: () => ({ message: `Item: one of ${SCREENING_ITEM_IDS.join(', ')}.` }) }),
    status: z.enum(SCREENING_STATUSES, { errorMap: () => ({ message: 'Status: not_assessed, no_concern or concern.' }) }),
    note: paragraph(z.string().trim().max(1000, 'Note: at most 1000 characters.'), 'Note').nullish(),
    /** Bone health only: the date of the last bone-density scan. */
    lastScanOn: calendarDate('Last bone-density scan').nullish(),
  })
  .strict();

export const screeningInputSchema = z
  .object({
    items: z.array(itemSchema).min(1, 'Items: record at least one item.').max(SCREENING_ITEM_IDS.length, `Items: at most ${SCREENING_ITEM_IDS.length}.`),
    assessedOn: calendarDate('Assessed on'),
  })
  .strict()
  .superRefine((v, ctx) => {
    const seen = new Set<string>();
    v.items.forEach((item, i) => {
      if (seen.has(item.id)) ctx.addIssue({ code: 'custom', path: ['items', i, 'id'], message: `Item ${item.id} is listed twice.` });
      seen.add(item.id);
      if (item.status === 'concern' && !item.note) ctx.addIssue({ code: 'custom', path: ['items', i, 'note'], message: 'Note: say what the concern is.' });
      if (item.lastScanOn && item.id !== 'bone_health') ctx.addIssue({ code: 'custom', path: ['items', i, 'lastScanOn'], message: 'Last bone-density scan: only for bone health.' });
    });
  });
export type ScreeningInput = z.infer<typeof screeningInputSchema>;

export interface ScreeningItemRecord {
  id: string;
  label: string;
  status: ScreeningStatus;
  note: string | null;
  lastScanOn: string | null;
}

/** Every item of the list, in its order; items a version did not name are "not assessed". */
export function fullItems(stored: { id: string; status: ScreeningStatus; note?: string | null; lastScanOn?: string | null }[]): ScreeningItemRecord[] {
  const byId = new Map(stored.map((s) => [s.id, s]));
  return PRE_PROGRAM_SCREENING.items.map((item) => {
    const s = byId.get(item.id);
    return { id: item.id, label: item.label, status: s?.status ?? 'not_assessed', note: s?.note ?? null, lastScanOn: s?.lastScanOn ?? null };
  });
}

export function screeningView(row: { id: string; version: number; items: unknown; assessed_on: string; assessed_by: string; assessed_by_name?: string; created_at: Date }) {
  return {
    id: row.id,
    version: row.version,
    assessedOn: row.assessed_on,
    assessedBy: { userId: row.assessed_by, name: row.assessed_by_name ?? null },
    recordedAt: row.created_at.toISOString(),
    items: fullItems(row.items as ScreeningItemRecord[]),
  };
}

async function versions(db: Db, clientId: string) {
  return db('screening_versions as s').join('users as u', 'u.id', 's.assessed_by').where('s.client_id', clientId).orderBy('s.version', 'desc').select('s.*', 'u.name as assessed_by_name');
}

/** The current screening (the newest version) and every version, newest first. Staff only. */
export async function readScreening(ctx: RequestContext, clientId: string) {
  const client = await scope(ctx).client(clientId, 'manage', 'screening.view');
  const rows = await versions(client.db, client.id);
  return { current: rows[0] ? screeningView(rows[0]) : null, history: rows.map(screeningView), items: PRE_PROGRAM_SCREENING.items };
}

export async function saveScreening(ctx: RequestContext, clientId: string, input: ScreeningInput) {
  const client = await scope(ctx).client(clientId, 'manage', 'screening.change');
  if (input.assessedOn > localDate(new Date(), client.row.time_zone)) {
    throw badRequest('Assessed on: the assessment cannot be dated in the future.', { fields: [{ path: 'assessedOn', message: 'Choose today or an earlier day.' }] });
  }
  await client.transaction(async (tx) => {
    await tx.lock(`screening:${client.id}`);
    const latest = await tx.db('screening_versions').max('version as v').first();
    const items = input.items.map((i) => ({ id: i.id, status: i.status, note: i.note || null, lastScanOn: i.lastScanOn ?? null }));
    const [created] = await tx.db('screening_versions')
      .insert({ version: Number(latest?.v ?? 0) + 1, items: JSON.stringify(items), assessed_on: input.assessedOn, assessed_by: ctx.viewer.userId })
      .returning(['id', 'version']);
    const concerns = items.filter((i) => i.status === 'concern').map((i) => i.id);
    await tx.audit({ action: 'screening.version_created', recordType: 'screening', recordId: created.id, detail: { version: created.version, concerns } });
  });
  const rows = await versions(client.db, client.id);
  return { current: screeningView(rows[0]), history: rows.map(screeningView), items: PRE_PROGRAM_SCREENING.items };
}
