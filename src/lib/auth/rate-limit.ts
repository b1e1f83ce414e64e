import { lock, type Db, type Query } from '../data/db';

// Sign-in limits, counted in PostgreSQL so that they hold across app
// instances, and designed so that an attacker elsewhere cannot lock the real
// owner out (DEVELOPERS.md, "Sign-in limits"):
// - per e-mail and address (or e-mail and trusted device): 10 failures since
//   the pair's last success, within 15 minutes, block that pair only;
// - per address: 30 failures within 15 minutes, over any e-mails, block that
//   address (one machine trying many accounts), but never a trusted device;
// - per e-mail from anywhere: after 10 failures since its last success, one
//   attempt per 30 s is evaluated (a slowdown, not a lockout), trusted
//   devices exempt. The owner on a browser that signed in before carries a
//   trusted-device cookie; on a new one, a reset link always signs in.
// An attempt is reserved (stored as a failure) under advisory locks before
// the password is checked, and marked a success afterwards: parallel attempts
// see each other, so no more than the limit are ever evaluated.
export const SIGN_IN_WINDOW_MS = 15 * 60_000;
export const MAX_FAILURES_PER_PAIR = 10;
export const MAX_FAILURES_PER_ADDRESS = 30;
export const ACCOUNT_SLOWDOWN_AFTER = 10;
export const ACCOUNT_SLOWDOWN_INTERVAL_MS = 30_000;

export interface AttemptKey {
  email: string;
  ip: string;
  /** The trusted device of this account the attempt comes from, if any. */
  device: string | null;
}

export type Reservation = { ok: true; id: string } | { ok: false; retryAfterS: number; limit: 'pair' | 'address' | 'account' };

/** When the oldest of the latest `max` failures leaves the window, or null when there are fewer than `max`. */
function freedAt(latestFirst: { attempted_at: Date }[], max: number): number | null {
  return latestFirst.length >= max ? latestFirst[max - 1].attempted_at.getTime() + SIGN_IN_WINDOW_MS : null;
}

export async function reserveSignInAttempt(knex: Db, key: AttemptKey): Promise<Reservation> {
  return knex.transaction(async (trx) => {
    // Always the e-mail's lock before the address's, so two attempts never wait on each other in a cycle.
    await lock(trx, `sign-in:email:${key.email}`);
    await lock(trx, `sign-in:ip:${key.ip}`);
    // The clock is read once the locks are held, so attempts are stored in the order they were counted.
    const now = new Date();
    const since = new Date(now.getTime() - SIGN_IN_WINDOW_MS);

    const pair = (q: Query) =>
      key.device ? q.where({ email: key.email, device: key.device }) : q.where({ email: key.email, ip: key.ip }).whereNull('device');
    const lastSuccess = async (scope: (q: Query) => Query) => {
      const row = await scope(trx('sign_in_attempts')).where({ succeeded: true }).where('attempted_at', '>', since).max<{ at: Date | null }>('attempted_at as at').first();
      return row?.at ?? since;
    };
    const failuresAfter = (scope: (q: Query) => Query, after: Date, max: number) =>
      scope(trx('sign_in_attempts')).where({ succeeded: false }).where('attempted_at', '>', after).orderBy('attempted_at', 'desc').limit(max).select('attempted_at');

    const waits: { until: number; limit: 'pair' | 'address' | 'account' }[] = [];
    const pairFreed = freedAt(await failuresAfter(pair, await lastSuccess(pair), MAX_FAILURES_PER_PAIR), MAX_FAILURES_PER_PAIR);
    if (pairFreed) waits.push({ until: pairFreed, limit: 'pair' });

    if (!key.device) {
      const address = (q: Query) => q.where({ ip: key.ip }).whereNull('device');
      const addressFreed = freedAt(await failuresAfter(address, since, MAX_FAILURES_PER_ADDRESS), MAX_FAILURES_PER_ADDRESS);
      if (addressFreed) waits.push({ until: addressFreed, limit: 'address' });

      const account = (q: Query) => q.where({ email: key.email });
      const accountFailures = await failuresAfter(account, await lastSuccess(account), ACCOUNT_SLOWDOWN_AFTER);
      if (accountFailures.length >= ACCOUNT_SLOWDOWN_AFTER) {
        const last = await trx('sign_in_attempts').where({ email: key.email }).whereNull('device').where('attempted_at', '>', since).max<{ at: Date | null }>('attempted_at as at').first();
        const next = (last?.at?.getTime() ?? 0) + ACCOUNT_SLOWDOWN_INTERVAL_MS;
        if (next > now.getTime()) waits.push({ until: next, limit: 'account' });
      }
    }

    if (waits.length) {
      const longest = waits.reduce((a, b) => (b.until > a.until ? b : a));
      return { ok: false, retryAfterS: Math.max(1, Math.ceil((longest.until - now.getTime()) / 1000)), limit: longest.limit };
    }
    const [row] = await trx('sign_in_attempts').insert({ email: key.email, ip: key.ip, device: key.device, succeeded: false, attempted_at: now }).returning('id');
    return { ok: true, id: String(row.id) };
  });
}

/** A reserved attempt counts as a failure until the password proved right. */
export async function markSignInSucceeded(knex: Db, attemptId: string): Promise<void> {
  await knex('sign_in_attempts').where({ id: attemptId }).update({ succeeded: true });
}

/** "30 seconds", "1 minute", "15 minutes": how long to wait, in the unit a person would use. */
export function waitWords(seconds: number): string {
  if (seconds < 60) return `${seconds} second${seconds === 1 ? '' : 's'}`;
  const minutes = Math.ceil(seconds / 60);
  return `${minutes} minute${minutes === 1 ? '' : 's'}`;
}
