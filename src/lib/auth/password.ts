import { hash, verify, type Options } from '@node-rs/argon2';
import { z } from 'zod';

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
