// The demo's six months of riding, put in through the same path as a real
// upload: each generated file is stored in object storage, registered as an
// upload and parsed by the ingest job's own code, so the seed exercises the
// parser on every layout. Then prescriptions, pauses and flags follow.
import type { Db, Query } from '../data/db';
import { randomUUID, createHash } from 'node:crypto';
import { Readable } from 'node:stream';
import { processUpload } from '../ingest/process';
import { registerUploads } from '../ingest/register';
import { putObjectStream } from '../storage/s3';
import { evaluateClientFlags } from '../supervision/flag-store';
import { generateRide } from './ride-generator';
import { RIDE_LAYOUTS } from './ride-layouts';
import { demoPauses, demoPrescriptions, demoRidePlan } from './ride-story';
import { DEMO_CARERS, DEMO_CLIENTS } from './scenario';
import type { SeededIds } from './seed';

export async function seedDemoRides(knex: Db, ids: SeededIds, now: Date): Promise<{ files: number; flags: number }> {
  const prescriptions = demoPrescriptions(now);
  for (const [key, versions] of Object.entries(prescriptions)) {
    const client = DEMO_CLIENTS.find((c) => c.key === key)!;
    await knex('prescriptions').insert(
      versions.map((v, i) => ({
        client_id: ids.clients[key],
        version: i + 1,
        effective_from: v.effectiveFrom,
        sessions_per_week: v.sessionsPerWeek,
        minutes_per_session: v.minutesPerSession,
        warmup_minutes: v.warmupMinutes,
        target_cadence_rpm: v.targetCadenceRpm,
        cadence_tolerance_rpm: v.cadenceToleranceRpm,
        resistance: v.resistance,
        channels: JSON.stringify(v.channels),
        notes: v.notes,
        created_by: ids.users[client.therapist],
      })),
    );
  }
  for (const p of demoPauses(now)) {
    const client = DEMO_CLIENTS.find((c) => c.key === p.clientKey)!;
    await knex('pauses').insert({ client_id: ids.clients[p.clientKey], starts_on: p.from, ends_on: p.to, reason: p.reason, created_by: ids.users[client.therapist] });
  }

  // A linked carer uploads where there is one, else the client's therapist.
  const uploader = (clientKey: string) => {
    const carer = DEMO_CARERS.find((c) => c.links.some((l) => l.client === clientKey));
    return ids.users[carer?.key ?? DEMO_CLIENTS.find((c) => c.key === clientKey)!.therapist];
  };
  const plan = demoRidePlan(now);
  const seedRide = async (ride: (typeof plan)[number]) => {
    const bytes = RIDE_LAYOUTS[ride.layout].write(generateRide(ride.spec, ride.seed));
    const clientId = ids.clients[ride.clientKey];
    const key = `rides/${ids.clinicId}/${clientId}/${randomUUID()}`;
    await putObjectStream(key, Readable.from([Buffer.from(bytes)]), 'text/csv');
    const [upload] = await registerUploads(knex, {
      clientId,
      clinicId: ids.clinicId,
      userId: uploader(ride.clientKey),
      importProfileId: null,
      files: [{ name: ride.fileName, storageKey: key, sha256: createHash('sha256').update(bytes).digest('hex'), byteSize: bytes.length, fallbackStartedAt: null }],
    });
    await knex('uploads').where({ id: upload.id }).update({ uploaded_at: new Date(Math.min(Date.parse(ride.spec.startedAt) + 3 * 3600_000, now.getTime())) });
    await processUpload(knex, upload.id);
  };
  // Clients in parallel (each client's files in order), to keep `npm start` and `npm test` quick.
  const byClient = [...new Set(plan.map((r) => r.clientKey))].map((key) => plan.filter((r) => r.clientKey === key));
  const next = byClient[Symbol.iterator]();
  const lane = async () => {
    for (let rides = next.next(); !rides.done; rides = next.next()) for (const ride of rides.value) await seedRide(ride);
  };
  await Promise.all([lane(), lane(), lane()]);

  let flags = 0;
  for (const clientId of Object.values(ids.clients)) flags += (await evaluateClientFlags(knex, clientId, now)).filter((c) => c.type === 'raise').length;
  return { files: plan.length, flags };
}
