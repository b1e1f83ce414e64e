// Times one of the clock-driven jobs over the whole population of the
// database DATABASE_URL names, in a process of its own so that its peak
// memory is its own; prints one JSON line. Run by `npm run bench:api`.
//   tsx scripts/bench-jobs.ts sweep   the job the hourly sweep schedules at a
//                                     client's midnight (flag evaluation, then
//                                     the stored weeks when a new week began),
//                                     for every client, one after another
//   tsx scripts/bench-jobs.ts mail    the hourly scheduled mail (digests,
//                                     reminders, weekly summaries) at 20:30
//                                     in the first clinic's time zone
// Everything runs in one transaction that is rolled back: the database is
// left as it was, so the benchmark can be repeated on the same data.
import { DateTime } from 'luxon';
import { closeDatabase, maintenanceKnex } from '../src/lib/data';
import { sendScheduledEmails } from '../src/lib/notifications/scheduled';
import { refreshAdherenceIfNeeded } from '../src/lib/supervision/adherence-store';
import { evaluateClientFlags } from '../src/lib/supervision/flag-store';

const job = process.argv[2];
if (job !== 'sweep' && job !== 'mail') {
  console.error('usage: tsx scripts/bench-jobs.ts sweep|mail');
  process.exit(64);
}
const mb = (kb: number) => Math.round(kb / 1024);
const knex = maintenanceKnex();
const trx = await knex.transaction();
try {
  const clinic = await trx('clinics').orderBy('created_at').first('time_zone');
  const clients: { id: string }[] = await trx('clients').whereNull('archived_at').select('id');
  const rssBefore = mb(process.resourceUsage().maxRSS);
  const heapBefore = process.memoryUsage().heapUsed;
  const started = process.hrtime.bigint();
  let detail: Record<string, unknown>;
  if (job === 'sweep') {
    const now = new Date();
    let changes = 0;
    for (const c of clients) {
      changes += (await evaluateClientFlags(trx, c.id, now)).length;
      await refreshAdherenceIfNeeded(trx, c.id, now);
    }
    detail = { clients: clients.length, changes };
  } else {
    let at = DateTime.now().setZone(clinic?.time_zone ?? 'UTC').set({ hour: 20, minute: 30, second: 0, millisecond: 0 });
    if (at.toMillis() > Date.now()) at = at.minus({ days: 1 });
    const sent = await sendScheduledEmails(trx, at.toJSDate());
    detail = { clients: clients.length, at: at.toISO(), ...sent };
  }
  const ms = Number(process.hrtime.bigint() - started) / 1e6;
  console.log(JSON.stringify({ job, ms: Math.round(ms), peakRssMb: mb(process.resourceUsage().maxRSS), rssBeforeMb: rssBefore, heapGrowthMb: Math.round((process.memoryUsage().heapUsed - heapBefore) / 2 ** 20), ...detail }));
} finally {
  await trx.rollback();
  await closeDatabase();
}
