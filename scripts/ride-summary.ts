// Prints the canonical summary of one ride file as JSON.
// Usage: npm run --silent ride:summary -- <file> [--metres-per-rev N]
// Exit codes (sysexits.h): 0 summary printed, 2 file refused (error JSON on
// stdout), 64 bad usage, 66 file cannot be read.

import { readFileSync } from 'node:fs';
import { SUMMARY_FIELDS } from '../src/lib/rides/metrics';
import { parseRide } from '../src/lib/rides/parse';
import type { RideSummary } from '../src/lib/rides/types';

const USAGE = 'usage: ride-summary <file> [--metres-per-rev N]';
const EX_USAGE = 64;
const EX_NOINPUT = 66;
const EXIT_REFUSED = 2;

function fail(message: string, code: number): never {
  process.stderr.write(`${message}\n`);
  process.exit(code);
}

function parseArgs(argv: string[]): { file: string; metresPerRev?: number } {
  let file: string | undefined;
  let metresPerRev: number | undefined;
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i];
    if (arg === '--metres-per-rev' || arg.startsWith('--metres-per-rev=')) {
      const value = arg.includes('=') ? arg.slice(arg.indexOf('=') + 1) : argv[++i];
      const n = value === undefined || value.trim() === '' ? NaN : Number(value);
      if (!Number.isFinite(n) || n <= 0) fail(`--metres-per-rev needs a positive number of metres\n${USAGE}`, EX_USAGE);
      metresPerRev = n;
    } else if (arg.startsWith('-') && arg !== '-') {
      fail(`unknown option ${arg}\n${USAGE}`, EX_USAGE);
    } else if (file === undefined) {
      file = arg;
    } else {
      fail(`only one file, please\n${USAGE}`, EX_USAGE);
    }
  }
  if (file === undefined) fail(USAGE, EX_USAGE);
  return { file, metresPerRev };
}

/** The summary with its fields in PRODUCT.md order. */
function ordered(summary: RideSummary): Record<string, unknown> {
  return Object.fromEntries(SUMMARY_FIELDS.map((k) => [k, summary[k]]));
}

const { file, metresPerRev } = parseArgs(process.argv.slice(2));
let bytes: Uint8Array;
try {
  bytes = readFileSync(file === '-' ? 0 : file);
} catch (e) {
  fail(`cannot read ${file}: ${(e as Error).message}`, EX_NOINPUT);
}
const result = parseRide(bytes, metresPerRev === undefined ? {} : { metresPerRev });
if (result.ok) {
  process.stdout.write(`${JSON.stringify(ordered(result.summary), null, 2)}\n`);
} else {
  process.stdout.write(`${JSON.stringify({ error: result.error })}\n`);
  process.exitCode = EXIT_REFUSED;
}
