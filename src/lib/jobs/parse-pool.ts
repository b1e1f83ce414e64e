// The worker's parse processes (src/parse-process.ts): a bounded pool of
// child processes, each with a heap limit, that ride files are read in. A
// file that needs more memory or time than allowed ends its process, not the
// worker; the next file gets a new one.
import { fork, type ChildProcess } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import type { RideReader } from '../ingest/process';
import type { RideReading } from '../rides/reading';
import type { ParseOptions } from '../rides/types';

/** V8 heap of one parse process; a 25 MiB file needs about a third of it. */
export const PARSE_HEAP_MB = 256;
/** Reading one file takes seconds at most; this much means something is wrong with the file. */
export const PARSE_TIMEOUT_MS = 120_000;

/** Reading a file did not finish: the parse process ran out of memory or time, or stopped. */
export class ReadStopped extends Error {
  override name = 'ReadStopped';
}

const ENTRY = fileURLToPath(new URL('../../parse-process.ts', import.meta.url));

interface Child {
  process: ChildProcess;
  ready: Promise<void>;
}

export class ParsePool {
  private idle: Child[] = [];
  private running = 0;
  private waiting: (() => void)[] = [];
  private nextId = 1;
  /** The highest peak resident set size a parse process reported, in KiB. */
  peakRssKb = 0;

  constructor(private readonly size: number) {}

  read: RideReader = async (bytes, options) => {
    if (this.running >= this.size) await new Promise<void>((resolve) => this.waiting.push(resolve));
    this.running++;
    const child = this.idle.pop() ?? this.spawn();
    try {
      const reading = await this.ask(child, bytes, options);
      this.idle.push(child);
      return reading;
    } catch (err) {
      child.process.kill('SIGKILL');
      throw err;
    } finally {
      this.running--;
      this.waiting.shift()?.();
    }
  };

  stop(): void {
    for (const child of this.idle.splice(0)) child.process.kill('SIGTERM');
  }

  private spawn(): Child {
    const child = fork(ENTRY, [], {
      // The worker's own loader (tsx) reads the TypeScript entry.
      execArgv: [...process.execArgv.filter((a) => !a.startsWith('--max-old-space-size')), `--max-old-space-size=${PARSE_HEAP_MB}`],
      serialization: 'advanced',
      stdio: ['ignore', 'inherit', 'inherit', 'ipc'],
    });
    const ready = new Promise<void>((resolve, reject) => {
      child.once('message', () => resolve());
      child.once('exit', (code, signal) => reject(new ReadStopped(`the parse process did not start (${signal ?? code})`)));
    });
    ready.catch(() => undefined);
    const entry = { process: child, ready };
    // A process that ends while idle is not handed out again; one that fails
    // mid-file is reported by the exit handler of that file's request.
    child.on('exit', () => {
      this.idle = this.idle.filter((c) => c !== entry);
    });
    child.on('error', (err) => console.error('parse process:', err.message));
    return entry;
  }

  private async ask(child: Child, bytes: Uint8Array, options: ParseOptions): Promise<RideReading> {
    await child.ready;
    const id = this.nextId++;
    return new Promise<RideReading>((resolve, reject) => {
      const done = () => {
        clearTimeout(timer);
        child.process.off('message', onMessage);
        child.process.off('exit', onExit);
      };
      const onMessage = (m: { id?: number; reading?: RideReading; error?: string; maxRssKb?: number }) => {
        if (m.id !== id) return;
        done();
        this.peakRssKb = Math.max(this.peakRssKb, m.maxRssKb ?? 0);
        if (m.reading) resolve(m.reading);
        else reject(new Error(`reading the file failed: ${m.error}`));
      };
      const onExit = (code: number | null, signal: string | null) => {
        done();
        reject(new ReadStopped(`reading the file stopped the parse process (${signal ?? `exit ${code}`}); it probably needed more than the ${PARSE_HEAP_MB} MB a ride file may use`));
      };
      const timer = setTimeout(() => {
        done();
        reject(new ReadStopped(`reading the file took longer than ${PARSE_TIMEOUT_MS / 1000} s`));
      }, PARSE_TIMEOUT_MS);
      child.process.on('message', onMessage);
      child.process.on('exit', onExit);
      child.process.send({ id, bytes, options });
    });
  }
}
