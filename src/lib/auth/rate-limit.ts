import type { Knex } from 'knex';

// Failed sign-ins are counted in PostgreSQL so the limit holds across app
// instances. Per e-mail it stops guessing one account's password; per address
// it stops one machine trying many accounts.
export const SIGN_IN_WINDOW_MS = 15 * 60_000;
export const MAX_FAILURES_PER_EMAIL = 10;
export const MAX_FAILURES_PER_IP = 10;

/** Minutes until the caller may try again, or 0 when they may try now. */
export async function signInBlockedMinutes(knex: Knex, email: string, ip: string, now = new Date()): Promise<number> {
  const since = new Date(now.getTime() - SIGN_IN_WINDOW_MS);
  const [byEmail, byIp] = await Promise.all(
    [
      { column: 'email', value: email, max: MAX_FAILURES_PER_EMAIL },
      { column: 'ip', value: ip, max: MAX_FAILURES_PER_IP },
    ].map(async ({ column, value, max }) => {
      const rows = await knex('sign_in_attempts')
        .where({ [column]: value, succeeded: false })
        .where('attempted_at', '>', since)
        .orderBy('attempted_at', 'desc')
        .limit(max)
        .select('attempted_at');
      if (rows.length < max) return 0;
      // The window frees up when the oldest of the last `max` failures leaves it.
      const oldest: Date = rows[rows.length - 1].attempted_at;
      return Math.max(1, Math.ceil((oldest.getTime() + SIGN_IN_WINDOW_MS - now.getTime()) / 60_000));
    }),
  );
  return Math.max(byEmail, byIp);
}

export async function recordSignInAttempt(knex: Knex, email: string, ip: string, succeeded: boolean): Promise<void> {
  await knex('sign_in_attempts').insert({ email, ip, succeeded });
}
