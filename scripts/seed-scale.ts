// The data half of `npm run seed:scale` (scripts/seed-scale.mjs starts the
// services and runs this under tsx): the invented population, written into
// the database DATABASE_URL names, and a note of what was seeded in the data folder.
import { writeFileSync } from 'node:fs';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { config } from '../src/lib/config';
import { closeDatabase, maintenanceKnex } from '../src/lib/data';
import { seedScale } from './lib/scale/load';

export const SEED_NOTE = 'scale-seed.json';

const { values } = parseArgs({
  options: {
    clients: { type: 'string', default: '1000' },
    years: { type: 'string', default: '2' },
    'other-clinics': { type: 'string', default: '2' },
    'series-every': { type: 'string', default: '200' },
    seed: { type: 'string', default: '1' },
    'store-files': { type: 'boolean', default: false },
    password: { type: 'string' },
  },
});
const positive = (name: string, value: string, integer = true) => {
  const n = Number(value);
  if (!Number.isFinite(n) || n <= 0 || (integer && !Number.isInteger(n))) throw new Error(`--${name} must be a positive ${integer ? 'whole ' : ''}number, not ${value}`);
  return n;
};
const started = Date.now();
const now = new Date();
const options = {
  clients: positive('clients', values.clients!),
  years: positive('years', values.years!, false),
  otherClinics: values['other-clinics'] === '0' ? 0 : positive('other-clinics', values['other-clinics']!),
  seriesEvery: positive('series-every', values['series-every']!),
  seed: positive('seed', values.seed!),
  storeFiles: values['store-files']!,
};
try {
  const result = await seedScale(maintenanceKnex(), {
    ...options,
    now,
    password: values.password ?? 'kinloop-demo-2026',
    databaseUrl: config().databaseUrl,
    log: (m) => console.log(`[seed:scale] ${m}`),
  });
  const seconds = Math.round((Date.now() - started) / 1000);
  writeFileSync(path.join(config().dataDir, SEED_NOTE), JSON.stringify({ seededAt: now.toISOString(), seconds, options, result }, null, 2) + '\n');
  console.log(`[seed:scale] done in ${seconds} s: ${JSON.stringify(result)}`);
} finally {
  await closeDatabase();
}
