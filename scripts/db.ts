// Database tasks for `npm start` and `npm test`:
//   tsx scripts/db.ts migrate        run pending migrations as the owner role (DATABASE_OWNER_URL),
//                                    then grant the app's role (DATABASE_URL) what it may do
//   tsx scripts/db.ts seed           seed the demo scenario when the database has no clinic yet
import { config } from '../src/lib/config';
import { closeDatabase, maintenanceDb } from '../src/lib/data';
import { migrateAsOwner } from '../src/lib/db/migrate';
import { stopQueue } from '../src/lib/jobs/queue';
import { seedDemoIfEmpty } from '../src/lib/demo/seed';
import { refreshStaleAdherence } from '../src/lib/supervision/adherence-store';

/** Each client's stored weeks (src/lib/adherence/stored.ts) after a migration or seed, so lists read them at once. */
async function storeWeeks(): Promise<void> {
  const started = Date.now();
  const n = await refreshStaleAdherence(maintenanceDb());
  if (n) console.log(`stored the weeks of ${n} client${n === 1 ? '' : 's'} (${((Date.now() - started) / 1000).toFixed(1)} s)`);
}

const tasks = process.argv.slice(2);
try {
  for (const task of tasks) {
    if (task === 'migrate') {
      const { databaseUrl, databaseOwnerUrl } = config();
      const { applied, appRole, protectedAuditLog } = await migrateAsOwner(databaseUrl, databaseOwnerUrl);
      console.log(applied.length ? `migrations applied: ${applied.join(', ')}` : 'database schema is up to date');
      if (!protectedAuditLog) {
        console.warn(`migrations ran as the app's own role (${appRole}): the audit log is not protected from it; set DATABASE_OWNER_URL (see DEVELOPERS.md)`);
      }
      await storeWeeks();
    } else if (task === 'seed') {
      const started = Date.now();
      const seeded = await seedDemoIfEmpty(maintenanceDb(), { password: process.env.KINLOOP_DEMO_PASSWORD ?? 'kinloop-demo-2026' });
      console.log(
        seeded
          ? `demo scenario seeded: ${Object.keys(seeded.clients).length} clients, ${seeded.files} ride files through the ingest path, ${seeded.flags} flags (${((Date.now() - started) / 1000).toFixed(1)} s)`
          : 'database already has data: demo seed skipped',
      );
      await storeWeeks();
    } else {
      console.error(`unknown task ${task}; use migrate or seed`);
      process.exitCode = 64;
    }
  }
} finally {
  await stopQueue();
  await closeDatabase();
}
