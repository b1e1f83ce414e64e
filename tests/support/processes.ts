// Processes a drill runs on top of the test stack: an app copy, a worker on a
// queue schema of its own, an s3rver. Each is one node process (node with
// tsx's loader rather than the tsx launcher, which keeps a child alive when
// it is killed), so that stopping it really stops it.
import { spawn, type ChildProcess } from 'node:child_process';

export const root = process.env.KINLOOP_ROOT ?? process.cwd();

export interface Started {
  child: ChildProcess;
  /** Everything it printed so far. */
  output: () => string;
}

const running = new Set<ChildProcess>();

export function startProcess(args: string[], env: NodeJS.ProcessEnv, ready: RegExp, timeoutMs = 60_000): Promise<Started> {
  const child = spawn(process.execPath, args, { cwd: root, env: { ...process.env, ...env }, stdio: ['ignore', 'pipe', 'pipe'] });
  running.add(child);
  child.once('exit', () => running.delete(child));
  let out = '';
  return new Promise((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`${args.join(' ')} did not start:\n${out}`)), timeoutMs);
    const onData = (d: Buffer) => {
      out += d.toString();
      if (ready.test(out)) {
        clearTimeout(timer);
        resolve({ child, output: () => out });
      }
    };
    child.stdout!.on('data', onData);
    child.stderr!.on('data', onData);
    child.on('exit', (code, signal) => {
      clearTimeout(timer);
      if (!ready.test(out)) reject(new Error(`${args.join(' ')} exited ${signal ?? code}:\n${out}`));
    });
  });
}

export function stopProcess(child: ChildProcess, signal: NodeJS.Signals = 'SIGTERM'): Promise<void> {
  return new Promise((resolve) => {
    if (child.exitCode !== null || child.signalCode !== null) return resolve();
    child.once('exit', () => resolve());
    child.kill(signal);
  });
}

/** Kills every process started here that is still running. */
export function stopAllProcesses(): Promise<void> {
  return Promise.all([...running].map((c) => stopProcess(c, 'SIGKILL'))).then(() => undefined);
}

export const appArgs = ['scripts/serve.mjs'];
export const workerArgs = ['--import', 'tsx', 'src/worker.ts'];
export const s3Args = (port: number, dir: string) => ['s3-fake/launch.mjs', '--port', String(port), '--directory', dir, '--bucket', 'kinloop-rides'];

/** The ports of the test stack's app, S3 stand-in and PostgreSQL, shifted by `k` (1–9) for a drill's own copies. */
export function drillPorts(k: number) {
  return {
    app: Number(new URL(process.env.KINLOOP_BASE_URL!).port) + k,
    s3: Number(process.env.KINLOOP_S3_PORT ?? 4578) + k,
    pg: Number(process.env.KINLOOP_PG_PORT ?? 54339) + k,
  };
}

/** The child process ids of a process (Linux). */
export async function childrenOf(pid: number): Promise<number[]> {
  const { readFile } = await import('node:fs/promises');
  const text = await readFile(`/proc/${pid}/task/${pid}/children`, 'utf8').catch(() => '');
  return text.trim().split(/\s+/).filter(Boolean).map(Number);
}

export const alive = (pid: number) => {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
};

export async function until<T>(what: string, read: () => Promise<T>, done: (v: T) => boolean, ms = 30_000, every = 200): Promise<T> {
  const deadline = Date.now() + ms;
  for (;;) {
    const v = await read();
    if (done(v)) return v;
    if (Date.now() > deadline) throw new Error(`${what}: still ${JSON.stringify(v)}`);
    await new Promise((r) => setTimeout(r, every));
  }
}
