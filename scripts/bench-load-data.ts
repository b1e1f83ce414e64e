// The database half of `npm run bench:load` (scripts/bench-load.mjs runs it
// under tsx with an instance's environment, as seed:scale runs its data half):
//   carers  — the carers of a clinic's active clients as the scale seed and
//             the demo seed made them, and free start times for new rides of
//             each client (none within an hour of a ride the client has);
//   verify  — after the run, waits (bounded) until the worker has read every
//             file the run's carers uploaded, then checks each: read and
//             accepted, exactly one session at the start time sent, and its
//             stored object byte for byte what was sent (SHA-256); and that
//             no object the run stored is left without an upload naming it
//             (a request cut off mid-upload must leave nothing behind).
// Arguments and answers are JSON files, so nothing large goes through argv.
import { createHash } from 'node:crypto';
import { readFileSync, writeFileSync } from 'node:fs';
import { parseArgs } from 'node:util';
import { closeDatabase, maintenanceDb } from '../src/lib/data';
import type { UploadRow } from '../src/lib/db/tables';
import { getObjectBytes, listObjects } from '../src/lib/storage/s3';

const { positionals, values } = parseArgs({
  allowPositionals: true,
  options: { in: { type: 'string' }, out: { type: 'string' } },
});
const [command] = positionals;
if (!values.in || !values.out || !['carers', 'verify'].includes(command)) throw new Error('usage: bench-load-data.ts carers|verify --in <json> --out <json>');
const input = JSON.parse(readFileSync(values.in, 'utf8'));
const db = maintenanceDb();

/** A new ride starts at least this far from every ride the client already has, so none overlaps another. */
const CLEAR_MS = 70 * 60_000;
/** Slots between new rides: a one-hour ride and a few minutes. */
const STEP_MS = 67 * 60_000;

interface CarersInput {
  /** An account of the clinic (its admin), naming which clinic. */
  clinicOf: string;
  /** (carer, client) pairs wanted, each with its own client. */
  pairs: number;
  /** Free start times wanted per client. */
  slots: number;
  /** The newest start time; slots go back from here. */
  before: string;
}

async function carers({ clinicOf, pairs, slots, before }: CarersInput) {
  const member = await db('memberships').join('users', 'users.id', 'memberships.user_id').where('users.email', clinicOf).first('memberships.clinic_id');
  if (!member) throw new Error(`${clinicOf} belongs to no clinic`);
  const links: { email: string; client_id: string; name: string }[] = await db('carer_links')
    .join('users', 'users.id', 'carer_links.carer_user_id')
    .join('clients', 'clients.id', 'carer_links.client_id')
    .where({ 'clients.clinic_id': member.clinic_id, 'carer_links.active': true })
    .whereNull('clients.archived_at')
    .whereNull('users.disabled_at')
    .orderBy(['users.email', 'clients.id'])
    .select('users.email', 'carer_links.client_id', 'clients.display_name as name');
  // One client per pair, spread over as many carers as there are.
  const chosen: typeof links = [];
  const taken = new Set<string>();
  while (chosen.length < pairs) {
    const had = chosen.length;
    const byCarer = new Map<string, typeof links>();
    for (const l of links) if (!taken.has(l.client_id)) byCarer.set(l.email, [...(byCarer.get(l.email) ?? []), l]);
    for (const list of byCarer.values()) {
      if (chosen.length >= pairs) break;
      chosen.push(list[0]);
      taken.add(list[0].client_id);
    }
    if (chosen.length === had) break;
  }
  const newest = Math.floor(Date.parse(before) / 60_000) * 60_000;
  const out = [];
  for (const pair of chosen) {
    const rides: { started_at: Date }[] = await db('rides')
      .where({ client_id: pair.client_id })
      .where('started_at', '>', new Date(newest - slots * STEP_MS * 4 - CLEAR_MS))
      .select('started_at');
    const busy = rides.map((r) => r.started_at.getTime());
    const startTimes: string[] = [];
    for (let t = newest; startTimes.length < slots; t -= STEP_MS) {
      if (busy.every((b) => Math.abs(b - t) >= CLEAR_MS)) startTimes.push(new Date(t).toISOString());
    }
    out.push({ email: pair.email, clientId: pair.client_id, startTimes });
  }
  return { clinicId: member.clinic_id, pairs: out };
}

interface Sent {
  clientId: string;
  name: string;
  startedAt: string;
  sha256: string;
  bytes: number;
  /** The upload id the POST answered with; absent when no answer came (a timeout). */
  uploadId?: string;
}

interface VerifyInput {
  /** Every file the run sent (answered or not). */
  sent: Sent[];
  /** When the first upload was sent: older uploads of these clients are not the run's. */
  since: string;
  waitSeconds: number;
}

async function verify({ sent, since, waitSeconds }: VerifyInput) {
  const clientIds = [...new Set(sent.map((s) => s.clientId))];
  const ofRun = () => db('uploads').whereIn('client_id', clientIds).where('uploaded_at', '>=', new Date(since));
  const started = Date.now();
  const deadline = started + waitSeconds * 1000;
  let queued = 0;
  for (;;) {
    queued = Number((await ofRun().where({ status: 'queued' }).count('* as n').first())?.n ?? 0);
    if (!queued || Date.now() > deadline) break;
    await new Promise((r) => setTimeout(r, 1000));
  }
  const waitedMs = Date.now() - started;
  const rows: UploadRow[] = await ofRun();
  const byFile = new Map(sent.map((s) => [`${s.clientId} ${s.name}`, s]));
  const problems: { uploadId: string | null; name: string; problem: string }[] = [];
  const problem = (row: UploadRow | null, s: Sent | undefined, text: string) => problems.push({ uploadId: row?.id ?? s?.uploadId ?? null, name: row?.original_name ?? s?.name ?? '?', problem: text });
  let verified = 0;
  let unanswered = 0;
  const answered = new Set(sent.filter((s) => s.uploadId).map((s) => s.uploadId));
  for (const row of rows) {
    const s = byFile.get(`${row.client_id} ${row.original_name}`);
    if (!s) {
      problem(row, undefined, 'an upload of the run that matches no file sent');
      continue;
    }
    if (!answered.has(row.id)) unanswered++;
    if (row.status !== 'accepted') {
      problem(row, s, `status ${row.status}${row.error ? ` (${row.error.code}: ${row.error.message})` : ''}`);
      continue;
    }
    const sessions = Number((await db('rides').where({ upload_id: row.id }).count('* as n').first())?.n ?? 0);
    const at = new Date(s.startedAt);
    const near = Number(
      (await db('rides').where({ client_id: row.client_id }).whereBetween('started_at', [new Date(at.getTime() - 2 * 60_000), new Date(at.getTime() + 2 * 60_000)]).count('* as n').first())?.n ?? 0,
    );
    if (sessions !== 1 || near !== 1 || !row.ride_id) {
      problem(row, s, `${sessions} session(s) from the upload, ${near} session(s) of the client at ${s.startedAt}`);
      continue;
    }
    const bytes = await getObjectBytes(row.storage_key).catch((err: Error) => err);
    if (bytes instanceof Error) {
      problem(row, s, `no object at ${row.storage_key}: ${bytes.message}`);
      continue;
    }
    const hash = createHash('sha256').update(bytes).digest('hex');
    if (hash !== s.sha256 || bytes.length !== s.bytes || row.sha256 !== s.sha256) {
      problem(row, s, `stored ${bytes.length} bytes with SHA-256 ${hash.slice(0, 12)}…, sent ${s.bytes} with ${s.sha256.slice(0, 12)}…`);
      continue;
    }
    verified++;
  }
  // An answer that named an upload the database does not hold is the worst case: a file said to be saved and lost.
  const held = new Set(rows.map((r) => r.id));
  for (const s of sent) if (s.uploadId && !held.has(s.uploadId)) problem(null, s, 'answered as saved, but no such upload is stored');
  // Objects of the run under the clients' folders (the key layout of uploadRideFiles) that no upload names.
  const named = new Set(rows.map((r) => r.storage_key));
  const clinics: { id: string; clinic_id: string }[] = await db('clients').whereIn('id', clientIds).select('id', 'clinic_id');
  let orphans = 0;
  let objects = 0;
  for (const c of clinics) {
    let token: string | undefined;
    do {
      const page = await listObjects(`rides/${c.clinic_id}/${c.id}/`, token);
      for (const o of page.objects) {
        if (o.lastModified.getTime() < Date.parse(since) - 1000) continue;
        objects++;
        if (named.has(o.key)) continue;
        orphans++;
        problem(null, undefined, `object ${o.key} is stored but no upload names it`);
      }
      token = page.next;
    } while (token);
  }
  return { uploads: rows.length, verified, unanswered, stillQueued: queued, waitedMs, objects, orphans, problems };
}

try {
  const result = command === 'carers' ? await carers(input) : await verify(input);
  writeFileSync(values.out, JSON.stringify(result));
} finally {
  await closeDatabase();
}
