// `npm run worker`: the background worker as its own process, for running it
// apart from the app server (start the server with KINLOOP_WORKER=off then).
import { closeDb } from './lib/db/knex';
import { startBackgroundWork } from './lib/jobs/background';
import { stopQueue } from './lib/jobs/queue';

await startBackgroundWork();
console.log('kinloop worker ready');

const stop = async () => {
  await stopQueue();
  await closeDb();
  process.exit(0);
};
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
