// A parse process: reads the ride files its worker sends, one at a time, and
// answers with the reading (src/lib/jobs/parse-pool.ts starts it). Parsing
// here keeps a costly or hostile file away from the worker's queue, outbox and
// timers, and bounds its memory: the process has a heap limit of its own and
// ends with its worker.
import { readRideFile } from './lib/rides/reading';
import type { ParseOptions } from './lib/rides/types';

interface Request {
  id: number;
  bytes: Uint8Array;
  options: ParseOptions;
}

process.on('message', (message: Request) => {
  let reply: object;
  try {
    reply = { id: message.id, reading: readRideFile(message.bytes, message.options) };
  } catch (err) {
    reply = { id: message.id, error: (err as Error).message };
  }
  // The peak so far, for the worker's log and `npm run bench:hostile`.
  process.send!({ ...reply, maxRssKb: process.resourceUsage().maxRSS });
});
process.on('disconnect', () => process.exit(0));
process.send!({ ready: true });
