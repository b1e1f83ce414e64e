// The pages are read like the API in the matrix: every page, for every kind of
// caller, never fails and never shows a record the caller may not see. Pages
// with a parameter name the records to try; a new one without an entry fails.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../src/lib/db/knex';
import { rideCsv, uploadAndWait } from '../support/rides';
import { createWorld, leaks, ROLES, type World } from '../support/world';
import { discoverPages } from './authz/routes';

let world: World;
let sessionId: string;
beforeAll(async () => {
  world = await createWorld('pages');
  const [r] = await uploadAndWait(await world.as('carer'), world.clientId, [{ name: 'pages.csv', content: rideCsv({ startedAt: '2026-03-04T09:00:00Z' }) }]);
  sessionId = r.sessionId!;
});
afterAll(closeDb);

const TOKEN = 'z'.repeat(43);
/** The paths to open for a page: its parameters filled with records of each clinic, and the query parameters it reads. */
const PATHS: Record<string, (w: World) => string[]> = {
  '/clients/[id]': (w) => [w.clientId, w.otherClientId, w.otherClinicClientId].map((id) => `/clients/${id}`),
  ...Object.fromEntries(
    ['checks', 'details', 'flags', 'notes', 'pauses', 'prescription', 'sessions'].map((view) => [
      `/clients/[id]/${view}`,
      (w: World) => [w.clientId, w.otherClientId, w.otherClinicClientId].map((id) => `/clients/${id}/${view}`),
    ]),
  ),
  '/reports/[id]': (w) => [w.clientId, w.otherClientId, w.otherClinicClientId].map((id) => `/reports/${id}?weeks=4`),
  '/sessions/[id]': (w) => [sessionId, w.otherClinicSessionId].map((id) => `/sessions/${id}`),
  '/invite/[token]': () => [`/invite/${TOKEN}`],
  '/reset/[token]': () => [`/reset/${TOKEN}`],
  '/unsubscribe/[token]': () => [`/unsubscribe/${TOKEN}?topic=reminders`],
  '/checks': (w) => ['/checks', ...[w.clientId, w.otherClientId, w.otherClinicClientId].map((id) => `/checks?clientId=${id}`)],
  '/upload': (w) => ['/upload', ...[w.clientId, w.otherClientId, w.otherClinicClientId].map((id) => `/upload?clientId=${id}`)],
  '/my-prescription': (w) => ['/my-prescription', ...[w.clientId, w.otherClientId, w.otherClinicClientId].map((id) => `/my-prescription?clientId=${id}`)],
};

describe('pages for every caller', () => {
  it('every page with a parameter says which records to open', () => {
    expect(discoverPages().filter((p) => p.includes('[') && !(p in PATHS))).toEqual([]);
  });

  for (const page of discoverPages()) {
    it(`${page}`, { timeout: 120_000 }, async () => {
      const paths = PATHS[page]?.(world) ?? [page];
      const problems: string[] = [];
      for (const role of ROLES) {
        const http = await world.as(role);
        for (const path of paths) {
          const res = await http.get(path);
          const body = await res.text();
          if (res.status >= 500) problems.push(`${role} ${path}: ${res.status}`);
          // What the caller put in the address is theirs already; anything else they may not see is a leak.
          const found = leaks(world, role, body, path);
          if (found.length) problems.push(`${role} ${path}: ${found.join(', ')}`);
        }
      }
      expect(problems).toEqual([]);
    });
  }
});
