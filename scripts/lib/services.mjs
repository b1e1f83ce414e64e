// Starting and stopping the local services Kinloop runs on: its own PostgreSQL
// cluster, the S3 stand-in and the SMTP fake. Plain Node, no dependencies beyond
// what `ensureDependencies` installs, so that `npm start` works on a fresh clone.
import { spawn, spawnSync } from 'node:child_process';
import { chmodSync, chownSync, existsSync, mkdirSync, readdirSync, rmSync, statSync, writeFileSync } from 'node:fs';
import path from 'node:path';

const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;

export function log(message) {
  process.stdout.write(`[kinloop] ${message}\n`);
}

export function run(cmd, args, opts = {}) {
  const result = spawnSync(cmd, args, { stdio: opts.quiet ? 'pipe' : 'inherit', encoding: 'utf8', ...opts });
  if (result.error) throw result.error;
  if (result.status !== 0 && !opts.allowFailure) {
    const detail = opts.quiet ? `\n${result.stdout ?? ''}${result.stderr ?? ''}` : '';
    throw new Error(`${cmd} ${args.join(' ')} exited with ${result.status}${detail}`);
  }
  return result;
}

/** Installs npm dependencies from the lock file when they are missing or older than it. */
export function ensureDependencies(root) {
  const marker = path.join(root, 'node_modules', '.package-lock.json');
  const lock = path.join(root, 'package-lock.json');
  if (existsSync(marker) && statSync(marker).mtimeMs >= statSync(lock).mtimeMs) return;
  log('installing dependencies (npm ci)…');
  run('npm', ['ci', '--no-audit', '--no-fund'], { cwd: root });
}

let aptUpdated = false;
/** Installs a Debian package by name; used for PostgreSQL and Chromium. */
export function aptInstall(packages) {
  if (!isRoot) {
    throw new Error(
      `Kinloop needs the Debian package(s) ${packages.join(', ')}. Install them with: sudo apt-get install -y ${packages.join(' ')}`,
    );
  }
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  if (!aptUpdated) {
    log('apt-get update…');
    run('apt-get', ['update', '-qq'], { env });
    aptUpdated = true;
  }
  log(`installing ${packages.join(', ')} from Debian's packages…`);
  run('apt-get', ['install', '-y', '-qq', '--no-install-recommends', '-o', 'Dpkg::Options::=--force-confold', ...packages], { env });
}

export function findPostgresBin() {
  const base = '/usr/lib/postgresql';
  if (!existsSync(base)) return null;
  const versions = readdirSync(base)
    .filter((v) => existsSync(path.join(base, v, 'bin', 'pg_ctl')))
    .sort((a, b) => Number(b) - Number(a));
  return versions.length ? path.join(base, versions[0], 'bin') : null;
}

export function ensurePostgresInstalled() {
  let bin = findPostgresBin();
  if (bin) return bin;
  // Debian's package would otherwise create and start a cluster of its own on 5432.
  mkdirSync('/etc/postgresql-common', { recursive: true });
  writeFileSync('/etc/postgresql-common/createcluster.conf', 'create_main_cluster = false\n');
  aptInstall(['postgresql']);
  bin = findPostgresBin();
  if (!bin) throw new Error('PostgreSQL was installed but its server binaries were not found under /usr/lib/postgresql');
  return bin;
}

export function ensureChromiumInstalled() {
  if (existsSync('/usr/bin/chromium')) return;
  aptInstall(['chromium']);
}

/** Runs a PostgreSQL binary as the cluster owner: PostgreSQL refuses to run as root. */
function asPgOwner(cmd, args, opts = {}) {
  if (isRoot) return run('runuser', ['-u', 'postgres', '--', cmd, ...args], opts);
  return run(cmd, args, opts);
}

function ownDir(dir) {
  mkdirSync(dir, { recursive: true, mode: 0o700 });
  if (isRoot) {
    const { uid, gid } = postgresIds();
    chownSync(dir, uid, gid);
  }
}

function postgresIds() {
  const out = run('id', ['-u', 'postgres'], { quiet: true }).stdout.trim();
  const gid = run('id', ['-g', 'postgres'], { quiet: true }).stdout.trim();
  return { uid: Number(out), gid: Number(gid) };
}

export function pgPaths(config) {
  return {
    data: path.join(config.dataDir, 'pg'),
    socket: path.join(config.dataDir, 'pg-run'),
    log: path.join(config.dataDir, 'postgres.log'),
  };
}

/** Stops a cluster left running by an earlier run that did not shut down cleanly. */
export function stopStaleCluster(bin, config) {
  const { data } = pgPaths(config);
  if (!existsSync(path.join(data, 'postmaster.pid'))) return;
  asPgOwner(path.join(bin, 'pg_ctl'), ['-D', data, 'stop', '-m', 'fast', '-w'], { quiet: true, allowFailure: true });
}

/**
 * PostgreSQL runs as its own user and must pass through the private data
 * folder, and every folder above it, to reach its cluster. Folders of the
 * project (the data folder, a test's folder around it) get search permission
 * for postgres's group only, never read and nothing for others; a folder
 * outside the project that it cannot pass is reported, not changed.
 */
function letPostgresReach(config) {
  const { gid } = postgresIds();
  const canPass = (dir) => run('runuser', ['-u', 'postgres', '--', 'test', '-x', dir], { quiet: true, allowFailure: true }).status === 0;
  const chain = [];
  for (let dir = config.dataDir; dir !== path.dirname(dir); dir = path.dirname(dir)) chain.unshift(dir);
  for (const dir of chain) {
    if (canPass(dir)) continue;
    const inProject = dir === config.dataDir || !path.relative(config.root, dir).startsWith('..');
    if (!inProject) {
      throw new Error(`PostgreSQL runs as the postgres user and cannot pass through ${dir} to reach ${config.dataDir}; allow it (for example chmod o+x ${dir}) or choose another KINLOOP_DATA_DIR`);
    }
    const { uid, mode } = statSync(dir);
    chownSync(dir, uid, gid);
    chmodSync(dir, (mode & 0o700) | 0o010);
  }
}

/**
 * Creates (first run) and starts the project's own cluster on 127.0.0.1, then
 * makes sure its two roles and the database exist: `kinloop_owner` owns the
 * database and runs the migrations, `kinloop` is the app's role (granted its
 * table rights by `scripts/db.ts migrate`). Returns a stop function.
 */
export function startPostgres(bin, config) {
  const { data, socket, log: logFile } = pgPaths(config);
  if (isRoot) letPostgresReach(config);
  ownDir(socket);
  if (!existsSync(path.join(data, 'PG_VERSION'))) {
    log(`creating the database cluster in ${data}…`);
    ownDir(data);
    asPgOwner(path.join(bin, 'initdb'), [
      '-D', data, '-U', 'postgres', '-E', 'UTF8', '--no-locale',
      // The socket lives in a 0700 folder of ours, so only its owner reaches it.
      '--auth-local=trust', '--auth-host=scram-sha-256',
    ], { quiet: true });
  }
  if (isRoot) {
    const { uid, gid } = postgresIds();
    if (!existsSync(logFile)) writeFileSync(logFile, '', { mode: 0o600 });
    chownSync(logFile, uid, gid);
  }
  stopStaleCluster(bin, config);
  log(`starting PostgreSQL on 127.0.0.1:${config.pgPort}…`);
  asPgOwner(path.join(bin, 'pg_ctl'), [
    '-D', data, '-l', logFile, '-w', '-t', '60',
    '-o', `-c listen_addresses=127.0.0.1 -p ${config.pgPort} -k ${socket} -c fsync=${config.pgFsync ?? 'on'}`,
    'start',
  ], { quiet: true });

  const psql = (sql, db = 'postgres') =>
    run(path.join(bin, 'psql'), ['-X', '-q', '-t', '-A', '-h', socket, '-p', String(config.pgPort), '-U', 'postgres', '-d', db, '-v', 'ON_ERROR_STOP=1', '-c', sql], { quiet: true }).stdout.trim();
  const literal = (v) => `'${v.replace(/'/g, "''")}'`;
  const ensureRole = (name, password, options) => {
    const verb = psql(`SELECT 1 FROM pg_roles WHERE rolname = ${literal(name)}`) === '1' ? 'ALTER' : 'CREATE';
    psql(`${verb} ROLE ${name} ${options} PASSWORD ${literal(password)}`);
  };
  const owner = config.pgOwnerRole;
  const app = config.pgAppRole;
  ensureRole(owner, config.pgOwnerPassword, 'LOGIN NOSUPERUSER NOCREATEROLE NOCREATEDB');
  // CREATEDB lets tests make throwaway databases of their own in the cluster.
  ensureRole(app, config.pgPassword, 'LOGIN NOSUPERUSER NOCREATEROLE CREATEDB');
  if (psql("SELECT 1 FROM pg_database WHERE datname = 'kinloop'") !== '1') {
    psql(`CREATE DATABASE kinloop OWNER ${owner}`);
  }
  // A cluster made before the owner role existed has everything owned by the
  // app's role: hand the database and its tables to the owner.
  psql(`ALTER DATABASE kinloop OWNER TO ${owner}`);
  psql(`DO $$ DECLARE r record; BEGIN
    FOR r IN SELECT c.relname, c.relkind FROM pg_class c JOIN pg_namespace n ON n.oid = c.relnamespace
             WHERE n.nspname = 'public' AND c.relkind IN ('r', 'p', 'v', 'm', 'S') AND pg_get_userbyid(c.relowner) = ${literal(app)}
               AND NOT (c.relkind = 'S' AND EXISTS (SELECT 1 FROM pg_depend d WHERE d.objid = c.oid AND d.deptype IN ('a', 'i')))
    LOOP EXECUTE format('ALTER %s public.%I OWNER TO ${owner}', CASE r.relkind WHEN 'S' THEN 'SEQUENCE' WHEN 'v' THEN 'VIEW' WHEN 'm' THEN 'MATERIALIZED VIEW' ELSE 'TABLE' END, r.relname);
    END LOOP;
    FOR r IN SELECT p.oid::regprocedure AS fn FROM pg_proc p JOIN pg_namespace n ON n.oid = p.pronamespace
             WHERE n.nspname = 'public' AND pg_get_userbyid(p.proowner) = ${literal(app)}
    LOOP EXECUTE format('ALTER FUNCTION %s OWNER TO ${owner}', r.fn);
    END LOOP;
  END $$`, 'kinloop');
  // The job queue (pg-boss) creates and migrates a schema of its own at start, as the app.
  psql(`GRANT CONNECT, TEMPORARY, CREATE ON DATABASE kinloop TO ${app}`);

  return () => {
    asPgOwner(path.join(bin, 'pg_ctl'), ['-D', data, 'stop', '-m', 'fast', '-w'], { quiet: true, allowFailure: true });
  };
}

/**
 * Keeps track of the long-running processes one command started, so that
 * Ctrl-C (or a failure) stops every one of them.
 */
export class Supervisor {
  constructor() {
    this.children = [];
    this.stops = [];
    this.stopping = false;
  }

  /** Registers a clean-up that runs (last registered first) when everything stops. */
  onStop(fn) {
    this.stops.push(fn);
  }

  /**
   * Starts a process and resolves when a line of its output matches `ready`.
   * A process that exits before that rejects with its output.
   */
  start(name, cmd, args, { env, cwd, ready, timeoutMs = 120_000, echo = false } = {}) {
    const child = spawn(cmd, args, { env, cwd, stdio: ['ignore', 'pipe', 'pipe'] });
    this.children.push({ name, child });
    let output = '';
    return new Promise((resolve, reject) => {
      const timer = setTimeout(() => reject(new Error(`${name} did not start within ${timeoutMs / 1000} s\n${output}`)), timeoutMs);
      let isReady = !ready;
      const onData = (stream) => (chunk) => {
        const text = chunk.toString();
        if (!isReady) output += text;
        if (echo || isReady) stream.write(text.replace(/^(?=.)/gm, `[${name}] `));
        if (!isReady && ready.test(output)) {
          isReady = true;
          clearTimeout(timer);
          resolve(child);
        }
      };
      child.stdout.on('data', onData(process.stdout));
      child.stderr.on('data', onData(process.stderr));
      child.on('exit', (code, signal) => {
        clearTimeout(timer);
        if (!isReady) reject(new Error(`${name} exited (${signal ?? code}) before it was ready\n${output}`));
        else if (!this.stopping) log(`${name} stopped (${signal ?? code})`);
      });
      if (isReady) resolve(child);
    });
  }

  async stopAll() {
    if (this.stopping) return;
    this.stopping = true;
    await Promise.all(
      this.children.reverse().map(
        ({ child }) =>
          new Promise((resolve) => {
            if (child.exitCode !== null || child.signalCode !== null) return resolve();
            const kill = setTimeout(() => child.kill('SIGKILL'), 5000);
            child.once('exit', () => {
              clearTimeout(kill);
              resolve();
            });
            child.kill('SIGTERM');
          }),
      ),
    );
    for (const stop of this.stops.reverse()) {
      try {
        await stop();
      } catch (err) {
        log(`while stopping: ${err.message}`);
      }
    }
  }
}

export function startS3(supervisor, config) {
  const dir = path.join(config.dataDir, 's3');
  mkdirSync(dir, { recursive: true, mode: 0o700 });
  log(`starting the S3 stand-in on 127.0.0.1:${config.s3Port}…`);
  return supervisor.start('s3', process.execPath, [
    path.join(config.root, 's3-fake', 'launch.mjs'),
    '--port', String(config.s3Port), '--directory', dir, '--bucket', config.s3Bucket,
  ], { ready: /s3-fake ready/ });
}

export function startSmtp(supervisor, config) {
  mkdirSync(config.mailboxDir, { recursive: true, mode: 0o700 });
  log(`starting the SMTP fake on 127.0.0.1:${config.smtpPort}…`);
  return supervisor.start('mail', process.execPath, [
    path.join(config.root, 'scripts', 'mail-fake.mjs'),
    '--port', String(config.smtpPort), '--dir', config.mailboxDir,
  ], { ready: /mail-fake ready/ });
}

export function wipe(dir) {
  rmSync(dir, { recursive: true, force: true });
}

/** Resolves when `url` answers 200, or rejects after `timeoutMs`. */
export async function waitForHttp(url, timeoutMs = 60_000) {
  const deadline = Date.now() + timeoutMs;
  let last = '';
  while (Date.now() < deadline) {
    try {
      const res = await fetch(url);
      if (res.ok) return;
      last = `${res.status} ${await res.text()}`;
    } catch (err) {
      last = err.message;
    }
    await new Promise((r) => setTimeout(r, 300));
  }
  throw new Error(`${url} did not answer 200 within ${timeoutMs / 1000} s (last: ${last})`);
}
