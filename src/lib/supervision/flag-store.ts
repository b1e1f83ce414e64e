// Applies the flag planner's changes to the stored flags, each with its
// history event, in one transaction per client.
import { lock, type Db, type Query } from '../data/db';
import type { ClientRow, FlagRow } from '../db/tables';
import { planFlagChanges, SESSION_FLAG_KINDS, type ExistingFlag, type FlagChange, type FlagCondition } from '../flags';
import { alertUrgentFlag } from '../notifications/alerts';
import { flagInput, loadHistory } from './history';

export function existingFlag(row: FlagRow): ExistingFlag {
  return {
    id: row.id,
    kind: row.kind,
    severity: row.severity,
    state: row.state,
    anchor: row.anchor,
    reason: row.reason,
    evidence: row.evidence,
    raisedAt: row.raised_at.toISOString(),
    clearedAt: row.cleared_at?.toISOString() ?? null,
    snoozedUntil: row.snoozed_until,
  };
}


async function event(trx: Db, flagId: string, action: string, detail: Record<string, unknown> = {}, note: string | null = null, actor: string | null = null) {
  await trx('flag_events').insert({ flag_id: flagId, action, detail: JSON.stringify(detail), note, actor_user_id: actor });
}

const conditionColumns = (c: FlagCondition) => ({ severity: c.severity, anchor: c.anchor, reason: c.reason, evidence: JSON.stringify(c.evidence) });

/** Re-evaluates a client's session flags with all data as of `now`. */
export async function evaluateClientFlags(knex: Db, clientId: string, now = new Date()): Promise<FlagChange[]> {
  const touched: { row: FlagRow; type: FlagChange['type'] }[] = [];
  const changes = await knex.transaction(async (trx) => {
    await lock(trx, `flags:${clientId}`);
    const client = await trx<ClientRow>('clients').where({ id: clientId }).first();
    if (!client || client.archived_at) return [];
    const history = await loadHistory(trx, client, { rules: true });
    const stored = await trx<FlagRow>('flags').where({ client_id: clientId }).whereIn('kind', SESSION_FLAG_KINDS);
    const planned = planFlagChanges(stored.map(existingFlag), flagInput(history, now));
    for (const change of planned) {
      if (change.type === 'raise') {
        const [row] = await trx<FlagRow>('flags')
          .insert({ client_id: clientId, clinic_id: client.clinic_id, kind: change.condition.kind, state: 'open', raised_at: now, updated_at: now, cleared_at: change.cleared ? now : null, ...conditionColumns(change.condition) } as never)
          .returning('*');
        await event(trx, row.id, 'raised', { severity: row.severity, anchor: row.anchor, reason: row.reason });
        if (change.cleared) await event(trx, row.id, 'cleared', { severity: row.severity, anchor: row.anchor, reason: row.reason, why: change.cleared.why });
        touched.push({ row, type: 'raise' });
      } else if (change.type === 'withdraw') {
        const [row] = await trx<FlagRow>('flags').where({ id: change.flagId }).update({ state: 'withdrawn', closed_at: now, updated_at: now }).returning('*');
        await event(trx, change.flagId, 'withdrawn', { why: change.why });
        touched.push({ row, type: 'withdraw' });
      } else {
        const previous = stored.find((f) => f.id === change.flagId)!;
        const cleared = change.type === 'clear' ? (previous.cleared_at ?? now) : null;
        const [row] = await trx<FlagRow>('flags')
          .where({ id: change.flagId })
          .update({ ...conditionColumns(change.condition), cleared_at: cleared, updated_at: now, ...(change.reopen ? { state: 'open' } : {}) } as never)
          .returning('*');
        const action = change.type === 'clear' ? (previous.cleared_at ? 'updated' : 'cleared') : change.reopen ? 'reopened' : 'updated';
        await event(trx, change.flagId, action, { severity: row.severity, anchor: row.anchor, reason: row.reason, ...(change.type === 'clear' ? { why: change.why } : {}) });
        touched.push({ row, type: change.type });
      }
    }
    return planned;
  });
  for (const t of touched) await alertUrgentFlag(knex, t.row);
  return changes;
}

/**
 * Raises or updates a check-derived flag (bp_rise, bp_drop, skin_concern):
 * one live flag per kind, a worse or newer reading updates it and reopens an
 * acknowledged one.
 */
export async function raiseCheckFlag(
  knex: Db,
  p: { clientId: string; clinicId: string; kind: 'bp_rise' | 'bp_drop' | 'skin_concern'; severity: 'urgent' | 'review' | 'info'; anchor: string; reason: string; evidence: unknown },
  now = new Date(),
): Promise<FlagRow> {
  const result = await knex.transaction(async (trx) => {
    await lock(trx, `flags:${p.clientId}`);
    const live = await trx<FlagRow>('flags').where({ client_id: p.clientId, kind: p.kind }).whereIn('state', ['open', 'acknowledged']).first();
    const columns = { severity: p.severity, anchor: p.anchor, reason: p.reason, evidence: JSON.stringify(p.evidence) };
    if (live) {
      const [row] = await trx<FlagRow>('flags').where({ id: live.id }).update({ ...columns, state: 'open', cleared_at: null, updated_at: now } as never).returning('*');
      await event(trx, live.id, live.state === 'acknowledged' ? 'reopened' : 'updated', { severity: p.severity, anchor: p.anchor, reason: p.reason });
      return { row, type: 'update' as const };
    }
    const [row] = await trx<FlagRow>('flags')
      .insert({ client_id: p.clientId, clinic_id: p.clinicId, kind: p.kind, state: 'open', raised_at: now, updated_at: now, ...columns } as never)
      .returning('*');
    await event(trx, row.id, 'raised', { severity: p.severity, anchor: p.anchor, reason: p.reason });
    return { row, type: 'raise' as const };
  });
  await alertUrgentFlag(knex, result.row);
  return result.row;
}
