// The backup drill: seed, back up, wipe, restore, then compare every table's
// row count and every stored file's SHA-256 with what was there before. It
// runs on a stack of its own (a data folder inside the test stack's, its own
// PostgreSQL cluster and S3 stand-in on the test ports + 9), so the shared
// test stack is never touched. The figures it compares are read here, with
// SQL and the S3 API, not by the backup code.
import { DeleteObjectCommand, GetObjectCommand, ListObjectsV2Command, S3Client } from '@aws-sdk/client-s3';
import pg from 'pg';
import { spawnSync } from 'node:child_process';
import { createHash, randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { resolveConfig } from '../../scripts/lib/config.mjs';
import { pgPaths, startPostgres, startS3, stopStaleCluster, Supervisor } from '../../scripts/lib/services.mjs';

const root = process.env.KINLOOP_ROOT ?? process.cwd();
const pgBin = process.env.KINLOOP_PG_BIN!;
const base = path.join(process.env.KINLOOP_DATA_DIR!, `drill-${randomBytes(4).toString('hex')}`);
const dataDir = path.join(base, 'data');
const backupDir = path.join(base, 'backup');
// The drill's own ports: the test stack's + 9 (other tests use + 5 and + 7).
const settings = {
  KINLOOP_DATA_DIR: dataDir,
  KINLOOP_PG_PORT: String(Number(process.env.KINLOOP_PG_PORT) + 9),
  KINLOOP_S3_PORT: String(Number(process.env.KINLOOP_S3_PORT) + 9),
  KINLOOP_SMTP_PORT: String(Number(process.env.KINLOOP_SMTP_PORT) + 9),
  PORT: String(Number(new URL(process.env.KINLOOP_BASE_URL!).port) + 9),
};

/** The scripts' environment: the drill's ports and folder, and none of the shared stack's connections. */
function scriptEnv(extra: Record<string, string> = {}): NodeJS.ProcessEnv {
  const env: NodeJS.ProcessEnv = { ...process.env, ...settings, ...extra };
  for (const key of ['DATABASE_URL', 'S3_ENDPOINT', 'S3_BUCKET', 'SMTP_URL', 'KINLOOP_MAILBOX_DIR', 'SESSION_SECRET']) delete env[key];
  return env;
}

function script(args: string[], extra: Record<string, string> = {}) {
  const r = spawnSync(process.execPath, args, { cwd: root, env: scriptEnv(extra), encoding: 'utf8', timeout: 150_000 });
  return { status: r.status, output: `${r.stdout}${r.stderr}` };
}

/** Starts the drill folder's own cluster and S3 stand-in; returns a stop function. */
async function startDrillServices(): Promise<() => Promise<void>> {
  const config = { ...resolveConfig({}, { root, defaults: settings }), pgFsync: 'off' };
  const supervisor = new Supervisor();
  supervisor.onStop(startPostgres(pgBin, config));
  await startS3(supervisor, config);
  return () => supervisor.stopAll();
}

function drillS3(): S3Client {
  return new S3Client({
    endpoint: `http://127.0.0.1:${settings.KINLOOP_S3_PORT}`,
    region: 'us-east-1',
    credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' },
    forcePathStyle: true,
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  });
}

interface Snapshot {
  tables: Record<string, number>;
  files: Record<string, string>;
}

/** Every table's row count (over the local socket, as the superuser) and every object's SHA-256. */
async function observe(): Promise<Snapshot> {
  const config = resolveConfig({}, { root, defaults: settings });
  const client = new pg.Client({ host: pgPaths(config).socket, port: config.pgPort, user: 'postgres', database: 'kinloop' });
  await client.connect();
  const tables: Record<string, number> = {};
  try {
    const { rows } = await client.query("SELECT schemaname || '.' || tablename AS name FROM pg_tables WHERE schemaname NOT IN ('pg_catalog', 'information_schema')");
    for (const { name } of rows) tables[name] = Number((await client.query(`SELECT count(*) AS n FROM ${name}`)).rows[0].n);
  } finally {
    await client.end();
  }
  const s3 = drillS3();
  const files: Record<string, string> = {};
  let token: string | undefined;
  do {
    const page = await s3.send(new ListObjectsV2Command({ Bucket: config.s3Bucket, ContinuationToken: token }));
    for (const o of page.Contents ?? []) {
      const body = await (await s3.send(new GetObjectCommand({ Bucket: config.s3Bucket, Key: o.Key! }))).Body!.transformToByteArray();
      files[o.Key!] = createHash('sha256').update(body).digest('hex');
    }
    token = page.NextContinuationToken;
  } while (token);
  s3.destroy();
  return { tables, files };
}

afterAll(() => {
  stopStaleCluster(pgBin, { dataDir });
  rmSync(base, { recursive: true, force: true });
});

describe('backup and restore', () => {
  it('bring back every row and every stored file after the data folder is wiped; a missing file stops a backup', { timeout: 240_000 }, async () => {
    // Every session with its ride file stored, so that every upload has an object to back up.
    const seeded = script(['scripts/seed-scale.mjs', '--clients', '3', '--years', '0.15', '--other-clinics', '1', '--series-every', '1', '--store-files', '--no-demo']);
    expect(seeded.status, seeded.output).toBe(0);

    let stop = await startDrillServices();
    const before = await observe();
    const backedUp = script(['scripts/backup.mjs', backupDir]);
    await stop();
    expect(backedUp.status, backedUp.output).toBe(0);
    // Something worth comparing: sessions, checks, flags and files were seeded.
    for (const table of ['public.rides', 'public.uploads', 'public.checks', 'public.flags', 'public.prescriptions']) expect(before.tables[table]).toBeGreaterThan(0);
    expect(Object.keys(before.files).length).toBeGreaterThan(3);

    stopStaleCluster(pgBin, { dataDir });
    rmSync(dataDir, { recursive: true, force: true });
    const restored = script(['scripts/restore.mjs', backupDir]);
    expect(restored.status, restored.output).toBe(0);

    stop = await startDrillServices();
    try {
      const after = await observe();
      expect(after.tables).toEqual(before.tables);
      expect(after.files).toEqual(before.files);

      // A stored file gone missing stops the next backup, which names it and leaves no folder behind.
      const gone = Object.keys(after.files)[0];
      const s3 = drillS3();
      await s3.send(new DeleteObjectCommand({ Bucket: 'kinloop-rides', Key: gone }));
      s3.destroy();
      const second = path.join(base, 'second');
      const failed = script(['scripts/backup.mjs', second]);
      expect(failed.status).toBe(1);
      expect(failed.output).toContain(gone);
      expect(existsSync(second)).toBe(false);
    } finally {
      await stop();
    }
  });

  it('refuses to restore into a data folder in use, and leaves it as it was', { timeout: 60_000 }, () => {
    const backup = fakeBackup('for-busy');
    const busy = path.join(base, 'busy');
    mkdirSync(busy, { recursive: true });
    writeFileSync(path.join(busy, 'notes.txt'), 'someone else’s data');
    const r = script(['scripts/restore.mjs', backup], { KINLOOP_DATA_DIR: busy });
    expect(r.status).toBe(1);
    expect(r.output).toMatch(/is not empty/);
    expect(readdirSync(busy)).toEqual(['notes.txt']);
    expect(readFileSync(path.join(busy, 'notes.txt'), 'utf8')).toBe('someone else’s data');
  });

  it('refuses a damaged backup before touching anything, naming the file', { timeout: 60_000 }, () => {
    const backup = fakeBackup('damaged');
    const file = path.join(backup, 'files', 'rides', 'a', 'b', 'second');
    writeFileSync(file, 'time,power\n0,12\n1,13\n');
    const target = path.join(base, 'from-damaged');
    const r = script(['scripts/restore.mjs', backup], { KINLOOP_DATA_DIR: target });
    expect(r.status).toBe(1);
    expect(r.output).toContain('files/rides/a/b/second');
    expect(r.output).not.toContain('files/rides/a/b/first');
    expect(existsSync(target)).toBe(false);
  });
});

/** A backup folder with two files listed under their true SHA-256 (no database needed: these checks come first). */
function fakeBackup(name: string): string {
  const dir = path.join(base, name);
  const files = { 'rides/a/b/first': 'time,power\n0,10\n', 'rides/a/b/second': 'time,power\n0,12\n1,14\n' };
  const lines: string[] = [];
  for (const [key, text] of Object.entries(files)) {
    mkdirSync(path.dirname(path.join(dir, 'files', key)), { recursive: true });
    writeFileSync(path.join(dir, 'files', key), text);
    lines.push(`${createHash('sha256').update(text).digest('hex')}  files/${key}\n`);
  }
  writeFileSync(path.join(dir, 'files.sha256'), lines.join(''));
  writeFileSync(path.join(dir, 'database.dump'), 'not read by these checks');
  writeFileSync(path.join(dir, 'manifest.json'), JSON.stringify({ format: 1, createdAt: '2026-12-01T00:00:00Z', files: Object.keys(files).map((key) => ({ key })) }));
  return dir;
}
