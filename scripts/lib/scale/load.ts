// Puts the planned population into the database: people and programs with
// batched inserts, sessions (uploads, rides, series, checks) with COPY in
// chunks of clients, then the session flags as Kinloop's own flag planner
// judges them over each client's whole history.
import type { Knex } from 'knex';
import pg from 'pg';
import { createHash, randomBytes, randomUUID } from 'node:crypto';
import { Readable } from 'node:stream';
import { hashPassword } from '../../../src/lib/auth/password';
import { baselineSystolic } from '../../../src/lib/checks/baseline';
import { evaluateCheck, type CheckCondition } from '../../../src/lib/checks/evaluate-check';
import type { ClientRow } from '../../../src/lib/db/tables';
import { DEMO_CLINIC } from '../../../src/lib/demo/scenario';
import { between, integerBetween, mulberry32, normal, seedOf, type Random } from '../../../src/lib/demo/prng';
import { generateRide } from '../../../src/lib/demo/ride-generator';
import { RIDE_LAYOUTS } from '../../../src/lib/demo/ride-layouts';
import { planFlagChanges } from '../../../src/lib/flags';
import { summarise } from '../../../src/lib/rides/metrics';
import { encodeSeries, SERIES_FORMAT } from '../../../src/lib/rides/series-codec';
import { putObjectStream } from '../../../src/lib/storage/s3';
import { flagInput, loadHistories } from '../../../src/lib/supervision/history';
import { copyRows, type Row } from './copy';
import { CHANNEL_LIMITS, clientSessions, dateOf, dayNumber, planPopulation, type PlannedClient, type PlannedUser, type PopulationOptions } from './population';
import { calibrate, modelSummary, seriesOf } from './summary';

export interface ScaleSeedOptions extends PopulationOptions {
  /** Every n-th session (and each client's latest) gets its sample series. */
  seriesEvery: number;
  /** Also store the ride files of the sessions with a series in object storage. */
  storeFiles: boolean;
  password: string;
  databaseUrl: string;
  log: (message: string) => void;
}

const CHUNK_CLIENTS = 50;
/** Bytes per sample row of each layout's file, for the size of files not stored. */
const ROW_BYTES = { A: 80, B: 60, C: 110 } as const;
const NOTES = [
  'Phoned to review the home program; comfortable with the current settings.',
  'Carer reports good tolerance; skin checked after rides, no concerns.',
  'Discussed fitting sessions around work; agreed to keep the weekdays.',
  'Reviewed pad placement by video call; quadriceps response improved.',
  'Asked to record blood pressure before and after each ride for the next fortnight.',
  'Spasms eased with a longer warm-up; keep five minutes.',
];
const SKIN_SITES = ['sacrum', 'heels', 'ischial_left', 'ischial_right', 'quadriceps_left', 'quadriceps_right'];

export interface ScaleSeedResult {
  clinics: number;
  clients: number;
  users: number;
  sessions: number;
  seriesRows: number;
  storedFiles: number;
  checks: number;
  flags: number;
}

export async function seedScale(knex: Knex, o: ScaleSeedOptions): Promise<ScaleSeedResult> {
  const demo = await knex('clinics').where({ name: DEMO_CLINIC.name }).first('id', 'name', 'time_zone');
  const population = planPopulation(o, demo ? { id: demo.id, name: demo.name, timeZone: demo.time_zone } : null);
  const passwordHash = await hashPassword(o.password);
  const random = mulberry32(seedOf(`scale:${o.seed}:rows`));
  const now = o.now;

  // People and programs.
  const clinicIds = new Map<string, string>();
  const users: Row[] = [];
  const memberships: Row[] = [];
  const addUser = (u: PlannedUser) => {
    u.id = randomUUID();
    users.push({ id: u.id, email: u.email, name: u.name, password_hash: passwordHash });
  };
  const newClinics: Row[] = [];
  for (const c of population.clinics) {
    const id = c.existingId ?? randomUUID();
    clinicIds.set(c.key, id);
    if (!c.existingId) newClinics.push({ id, name: c.name, time_zone: c.timeZone });
    addUser(c.admin);
    memberships.push({ user_id: c.admin.id, clinic_id: id, role: 'admin' });
    for (const t of c.therapists) {
      addUser(t);
      memberships.push({ user_id: t.id, clinic_id: id, role: 'therapist' });
    }
  }
  for (const carer of population.carers) addUser(carer.user);
  const clientIds: string[] = [];
  const clientRows: Row[] = [];
  const devices: Row[] = [];
  const deviceOf = new Map<number, string>();
  for (const c of population.clients) {
    if (c.account) addUser(c.account);
    const id = randomUUID();
    clientIds.push(id);
    clientRows.push({
      id,
      clinic_id: clinicIds.get(c.clinicKey),
      display_name: c.name,
      date_of_birth: c.dateOfBirth,
      diagnosis: c.diagnosis,
      injury_level: c.injuryLevel,
      ais_grade: c.aisGrade,
      ad_risk: c.adRisk,
      time_zone: c.timeZone,
      body_mass_kg: c.bodyMassKg,
      program_start: c.programStart,
      user_id: c.account?.id ?? null,
      primary_therapist_id: c.therapist.id,
      baseline_systolic: c.baselineSystolic,
      archived_at: c.archivedOn ? new Date(`${c.archivedOn}T12:00:00Z`) : null,
      created_at: new Date(`${c.programStart}T09:00:00Z`),
    });
    if (c.serial) {
      const deviceId = randomUUID();
      deviceOf.set(c.index, deviceId);
      devices.push({ id: deviceId, clinic_id: clinicIds.get(c.clinicKey), serial: c.serial, name: RIDE_LAYOUTS[c.layout].deviceName });
    }
  }
  const carerLinks = population.carers.flatMap((carer) => carer.links.map((l) => ({ carer_user_id: carer.user.id, client_id: clientIds[l.clientIndex], relationship: l.relationship })));
  const prescriptions: Row[] = [];
  const pauses: Row[] = [];
  const notes: Row[] = [];
  const goals: Row[] = [];
  for (const c of population.clients) {
    const id = clientIds[c.index];
    const channels = Object.fromEntries(Object.entries(c.maxCurrentsMa).map(([ch, max]) => [ch, { maxCurrentMa: max, ...CHANNEL_LIMITS }]));
    c.versions.forEach((v, i) =>
      prescriptions.push({
        client_id: id,
        version: i + 1,
        effective_from: v.effectiveFrom,
        sessions_per_week: v.sessionsPerWeek,
        minutes_per_session: v.minutesPerSession,
        warmup_minutes: 5,
        target_cadence_rpm: c.cadenceRpm,
        cadence_tolerance_rpm: 5,
        resistance: v.resistance,
        channels: JSON.stringify(channels),
        notes: v.notes,
        created_by: c.therapist.id,
        created_at: new Date(`${v.effectiveFrom}T08:00:00Z`),
      }),
    );
    for (const p of c.pauses) pauses.push({ client_id: id, starts_on: p.from, ends_on: p.to, reason: p.reason, created_by: c.therapist.id, created_at: new Date(`${p.from}T08:00:00Z`) });
    const start = dayNumber(c.programStart);
    const span = Math.max(1, dayNumber(dateOf(Math.floor(now.getTime() / 86_400_000))) - start);
    for (let i = integerBetween(random, 0, 3); i > 0; i--) {
      notes.push({ client_id: id, author_id: c.therapist.id, body: NOTES[integerBetween(random, 0, NOTES.length - 1)], created_at: new Date((start + integerBetween(random, 0, span - 1)) * 86_400_000 + 15 * 3600_000) });
    }
    if (c.goalRoute) {
      const chooser = c.account ?? population.carers.find((k) => k.links.some((l) => l.clientIndex === c.index))?.user ?? c.therapist;
      goals.push({ client_id: id, builtin_route_id: c.goalRoute, count_from: c.programStart, chosen_by: chooser.id, created_at: new Date(`${c.programStart}T10:00:00Z`) });
    }
  }
  await knex.transaction(async (trx) => {
    if (newClinics.length) await trx.batchInsert('clinics', newClinics, 500);
    await trx.batchInsert('users', users, 500);
    await trx.batchInsert('memberships', memberships, 500);
    await trx.batchInsert('clients', clientRows, 500);
    if (devices.length) await trx.batchInsert('devices', devices, 500);
    if (carerLinks.length) await trx.batchInsert('carer_links', carerLinks, 500);
    await trx.batchInsert('prescriptions', prescriptions, 500);
    if (pauses.length) await trx.batchInsert('pauses', pauses, 500);
    if (notes.length) await trx.batchInsert('client_notes', notes, 500);
    if (goals.length) await trx.batchInsert('distance_goals', goals, 500);
  });
  o.log(`people and programs: ${population.clinics.length} clinics, ${clientRows.length} clients, ${users.length} users, ${prescriptions.length} prescription versions, ${pauses.length} pauses`);

  // Sessions, chunk by chunk, each chunk in one transaction on a connection of its own.
  const model = calibrate();
  const conn = new pg.Client({ connectionString: o.databaseUrl });
  await conn.connect();
  const totals = { sessions: 0, seriesRows: 0, storedFiles: 0, checks: 0, flags: 0 };
  let sessionNo = 0;
  const uploaderOf = (c: PlannedClient) => population.carers.find((k) => k.links.some((l) => l.clientIndex === c.index))?.user ?? c.account ?? c.therapist;
  const started = Date.now();
  try {
    for (let from = 0; from < population.clients.length; from += CHUNK_CLIENTS) {
      const chunk = population.clients.slice(from, from + CHUNK_CLIENTS);
      const rows = { uploads: [] as Row[], rides: [] as Row[], series: [] as Row[], checks: [] as Row[], flags: [] as Row[], events: [] as Row[] };
      for (const c of chunk) {
        const clientId = clientIds[c.index];
        const clinicId = clinicIds.get(c.clinicKey)!;
        const uploader = uploaderOf(c);
        const sessions = clientSessions(c, now);
        const r = mulberry32(c.seed ^ 0xc4ec);
        const priors: number[] = [];
        const conditions: { condition: CheckCondition; checkId: string; takenAt: Date }[] = [];
        for (let i = 0; i < sessions.length; i++) {
          const s = sessions[i];
          sessionNo++;
          const uploadId = randomUUID();
          const rideId = randomUUID();
          const startedAt = new Date(s.spec.startedAt);
          const withSeries = i === sessions.length - 1 || sessionNo % o.seriesEvery === 0;
          let summary;
          let key = `scale/${clinicId}/${clientId}/${uploadId}`;
          let sha256 = randomBytes(32).toString('hex');
          let byteSize = 0;
          if (withSeries) {
            const generated = generateRide(s.spec, seedOf(`${c.seed}:${s.date}`));
            const series = seriesOf(generated);
            summary = summarise(series);
            rows.series.push({ ride_id: rideId, format: SERIES_FORMAT, samples: summary.samples, data: encodeSeries(series) });
            if (o.storeFiles) {
              const bytes = Buffer.from(RIDE_LAYOUTS[c.layout].write(generated));
              key = `rides/${clinicId}/${clientId}/${uploadId}`;
              await putObjectStream(key, Readable.from([bytes]), 'text/csv');
              sha256 = createHash('sha256').update(bytes).digest('hex');
              byteSize = bytes.length;
              totals.storedFiles++;
            }
          } else {
            summary = modelSummary(s.spec, model, r);
          }
          if (!byteSize) byteSize = summary.samples * ROW_BYTES[c.layout] + 300;
          const uploadedAt = new Date(Math.min(startedAt.getTime() + summary.durationS * 1000 + integerBetween(r, 10, 48 * 60) * 60_000, now.getTime()));
          const processedAt = new Date(uploadedAt.getTime() + 2000);
          rows.uploads.push({
            id: uploadId,
            client_id: clientId,
            clinic_id: clinicId,
            uploaded_by: uploader.id,
            original_name: RIDE_LAYOUTS[c.layout].fileName(s.spec),
            byte_size: byteSize,
            sha256,
            storage_key: key,
            status: 'accepted',
            warnings: '[]',
            uploaded_at: uploadedAt,
            enqueued_at: uploadedAt,
            processed_at: processedAt,
            attempts: 1,
          });
          rows.rides.push({
            id: rideId,
            client_id: clientId,
            clinic_id: clinicId,
            upload_id: uploadId,
            device_id: deviceOf.get(c.index) ?? null,
            started_at: startedAt,
            started_at_source: 'file',
            duration_s: summary.durationS,
            active_s: summary.activeS,
            passive_s: summary.passiveS,
            cooldown_s: summary.cooldownS,
            distance_m: summary.distanceM,
            mean_power_w: summary.meanPowerW,
            peak_power_5s_w: summary.peakPower5sW,
            work_kj: summary.workKj,
            mean_cadence_rpm: summary.meanCadenceRpm,
            current_per_watt_ma_per_w: summary.currentPerWattMaPerW,
            pulse_width_us: summary.pulseWidthUs,
            frequency_hz: summary.frequencyHz,
            samples: summary.samples,
            channels: JSON.stringify(summary.channels),
            warnings: '[]',
            created_at: processedAt,
            updated_at: processedAt,
          });
          if (r() < c.checkRate) {
            const check = plannedCheck(c, r, priors, startedAt, summary.durationS, uploader.id, clientId, clinicId, rideId);
            rows.checks.push(check.row);
            for (const condition of check.conditions) conditions.push({ condition, checkId: check.row.id as string, takenAt: startedAt });
          }
        }
        const flags = checkFlags(conditions, clientId, clinicId, c.therapist.id, now, r);
        rows.flags.push(...flags.flags);
        rows.events.push(...flags.events);
      }
      await conn.query('BEGIN');
      await copyRows(conn, 'uploads', rows.uploads);
      totals.sessions += await copyRows(conn, 'rides', rows.rides);
      await conn.query('UPDATE uploads SET ride_id = rides.id FROM rides WHERE rides.upload_id = uploads.id AND uploads.client_id = ANY($1::uuid[]) AND uploads.ride_id IS NULL', [chunk.map((c) => clientIds[c.index])]);
      totals.seriesRows += await copyRows(conn, 'ride_series', rows.series);
      totals.checks += await copyRows(conn, 'checks', rows.checks);
      totals.flags += await copyRows(conn, 'flags', rows.flags);
      await copyRows(conn, 'flag_events', rows.events);
      await conn.query('COMMIT');
      const done = Math.min(from + CHUNK_CLIENTS, population.clients.length);
      o.log(`sessions: ${done}/${population.clients.length} clients, ${totals.sessions.toLocaleString('en')} sessions, ${totals.seriesRows} with series (${((Date.now() - started) / 1000).toFixed(0)} s)`);
    }
    await conn.query('VACUUM ANALYZE uploads');
  } finally {
    await conn.end();
  }

  // Session flags, judged as the app judges them, a hundred clients at a time.
  const flagStarted = Date.now();
  let sessionFlags = 0;
  for (let from = 0; from < clientIds.length; from += 100) {
    const ids = clientIds.slice(from, from + 100);
    const clients = await knex<ClientRow>('clients').whereIn('id', ids).whereNull('archived_at');
    const histories = await loadHistories(knex, clients);
    const flagRows: Row[] = [];
    const events: Row[] = [];
    for (const h of histories) {
      for (const change of planFlagChanges([], flagInput(h, now))) {
        if (change.type !== 'raise') continue;
        const id = randomUUID();
        const raisedAt = new Date(now.getTime() - integerBetween(random, 5, 72 * 60) * 60_000);
        const fate = random();
        const acknowledged = fate < 0.2;
        const snoozed = !acknowledged && fate < 0.25;
        const until = snoozed ? dateOf(Math.floor(now.getTime() / 86_400_000) + integerBetween(random, 2, 7)) : null;
        const c = change.condition;
        flagRows.push({ id, client_id: h.client.id, clinic_id: h.client.clinic_id, kind: c.kind, severity: c.severity, state: acknowledged ? 'acknowledged' : 'open', anchor: c.anchor, reason: c.reason, evidence: JSON.stringify(c.evidence), raised_at: raisedAt, updated_at: raisedAt, snoozed_until: until });
        events.push({ flag_id: id, at: raisedAt, action: 'raised', detail: JSON.stringify({ severity: c.severity, anchor: c.anchor, reason: c.reason }) });
        const actedAt = new Date(Math.min(now.getTime(), raisedAt.getTime() + integerBetween(random, 30, 20 * 60) * 60_000));
        if (acknowledged) events.push({ flag_id: id, at: actedAt, actor_user_id: h.client.primary_therapist_id, action: 'acknowledged', detail: '{}' });
        if (snoozed) events.push({ flag_id: id, at: actedAt, actor_user_id: h.client.primary_therapist_id, action: 'snoozed', detail: JSON.stringify({ until }) });
      }
    }
    if (flagRows.length) {
      await knex.batchInsert('flags', flagRows, 500);
      await knex.batchInsert('flag_events', events, 500);
    }
    sessionFlags += flagRows.length;
  }
  o.log(`session flags: ${sessionFlags} raised by the flag planner (${((Date.now() - flagStarted) / 1000).toFixed(0)} s)`);
  await knex.raw('ANALYZE');
  return {
    clinics: population.clinics.length,
    clients: clientRows.length,
    users: users.length,
    sessions: totals.sessions,
    seriesRows: totals.seriesRows,
    storedFiles: totals.storedFiles,
    checks: totals.checks,
    flags: totals.flags + sessionFlags,
  };
}

/** One pre/post check around a session; now and then a reading or a skin finding the rules flag. */
function plannedCheck(c: PlannedClient, r: Random, priors: number[], startedAt: Date, durationS: number, recordedBy: string, clientId: string, clinicId: string, rideId: string) {
  const gauss = (sd: number) => (sd * normal(r)) / 1.7;
  const sysBefore = Math.round(c.restingSystolic + gauss(6));
  const diaBefore = Math.round(sysBefore * 0.63 + gauss(3));
  let sysAfter = Math.round(sysBefore - between(r, 0, 8) + gauss(4));
  let diaAfter = Math.round(sysAfter * 0.63 + gauss(3));
  let during: { systolic: number; diastolic: number } | undefined = r() < 0.3 ? { systolic: Math.round(sysBefore + between(r, 0, 10)), diastolic: Math.round(diaBefore + between(r, 0, 5)) } : undefined;
  const adSymptoms: string[] = [];
  const event = r();
  if (c.adRisk === 'at_risk' && event < 0.004) {
    // A rise the autonomic dysreflexia rule catches.
    during = { systolic: c.restingSystolic + integerBetween(r, 28, 50), diastolic: Math.round(diaBefore + between(r, 10, 20)) };
    if (r() < 0.5) adSymptoms.push(r() < 0.5 ? 'pounding_headache' : 'flushing_or_sweating_above_injury');
  } else if (event > 0.997) {
    // A fall after the ride (possible post-exercise hypotension).
    sysAfter = sysBefore - integerBetween(r, 22, 34);
    diaAfter = diaBefore - integerBetween(r, 11, 18);
  }
  const skinDraw = r();
  const skin =
    skinDraw < 0.0005
      ? [{ site: SKIN_SITES[integerBetween(r, 0, SKIN_SITES.length - 1)], state: 'broken_skin' }]
      : skinDraw < 0.003
        ? [{ site: SKIN_SITES[integerBetween(r, 0, SKIN_SITES.length - 1)], state: 'redness_persists' }]
        : skinDraw < 0.08
          ? [{ site: SKIN_SITES[integerBetween(r, 0, SKIN_SITES.length - 1)], state: r() < 0.8 ? 'normal' : 'redness_fades_30min' }]
          : [];
  const afterMinutes = integerBetween(r, 5, 20);
  const input = {
    bpBefore: { systolic: sysBefore, diastolic: Math.min(diaBefore, sysBefore - 15) },
    bpDuring: during ? { systolic: during.systolic, diastolic: Math.min(during.diastolic, during.systolic - 15) } : undefined,
    bpAfter: { systolic: sysAfter, diastolic: Math.min(diaAfter, sysAfter - 15) },
    bpAfterMinutes: afterMinutes,
    adSymptoms: adSymptoms as never[],
    skin: skin as never[],
  };
  const baseline = baselineSystolic(c.baselineSystolic, priors);
  const evaluation = evaluateCheck(input, { injuryLevel: c.injuryLevel, adRisk: c.adRisk, baselineSystolic: baseline.value });
  // Kept sorted as the median of earlier pre-ride readings needs them.
  let at = priors.length;
  while (at > 0 && priors[at - 1] > sysBefore) at--;
  priors.splice(at, 0, sysBefore);
  const hrBefore = c.restingHeartRateBpm + integerBetween(r, -4, 6);
  const id = randomUUID();
  const takenAt = new Date(startedAt.getTime() + durationS * 1000 + afterMinutes * 60_000);
  const row: Row = {
    id,
    client_id: clientId,
    clinic_id: clinicId,
    recorded_by: recordedBy,
    taken_at: takenAt,
    ride_id: rideId,
    bp_before_systolic: input.bpBefore.systolic,
    bp_before_diastolic: input.bpBefore.diastolic,
    bp_during_systolic: input.bpDuring?.systolic ?? null,
    bp_during_diastolic: input.bpDuring?.diastolic ?? null,
    bp_after_systolic: input.bpAfter.systolic,
    bp_after_diastolic: input.bpAfter.diastolic,
    bp_after_minutes: afterMinutes,
    heart_rate_before: hrBefore,
    heart_rate_after: hrBefore + integerBetween(r, 4, 16),
    ad_symptoms: JSON.stringify(adSymptoms),
    other_events: JSON.stringify(r() < 0.03 ? ['spasms'] : []),
    skin: JSON.stringify(skin),
    effort: integerBetween(r, 3, 8),
    comment: null,
    evaluation: JSON.stringify({ ...evaluation, baseline }),
    created_at: takenAt,
  };
  return { row, conditions: evaluation.conditions };
}

/**
 * Flags from checks as raiseCheckFlag leaves them: one live flag per kind,
 * the latest reading of the last three weeks; older findings were looked into
 * and resolved by the therapist a day or three later.
 */
function checkFlags(found: { condition: CheckCondition; checkId: string; takenAt: Date }[], clientId: string, clinicId: string, therapistId: string, now: Date, r: Random) {
  const flags: Row[] = [];
  const events: Row[] = [];
  const recentFrom = now.getTime() - 21 * 86_400_000;
  const latestRecent = new Map<string, number>();
  found.forEach((f, i) => {
    if (f.takenAt.getTime() >= recentFrom) latestRecent.set(f.condition.kind, i);
  });
  found.forEach((f, i) => {
    const id = randomUUID();
    const live = latestRecent.get(f.condition.kind) === i;
    const raisedAt = new Date(f.takenAt.getTime() + 60_000);
    const closedAt = live ? null : new Date(Math.min(now.getTime(), raisedAt.getTime() + integerBetween(r, 20, 72) * 3600_000));
    const c = f.condition;
    flags.push({ id, client_id: clientId, clinic_id: clinicId, kind: c.kind, severity: c.severity, state: live ? 'open' : 'resolved', anchor: `check:${f.checkId}`, reason: c.reason, evidence: JSON.stringify({ ...c.evidence, checkId: f.checkId }), raised_at: raisedAt, updated_at: closedAt ?? raisedAt, closed_at: closedAt });
    events.push({ flag_id: id, at: raisedAt, action: 'raised', detail: JSON.stringify({ severity: c.severity, anchor: `check:${f.checkId}`, reason: c.reason }) });
    if (closedAt) events.push({ flag_id: id, at: closedAt, actor_user_id: therapistId, action: 'resolved', note: 'Discussed with the rider and carer; followed the clinic protocol.', detail: '{}' });
  });
  return { flags, events };
}
