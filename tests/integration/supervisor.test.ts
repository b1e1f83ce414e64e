// `npm start` supervises what it starts: a process that exits unexpectedly is
// restarted after a growing wait, and each restart is logged; stopping
// everything (Ctrl-C) stops it for good.
import { mkdtempSync, readFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { Supervisor } from '../../scripts/lib/services.mjs';
import { until } from '../support/processes';

afterEach(() => {
  vi.restoreAllMocks();
});

/** A process that notes each start in `file`, says it is ready, and exits with 3 after `lifeMs`. */
const shortLived = (file: string, lifeMs: number) => [
  '-e',
  `require('fs').appendFileSync(${JSON.stringify(file)}, Date.now() + '\\n'); console.log('ready'); setTimeout(() => process.exit(3), ${lifeMs});`,
];

describe('the supervisor', () => {
  it('restarts a process that exits, waiting 1 s, then 2 s, and logs each restart; stopping ends it for good', { timeout: 30_000 }, async () => {
    const lines: string[] = [];
    const write = process.stdout.write.bind(process.stdout);
    vi.spyOn(process.stdout, 'write').mockImplementation((chunk: string | Uint8Array, ...rest: unknown[]) => {
      lines.push(String(chunk));
      return write(chunk as string, ...(rest as []));
    });
    const file = path.join(mkdtempSync(path.join(os.tmpdir(), 'kinloop-supervisor-')), 'starts');
    const supervisor = new Supervisor();
    await supervisor.start('flaky', process.execPath, shortLived(file, 200), { ready: /ready/ });
    const starts = () => Promise.resolve(readFileSync(file, 'utf8').trim().split('\n').map(Number));
    const times = await until('three starts', starts, (s) => s.length >= 3, 20_000);
    // Each start: 0.2 s of life, then the wait (1 s, then 2 s); process start-up adds a little.
    expect(times[1] - times[0]).toBeGreaterThanOrEqual(1200);
    expect(times[2] - times[1]).toBeGreaterThanOrEqual(2200);
    const restarts = lines.filter((l) => /flaky exited unexpectedly \(exit 3\); restarting it in/.test(l));
    expect(restarts[0]).toMatch(/in 1 s/);
    expect(restarts[1]).toMatch(/in 2 s/);

    await supervisor.stopAll();
    // No restart is pending and the last copy has ended: nothing can start it again.
    expect(supervisor.services.every((s: { timer: unknown }) => s.timer === null)).toBe(true);
    expect(supervisor.services.every((s: { child: { exitCode: number | null; signalCode: string | null } }) => s.child.exitCode !== null || s.child.signalCode !== null)).toBe(true);
  });

  it('stops a healthy process on stopAll without restarting it', { timeout: 20_000 }, async () => {
    const file = path.join(mkdtempSync(path.join(os.tmpdir(), 'kinloop-supervisor-')), 'starts');
    const supervisor = new Supervisor();
    const child = await supervisor.start('steady', process.execPath, shortLived(file, 60_000), { ready: /ready/ });
    await supervisor.stopAll();
    expect(child.signalCode).toBe('SIGTERM');
    expect(supervisor.services.every((s: { timer: unknown }) => s.timer === null)).toBe(true);
    expect(readFileSync(file, 'utf8').trim().split('\n')).toHaveLength(1);
  });
});
