// The data half of `npm run backup` and `npm run restore` (scripts/backup.mjs
// and scripts/restore.mjs start the services and run this under tsx).
//
// A backup folder holds:
//   database.dump   pg_dump's custom format, taken in one snapshot
//   files/<key>     every stored ride file the snapshot's uploads name, and every clearance document
//   files.sha256    their SHA-256, in `sha256sum -c` form
//   manifest.json   written last: the row count of every table in the same
//                   snapshot and every file's key, size, type and SHA-256
//
//   tsx scripts/snapshot.ts backup FOLDER  --pg-bin DIR [--socket DIR --port N] [--allow-missing-files]
//   tsx scripts/snapshot.ts restore FOLDER --pg-bin DIR  --socket DIR --port N
// With --socket and --port, the database is reached as the cluster's
// superuser over its local socket; without, through DATABASE_URL.
import { GetObjectCommand, PutObjectCommand } from '@aws-sdk/client-s3';
import pg from 'pg';
import { spawn } from 'node:child_process';
import { createHash } from 'node:crypto';
import { createWriteStream, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { Readable, Transform } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { parseArgs } from 'node:util';
import { config } from '../src/lib/config';
import { s3 } from '../src/lib/storage/s3';

export interface Manifest {
  format: 1;
  createdAt: string;
  database: { file: 'database.dump'; name: string; tables: Record<string, number> };
  files: { key: string; bytes: number; sha256: string; contentType: string | null }[];
  /** Keys the database names that storage did not have at backup time. */
  missingFiles: string[];
  /** Stored files whose bytes differ from the SHA-256 the upload recorded. */
  changedFiles: string[];
}

const { positionals, values } = parseArgs({
  allowPositionals: true,
  options: {
    'pg-bin': { type: 'string' },
    socket: { type: 'string' },
    port: { type: 'string' },
    'allow-missing-files': { type: 'boolean', default: false },
  },
});
const [command, folder] = positionals;
const CONCURRENCY = 4;

const databaseName = decodeURIComponent(new URL(config().databaseUrl).pathname.slice(1));
/** The cluster's superuser over the local socket, or the configured connection for an external database. */
const connection = values.socket
  ? { host: values.socket, port: Number(values.port), user: 'postgres', database: databaseName }
  : { connectionString: config().databaseUrl };
const pgToolArgs = values.socket ? ['-h', values.socket, '-p', values.port!, '-U', 'postgres', '-d', databaseName] : ['-d', config().databaseUrl];
const bucket = config().s3.bucket;

function runTool(name: string, args: string[]): Promise<void> {
  return new Promise((resolve, reject) => {
    const child = spawn(path.join(values['pg-bin']!, name), args, { stdio: ['ignore', 'inherit', 'pipe'] });
    let err = '';
    child.stderr.on('data', (d) => (err += d));
    child.on('error', reject);
    child.on('exit', (code) => (code === 0 ? resolve() : reject(new Error(`${name} exited with ${code}: ${err.trim()}`))));
  });
}

async function tableCounts(client: pg.Client): Promise<Record<string, number>> {
  const { rows } = await client.query<{ schemaname: string; tablename: string }>(
    "SELECT schemaname, tablename FROM pg_tables WHERE schemaname NOT IN ('pg_catalog', 'information_schema') ORDER BY 1, 2",
  );
  const counts: Record<string, number> = {};
  for (const t of rows) {
    const name = `${client.escapeIdentifier(t.schemaname)}.${client.escapeIdentifier(t.tablename)}`;
    counts[`${t.schemaname}.${t.tablename}`] = Number((await client.query(`SELECT count(*) AS n FROM ${name}`)).rows[0].n);
  }
  return counts;
}

/** A key as a path under files/; refuses anything that could climb out of the folder. */
function fileOf(key: string): string {
  if (!/^[A-Za-z0-9][A-Za-z0-9._\-/]*$/.test(key) || key.split('/').some((part) => part === '..' || part === '')) {
    throw new Error(`The storage key "${key}" cannot be written as a file name; nothing was backed up.`);
  }
  return path.join(folder, 'files', key);
}

async function inParallel<T>(items: T[], task: (item: T) => Promise<void>): Promise<void> {
  const queue = items[Symbol.iterator]();
  const lane = async () => {
    for (let next = queue.next(); !next.done; next = queue.next()) await task(next.value);
  };
  await Promise.all(Array.from({ length: CONCURRENCY }, lane));
}

async function backup(): Promise<void> {
  const client = new pg.Client(connection);
  await client.connect();
  let tables: Record<string, number>;
  let uploads: { storage_key: string; sha256: string }[];
  try {
    // One snapshot for the dump, the row counts and the list of files, so that all three agree.
    await client.query('BEGIN ISOLATION LEVEL REPEATABLE READ READ ONLY');
    const snapshot = (await client.query('SELECT pg_export_snapshot() AS id')).rows[0].id as string;
    tables = await tableCounts(client);
    // Copies of the same bytes share one stored object: each object is copied once.
    // Ride files and clearance documents are the stored objects a record names.
    uploads = (await client.query('SELECT DISTINCT storage_key, sha256 FROM (SELECT storage_key, sha256 FROM uploads UNION ALL SELECT storage_key, sha256 FROM clearances) f ORDER BY storage_key')).rows;
    console.log(`[backup] dumping the database (${Object.keys(tables).length} tables, ${Object.values(tables).reduce((a, b) => a + b, 0).toLocaleString('en')} rows)…`);
    await runTool('pg_dump', [...pgToolArgs, '--format=custom', `--snapshot=${snapshot}`, '--file', path.join(folder, 'database.dump')]);
    await client.query('COMMIT');
  } finally {
    await client.end();
  }

  console.log(`[backup] copying ${uploads.length.toLocaleString('en')} stored files…`);
  const files: Manifest['files'] = [];
  const missingFiles: string[] = [];
  const changedFiles: string[] = [];
  await inParallel(uploads, async ({ storage_key: key, sha256: recorded }) => {
    const target = fileOf(key);
    let res;
    try {
      res = await s3().send(new GetObjectCommand({ Bucket: bucket, Key: key }));
    } catch (err) {
      if ((err as { name?: string }).name === 'NoSuchKey') {
        missingFiles.push(key);
        return;
      }
      throw new Error(`Reading ${key} from storage failed: ${(err as Error).message}`);
    }
    mkdirSync(path.dirname(target), { recursive: true });
    const hash = createHash('sha256');
    let bytes = 0;
    const tap = new Transform({
      transform(chunk, _enc, done) {
        hash.update(chunk);
        bytes += chunk.length;
        done(null, chunk);
      },
    });
    await pipeline(res.Body as Readable, tap, createWriteStream(target));
    const sha256 = hash.digest('hex');
    if (sha256 !== recorded) changedFiles.push(key);
    files.push({ key, bytes, sha256, contentType: res.ContentType ?? null });
  });
  files.sort((a, b) => a.key.localeCompare(b.key));
  writeFileSync(path.join(folder, 'files.sha256'), files.map((f) => `${f.sha256}  files/${f.key}\n`).join(''));
  const manifest: Manifest = { format: 1, createdAt: new Date().toISOString(), database: { file: 'database.dump', name: databaseName, tables }, files, missingFiles, changedFiles };
  if (missingFiles.length && !values['allow-missing-files']) {
    throw new Error(
      `${missingFiles.length} file(s) the database names are not in storage (for example ${missingFiles.slice(0, 3).join(', ')}). ` +
        'The backup was not completed. Find out what happened to them; --allow-missing-files backs up the rest and lists them in manifest.json.',
    );
  }
  writeFileSync(path.join(folder, 'manifest.json'), JSON.stringify(manifest, null, 1) + '\n');
  const total = files.reduce((a, f) => a + f.bytes, 0);
  console.log(`[backup] ${files.length} files (${(total / 1e6).toFixed(1)} MB)${missingFiles.length ? `, ${missingFiles.length} listed as missing` : ''}${changedFiles.length ? `; ${changedFiles.length} differ from the SHA-256 recorded at upload, listed in manifest.json` : ''}`);
}

async function restore(): Promise<void> {
  const manifest = JSON.parse(readFileSync(path.join(folder, 'manifest.json'), 'utf8')) as Manifest;
  console.log('[restore] restoring the database…');
  await runTool('pg_restore', [...pgToolArgs, '--exit-on-error', '--single-transaction', path.join(folder, manifest.database.file)]);

  console.log(`[restore] storing ${manifest.files.length.toLocaleString('en')} files…`);
  await inParallel(manifest.files, async (f) => {
    const body = readFileSync(fileOf(f.key));
    await s3().send(new PutObjectCommand({ Bucket: bucket, Key: f.key, Body: body, ContentLength: body.length, ContentType: f.contentType ?? undefined }));
  });

  // Read everything back: the restore is done only when it matches the snapshot.
  const client = new pg.Client(connection);
  await client.connect();
  let counts: Record<string, number>;
  try {
    counts = await tableCounts(client);
  } finally {
    await client.end();
  }
  const wrongTables = Object.entries(manifest.database.tables).filter(([t, n]) => counts[t] !== n).map(([t, n]) => `${t}: ${counts[t] ?? 'missing'} rows instead of ${n}`);
  const wrongFiles: string[] = [];
  await inParallel(manifest.files, async (f) => {
    try {
      const res = await s3().send(new GetObjectCommand({ Bucket: bucket, Key: f.key }));
      const bytes = await res.Body!.transformToByteArray();
      if (createHash('sha256').update(bytes).digest('hex') !== f.sha256) wrongFiles.push(`file ${f.key} differs`);
    } catch (err) {
      if ((err as { name?: string }).name !== 'NoSuchKey') throw err;
      wrongFiles.push(`file ${f.key} is missing`);
    }
  });
  if (wrongTables.length || wrongFiles.length) {
    throw new Error(`The restored data does not match the backup: ${[...wrongTables, ...wrongFiles].slice(0, 10).join('; ')}`);
  }
  console.log(`[restore] checked: ${Object.keys(counts).length} tables with the backup's row counts, ${manifest.files.length} files with their SHA-256`);
}

if ((command !== 'backup' && command !== 'restore') || !folder || !values['pg-bin']) {
  console.error('usage: tsx scripts/snapshot.ts backup|restore FOLDER --pg-bin DIR [--socket DIR --port N]');
  process.exit(64);
}
try {
  await (command === 'backup' ? backup() : restore());
} catch (err) {
  console.error(`[${command}] ${(err as Error).message}`);
  process.exitCode = 1;
}
