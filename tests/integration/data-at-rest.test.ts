// On a shared machine nobody else may read Kinloop's data folder: captured
// e-mail (sign-in links), stored ride files and secrets are the owner's alone.
import { readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../src/lib/db/knex';
import { Http } from '../support/http';
import { waitForMail } from '../support/mail';
import { rideCsv, uploadAndWait } from '../support/rides';
import { createWorld, type World } from '../support/world';

let world: World;
beforeAll(async () => {
  world = await createWorld('at-rest');
});
afterAll(closeDb);

const dataDir = () => process.env.KINLOOP_DATA_DIR!;
const mode = (p: string) => statSync(p).mode & 0o777;
const octal = (m: number) => m.toString(8).padStart(3, '0');

/** Every file and folder under `dir` (the cluster itself excepted: PostgreSQL keeps it 0700 as its own user). */
function walk(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const p = path.join(dir, e.name);
    return e.isDirectory() ? [p, ...walk(p)] : [p];
  });
}

describe('the data folder', () => {
  it('is closed to other users: no read or write for group or others', () => {
    // When run as root the group is postgres's, with search only, so that the cluster can be reached.
    expect(octal(mode(dataDir()) & 0o077)).toMatch(/^0[01]0$/);
  });

  it('captured e-mail: folder 0700, each message 0600', async () => {
    await new Http().post('/api/auth/reset-request', { email: world.users.therapist.email });
    await waitForMail(world.users.therapist.email, (m) => m.subject.includes('Reset'));
    const dir = path.join(dataDir(), 'mailbox');
    expect(octal(mode(dir))).toBe('700');
    const files = readdirSync(dir).map((n) => path.join(dir, n));
    expect(files.length).toBeGreaterThan(0);
    expect(files.filter((f) => mode(f) !== 0o600).map((f) => `${path.basename(f)} ${octal(mode(f))}`)).toEqual([]);
  });

  it('stored ride files: folders 0700, files 0600', async () => {
    const [r] = await uploadAndWait(await world.as('carer'), world.clientId, [{ name: 'rest.csv', content: rideCsv({ startedAt: '2026-04-07T09:00:00Z' }) }]);
    expect(r.status).toBe('accepted');
    const all = walk(path.join(dataDir(), 's3'));
    expect(all.length).toBeGreaterThan(1);
    const open = all.filter((p) => mode(p) !== (statSync(p).isDirectory() ? 0o700 : 0o600));
    expect(open.map((p) => `${path.relative(dataDir(), p)} ${octal(mode(p))}`)).toEqual([]);
  });

  it('generated secrets: 0600', () => {
    for (const name of ['session-secret', 'pg-password', 'pg-owner-password']) {
      expect(octal(mode(path.join(dataDir(), name))), name).toBe('600');
    }
  });
});
