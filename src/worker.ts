// `npm run worker`: the background worker (parse jobs, flags, mail, sweeps)
// as its own process. `npm start` runs one beside the app; more can run for a
// scaled-out setup, all sharing the job queue in PostgreSQL.
import { closeDatabase } from './lib/data';
import { startBackgroundWork, stopBackgroundWork } from './lib/jobs/background';
import { stopQueue } from './lib/jobs/queue';

await startBackgroundWork();
console.log('kinloop worker ready');

const stop = async () => {
  stopBackgroundWork();
  await stopQueue();
  await closeDatabase();
  process.exit(0);
};
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
