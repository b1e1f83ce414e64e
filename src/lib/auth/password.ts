import { hash, verify, type Options } from '@node-rs/argon2';
import type { Db, Query } from '../data/db';
import { z } from 'zod';
import type { UserRow } from '../db/tables';

// Argon2id with the library's defaults (19 MiB, 2 passes, 1 lane), which are
// OWASP's minimum recommendation for argon2id. 2 is Algorithm.Argon2id; the
// package declares it as a const enum, which isolated modules cannot import.
const OPTIONS: Options = { algorithm: 2 as Options['algorithm'] };

export const passwordSchema = z
  .string()
  .min(10, 'Choose a password of at least 10 characters.')
  .max(200, 'Choose a password of at most 200 characters.');

export function hashPassword(password: string): Promise<string> {
  return hash(password, OPTIONS);
}

export async function verifyPassword(stored: string | null, password: string): Promise<boolean> {
  if (!stored) return false;
  try {
    return await verify(stored, password);
  } catch {
    return false;
  }
}

// A real hash to verify against when the e-mail is unknown, so that a wrong
// e-mail and a wrong password take the same time.
let decoy: Promise<string> | null = null;
export function decoyHash(): Promise<string> {
  decoy ??= hashPassword('kinloop-decoy-password-never-used');
  return decoy;
}

/**
 * Every change of an account's password goes through here (reset, first
 * password from an invitation): it also withdraws every reset link of the
 * account still outstanding, so an older e-mail can no longer set it.
 */
export async function setPassword(trx: Db, userId: string, passwordHash: string, changes: Partial<Pick<UserRow, 'name'>> = {}): Promise<UserRow> {
  const [user] = await trx<UserRow>('users').where({ id: userId }).update({ ...changes, password_hash: passwordHash, updated_at: trx.fn.now() }).returning('*');
  await trx('password_resets').where({ user_id: userId }).whereNull('used_at').whereNull('revoked_at').update({ revoked_at: trx.fn.now() });
  return user;
}
