// Bad input is a 400 that names the field, never a 500: the cases found by
// hand, then a fuzz over every API body schema's fields, every query
// parameter and every path parameter with the awkward values.
import { randomUUID } from 'node:crypto';
import type { ZodTypeAny } from 'zod';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { acceptInputSchema, invitationInputSchema } from '../../src/lib/auth/invitations';
import { resetCompleteSchema, resetRequestSchema } from '../../src/lib/auth/password-reset';
import { checkInputSchema } from '../../src/lib/checks/check-input';
import { clientInputSchema } from '../../src/lib/clients/create';
import { noteInputSchema } from '../../src/lib/clients/notes';
import { clientUpdateSchema } from '../../src/lib/clients/update';
import { closeDb } from '../../src/lib/db/knex';
import { flagThresholdsSchema } from '../../src/lib/flags';
import { preferencesInputSchema } from '../../src/lib/notifications/preferences';
import { deviceInputSchema, previewInputSchema, profileInputSchema } from '../../src/lib/profiles/schema';
import { goalInputSchema } from '../../src/lib/riders/goals';
import { staffUpdateSchema } from '../../src/lib/staff/staff';
import { flagActionSchema } from '../../src/lib/supervision/flags';
import { pauseInputSchema } from '../../src/lib/supervision/pauses';
import { prescriptionInputSchema } from '../../src/lib/supervision/prescription-rules';
import type { Http } from '../support/http';
import { createWorld, ROLES, type Role, type World } from '../support/world';
import { MATRIX } from './authz/matrix';
import { reportPdfBodySchema } from '../../src/lib/reports/report-data';
import { energySettingsSchema } from '../../src/lib/reports/energy-settings';
import { monitoringInputSchema } from '../../src/lib/monitoring/monitoring';
import { clinicLocaleSchema } from '../../src/lib/supervision/settings';
import { screeningInputSchema } from '../../src/lib/care/screening';
import { adPlanInputSchema } from '../../src/lib/care/ad-plan';
import { careSettingsSchema } from '../../src/lib/care/care-settings';
import { decisionSchema } from '../../src/lib/care/progression-service';
import { messageInputSchema } from '../../src/lib/care/messages';

let world: World;
beforeAll(async () => {
  world = await createWorld('input');
});
afterAll(closeDb);

interface ApiError {
  error: { code: string; message: string; fields?: { path: string; message: string }[] };
}

/** Expects a 400 whose field list names `field`. */
async function expectFieldError(res: Promise<{ status: number; body: ApiError }>, field: string) {
  const { status, body } = await res;
  expect(status, JSON.stringify(body)).toBe(400);
  expect(body.error.fields?.map((f) => f.path), body.error.message).toContain(field);
}

describe('the cases that were 500s', () => {
  it('NUL in a name or a note', async () => {
    const therapist = await world.as('therapist');
    await expectFieldError(therapist.json('POST', '/api/clients', { name: 'Ann\u0000Other', timezone: 'Europe/London' }), 'name');
    await expectFieldError(therapist.json('POST', `/api/clients/${world.clientId}/notes`, { body: 'Seen \u0000 today' }), 'body');
  });

  it('a before= beyond any row id, and NUL in an audit filter', async () => {
    const admin = await world.as('admin');
    await expectFieldError(admin.json('GET', '/api/audit?before=99999999999999999999'), 'before');
    await expectFieldError(admin.json('GET', '/api/audit?action=%00'), 'action');
  });

  it('dates that pass a YYYY-MM-DD pattern but are not on the calendar', async () => {
    const therapist = await world.as('therapist');
    await expectFieldError(therapist.json('POST', `/api/clients/${world.clientId}/pauses`, { from: '2026-13-45', to: '2026-13-46', reason: 'Away' }), 'from');
    await expectFieldError(therapist.json('PUT', `/api/clients/${world.clientId}/prescription`, { sessionsPerWeek: 3, minutesPerSession: 30, effectiveFrom: '2099-02-31' }), 'effectiveFrom');
    await expectFieldError(therapist.json('PATCH', `/api/clients/${world.clientId}`, { programStart: '2026-02-30' }), 'programStart');
    await expectFieldError(therapist.json('GET', `/api/clients/${world.clientId}/sessions?before=2026-13-45T00:00:00Z`), 'before');
    // A real leap day is a date.
    expect((await therapist.json('POST', `/api/clients/${world.clientId}/pauses`, { from: '2028-02-29', to: '2028-03-01', reason: 'Away' })).status).toBe(201);
  });

  it('a primary therapist must be a therapist or admin of the client’s own clinic', async () => {
    const therapist = await world.as('therapist');
    await expectFieldError(therapist.json('PATCH', `/api/clients/${world.clientId}`, { primaryTherapistId: randomUUID() }), 'primaryTherapistId');
    await expectFieldError(therapist.json('PATCH', `/api/clients/${world.clientId}`, { primaryTherapistId: world.users.otherTherapist.id }), 'primaryTherapistId');
    await expectFieldError(therapist.json('PATCH', `/api/clients/${world.clientId}`, { primaryTherapistId: world.users.carer.id }), 'primaryTherapistId');
    await expectFieldError(therapist.json('POST', '/api/clients', { name: 'Cross Clinic', timezone: 'Europe/London', primaryTherapistId: world.users.otherTherapist.id }), 'primaryTherapistId');
    const ok = await therapist.json('PATCH', `/api/clients/${world.clientId}`, { primaryTherapistId: world.users.admin.id });
    expect(ok.status).toBe(200);
    expect((await therapist.json('PATCH', `/api/clients/${world.clientId}`, { primaryTherapistId: world.users.therapist.id })).status).toBe(200);
  });
});

// ---- the fuzz ----

/** Stands for a JSON number that JavaScript cannot hold: written into the body text as is. */
const raw = (json: string) => `__raw__${json}__`;
// source: the classes of awkward input from the security review (NUL, long text, overflowing numbers, impossible dates, wrong types), plus broken UTF-16
const AWKWARD: [string, unknown][] = [
  ['NUL', '\u0000'],
  ['NUL inside', 'ab\u0000cd'],
  ['10,000 characters', 'x'.repeat(10_000)],
  ['broken UTF-16', 'a\ud800b'],
  ['1e308', 1e308],
  ['-1e308', -1e308],
  ['1e400', raw('1e400')],
  ['20 digits', raw('99999999999999999999')],
  ['2026-13-45', '2026-13-45'],
  ['2099-02-31', '2099-02-31'],
  ['year 0', '0000-01-01'],
  ['offset +99:00', '2026-01-01T00:00:00+99:00'],
  ['true', true],
  ['array', []],
  ['object', {}],
  ['null', null],
];

/** Each route's body schema, where it has more fields than the matrix's sample body sends. */
const SCHEMAS: Record<string, ZodTypeAny> = {
  'POST /api/auth/reset-request': resetRequestSchema,
  'POST /api/auth/reset': resetCompleteSchema,
  'POST /api/invitations/accept': acceptInputSchema,
  'POST /api/invitations': invitationInputSchema,
  'PATCH /api/staff/[userId]': staffUpdateSchema,
  'POST /api/clients': clientInputSchema,
  'PATCH /api/clients/[id]': clientUpdateSchema,
  'PUT /api/clients/[id]/prescription': prescriptionInputSchema,
  'POST /api/clients/[id]/pauses': pauseInputSchema,
  'POST /api/clients/[id]/notes': noteInputSchema,
  'POST /api/flags/[id]': flagActionSchema,
  'PUT /api/clinic/settings': flagThresholdsSchema,
  'PATCH /api/clinic/settings': clinicLocaleSchema,
  'PUT /api/clients/[id]/goal': goalInputSchema,
  'POST /api/clients/[id]/checks': checkInputSchema,
  'PUT /api/me/notifications': preferencesInputSchema,
  'POST /api/import-profiles': profileInputSchema,
  'PUT /api/import-profiles/[id]': profileInputSchema,
  'POST /api/import-profiles/preview': previewInputSchema,
  'POST /api/devices': deviceInputSchema,
  'POST /api/clients/[id]/report.pdf': reportPdfBodySchema,
  'POST /api/clients/[id]/monitoring': monitoringInputSchema,
  'PUT /api/clinic/energy': energySettingsSchema,
  'PUT /api/clients/[id]/screening': screeningInputSchema,
  'PUT /api/clients/[id]/ad-plan': adPlanInputSchema,
  'PUT /api/clinic/care': careSettingsSchema,
  'POST /api/progressions/[id]': decisionSchema,
  'POST /api/clients/[id]/messages': messageInputSchema,
};

/** The field paths of a zod schema: nested objects give dotted paths, records a `*` key, arrays of objects their first element. */
function fieldPaths(schema: ZodTypeAny, prefix: string[] = []): string[][] {
  const def = schema._def as { typeName: string; schema?: ZodTypeAny; innerType?: ZodTypeAny; in?: ZodTypeAny; type?: ZodTypeAny; valueType?: ZodTypeAny; shape?: () => Record<string, ZodTypeAny> };
  switch (def.typeName) {
    case 'ZodEffects':
      return fieldPaths(def.schema!, prefix);
    case 'ZodOptional':
    case 'ZodNullable':
    case 'ZodDefault':
      return fieldPaths(def.innerType!, prefix);
    case 'ZodPipeline':
      return fieldPaths(def.in!, prefix);
    case 'ZodObject':
      return [...(prefix.length ? [prefix] : []), ...Object.entries(def.shape!()).flatMap(([k, v]) => fieldPaths(v, [...prefix, k]))];
    case 'ZodRecord':
      return [prefix, [...prefix, '*'], ...fieldPaths(def.valueType!, [...prefix, 'x'])];
    case 'ZodArray':
      return [prefix, ...fieldPaths(def.type!, [...prefix, '0']).filter((p) => p.length > prefix.length + 1)];
    default:
      return [prefix];
  }
}

function samplePaths(body: unknown, prefix: string[] = []): string[][] {
  if (body === null || typeof body !== 'object' || Array.isArray(body)) return prefix.length ? [prefix] : [];
  return [...(prefix.length ? [prefix] : []), ...Object.entries(body).flatMap(([k, v]) => samplePaths(v, [...prefix, k]))];
}

/** The sample body with `value` at `path` (a `*` sets a record key instead); parents are made as needed. */
function withValue(body: unknown, path: string[], value: unknown): unknown {
  const copy = structuredClone(body ?? {}) as Record<string, unknown>;
  let at: Record<string, unknown> = copy;
  path.slice(0, -1).forEach((key, i) => {
    if (at[key] === null || typeof at[key] !== 'object') at[key] = /^\d+$/.test(path[i + 1]) ? [] : {};
    at = at[key] as Record<string, unknown>;
  });
  const last = path[path.length - 1];
  if (last === '*') {
    for (const k of Object.keys(at)) delete at[k];
    at[typeof value === 'string' ? value.replace(/^__raw__(.*)__$/, '$1') : JSON.stringify(value)] = { field: 'time' };
  } else at[last] = value;
  return copy;
}

const bodyText = (body: unknown) => JSON.stringify(body).replace(/"__raw__(.*?)__"/g, '$1');

/** The caller the matrix expects to get furthest with a route: one with a 2xx, else the first. */
function callerFor(expect: Record<Role, number>): Role {
  return ROLES.find((r) => r !== 'anonymous' && expect[r] < 300) ?? ROLES.find((r) => expect[r] < 300) ?? 'anonymous';
}

async function probe(http: Http, method: string, path: string, payload?: string) {
  const res = await http.request(method, path, payload, payload === undefined ? {} : { 'content-type': 'application/json' });
  const text = await res.text();
  let error: ApiError['error'] | null = null;
  try {
    error = text ? (JSON.parse(text) as ApiError).error ?? null : null;
  } catch {
    error = null;
  }
  return { status: res.status, error, text };
}

/** Runs `tasks` a few at a time. */
async function inBatches<T>(tasks: (() => Promise<T>)[], size = 6): Promise<T[]> {
  const out: T[] = [];
  for (let i = 0; i < tasks.length; i += size) out.push(...(await Promise.all(tasks.slice(i, i + size).map((t) => t()))));
  return out;
}

describe('fuzz: awkward values in every field, query parameter and path parameter', () => {
  it('every API body schema is known to the fuzz', () => {
    const withBody = Object.entries(MATRIX)
      .filter(([key]) => !key.startsWith('GET'))
      .filter(([, e]) => !e.freshSession)
      .map(([key]) => key);
    // Routes whose body the fuzz leaves to its own tests: multipart uploads (ingest tests), and those without a body.
    const without = ['POST /api/uploads', 'POST /api/clients/[id]/clearances', 'POST /api/uploads/[id]/reprocess', 'POST /api/invitations/[id]/revoke', 'POST /api/clients/[id]/pauses/[pauseId]/end', 'DELETE /api/import-profiles/[id]', 'POST /api/auth/sign-in'];
    expect(withBody.filter((k) => !(k in SCHEMAS) && !without.includes(k))).toEqual([]);
  });

  it('JSON bodies: never a 5xx; a 400 names the field', { timeout: 300_000 }, async () => {
    const failures: string[] = [];
    let sent = 0;
    for (const [key, entry] of Object.entries(MATRIX)) {
      const [method] = key.split(' ');
      if (method === 'GET' || entry.freshSession || key === 'POST /api/uploads') continue;
      const role = callerFor(entry.expect);
      const http = await world.as(role);
      const { path, body } = await entry.request(world, role);
      if (body instanceof FormData) continue;
      const schema = SCHEMAS[key];
      const paths = new Map([...samplePaths(body), ...(schema ? fieldPaths(schema) : [])].filter((p) => p.length).map((p) => [p.join('.'), p]));
      const results = await inBatches(
        [...paths.values()].flatMap((p) =>
          AWKWARD.map(([label, value]) => async () => {
            const r = await probe(http, method, path, bodyText(withValue(body, p, value)));
            sent++;
            if (r.status >= 500) return `${key} ${p.join('.')}=${label}: ${r.status} ${r.text.slice(0, 200)}`;
            if (r.status === 400 && r.error?.code === 'invalid_input' && !r.error.fields?.length && !/not valid JSON/.test(r.error.message)) return `${key} ${p.join('.')}=${label}: 400 without a field (${r.error.message})`;
            if (r.status >= 400 && !r.error?.message) return `${key} ${p.join('.')}=${label}: ${r.status} without a JSON error`;
            return null;
          }),
        ),
      );
      failures.push(...results.filter((x): x is string => x !== null));
    }
    expect(failures).toEqual([]);
    expect(sent).toBeGreaterThan(500);
  });

  // Query parameters that the GET routes read, with a value that works for the world.
  const QUERIES: { route: string; params: string[] }[] = [
    { route: 'GET /api/audit', params: ['clinicId', 'clientId', 'action', 'before', 'limit'] },
    { route: 'GET /api/clients/[id]/sessions', params: ['limit', 'before'] },
    { route: 'GET /api/clients/[id]/adherence', params: ['weeks'] },
    { route: 'GET /api/clients/[id]/trends', params: ['weeks'] },
    { route: 'GET /api/clients', params: ['limit', 'offset', 'q', 'linked'] },
    { route: 'GET /api/triage', params: ['limit', 'offset', 'q', 'kind', 'severity', 'sort', 'desc'] },
    { route: 'GET /api/caseload', params: ['limit', 'offset', 'q', 'kind', 'severity', 'sort', 'desc'] },
    { route: 'GET /api/sessions/[id]', params: ['points'] },
    { route: 'GET /api/staff', params: ['clinicId'] },
    { route: 'GET /api/clinic/settings', params: ['clinicId'] },
    { route: 'GET /api/uploads', params: ['clientId'] },
  ];
  const QUERY_VALUES = ['%00', 'a%00b', 'x'.repeat(10_000), '99999999999999999999', '1e400', '-1', '2026-13-45', '2026-13-45T00:00:00Z', '2026-01-01T00:00:00%2B99:00', '%ED%A0%80', '%FF', ''];

  it('query parameters: never a 5xx', { timeout: 120_000 }, async () => {
    const failures: string[] = [];
    for (const { route, params } of QUERIES) {
      const entry = MATRIX[route];
      const role = callerFor(entry.expect);
      const http = await world.as(role);
      const { path } = await entry.request(world, role);
      const [base, query] = path.split('?');
      const results = await inBatches(
        params.flatMap((param) =>
          QUERY_VALUES.map((value) => async () => {
            const q = new URLSearchParams(query);
            q.delete(param);
            const url = `${base}?${[q.toString(), `${param}=${value}`].filter(Boolean).join('&')}`;
            const r = await probe(http, 'GET', url);
            return r.status >= 500 ? `${route} ${param}=${value.slice(0, 30)}: ${r.status} ${r.text.slice(0, 200)}` : null;
          }),
        ),
      );
      failures.push(...results.filter((x): x is string => x !== null));
    }
    expect(failures).toEqual([]);
  });

  it('path parameters: never a 5xx', { timeout: 120_000 }, async () => {
    const VALUES = ['%00', 'x'.repeat(300), '%ED%A0%80', '99999999999999999999', '%2e%2e', 'null', randomUUID().toUpperCase()];
    const failures: string[] = [];
    for (const [key, entry] of Object.entries(MATRIX)) {
      if (!key.includes('[') || entry.freshSession) continue;
      const [method, pattern] = key.split(' ');
      const role = callerFor(entry.expect);
      const http = await world.as(role);
      const { path, body } = await entry.request(world, role);
      if (body instanceof FormData) continue;
      const real = path.split('?')[0].split('/');
      const segments = pattern.split('/');
      const results = await inBatches(
        segments.flatMap((segment, i) =>
          segment.startsWith('[')
            ? VALUES.map((value) => async () => {
                const probed = real.map((s, j) => (j === i ? value : s)).join('/');
                const r = await probe(http, method, probed, method === 'GET' || method === 'DELETE' ? undefined : bodyText(body ?? {}));
                return r.status >= 500 ? `${key} ${segment}=${value.slice(0, 30)}: ${r.status} ${r.text.slice(0, 200)}` : null;
              })
            : [],
        ),
      );
      failures.push(...results.filter((x): x is string => x !== null));
    }
    expect(failures).toEqual([]);
  });
});
