import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seriousViolations } from '../support/axe';
import { baseUrl, launchBrowser, signInThroughPage, waitForIslands } from '../support/browser';
import { watchedContext } from '../support/csp';

// Every page, for every role that can open it, scanned with axe-core (WCAG 2.x
// A and AA): no serious or critical finding anywhere. One sign-in per role and
// one width (the other browser tests scan their pages at phone widths too), so
// the whole sweep stays within a couple of minutes. Reads only. The same visit
// proves the strict Content-Security-Policy holds on every page: no violation
// is reported, every island hydrates (waitForIslands) and the script-shown
// print buttons appear.

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

const SIGNED_OUT = ['/sign-in', '/forgot-password', '/reset/not-a-real-token', '/invite/not-a-real-token', '/unsubscribe/not-a-real-token'];

/** Page paths with `{client}` and `{session}` for one of the role's clients and its latest session. */
const PAGES: Record<string, { email: string; client?: string; pages: string[] }> = {
  client: {
    email: 'client@kinloop.test',
    pages: ['/my-week', '/progress', '/goal', '/my-prescription', '/checks', '/upload', '/settings/notifications', '/sessions/{session}', '/no-page-here'],
  },
  carer: {
    email: 'carer@kinloop.test',
    client: 'Dev Ramaswamy',
    pages: ['/carer', '/clients', '/checks', '/my-prescription', '/upload', '/settings/notifications', '/clients/{client}', '/clients/{client}/sessions', '/clients/{client}/prescription', '/clients/{client}/pauses', '/clients/{client}/checks', '/sessions/{session}'],
  },
  therapist: {
    email: 'therapist@kinloop.test',
    client: 'Noor Haddad',
    pages: [
      '/triage',
      '/clients',
      '/clients/new',
      '/clients/{client}',
      '/clients/{client}/sessions',
      '/clients/{client}/prescription',
      '/clients/{client}/pauses',
      '/clients/{client}/checks',
      '/clients/{client}/flags',
      '/clients/{client}/notes',
      '/clients/{client}/details',
      '/reports',
      '/reports/{client}',
      '/sessions/{session}',
      '/checks',
      '/upload',
      '/settings/notifications',
    ],
  },
  admin: {
    email: 'admin@kinloop.test',
    pages: ['/admin/staff', '/admin/settings', '/admin/devices', '/admin/audit', '/admin/mailbox', '/no-access', '/no-page-here'],
  },
};

async function scan(page: Page, path: string) {
  await page.goto(`${baseUrl()}${path}`);
  await waitForIslands(page);
  // Islands that load data show "Loading …" until it comes; scan what the user then sees.
  await page.waitForFunction(() => ![...document.querySelectorAll('[role="status"]')].some((el) => el.textContent?.startsWith('Loading ')), undefined, { timeout: 30_000 });
  const violations: unknown[] = await seriousViolations(page);
  // A print button its page's own script should have shown stays hidden when the policy blocked that script.
  if (await page.locator('[data-print][hidden], [data-print-report][hidden]').count()) violations.push('a page script did not run');
  return violations;
}

describe('axe-core on every page', () => {
  it('finds nothing serious or critical on the signed-out pages', { timeout: 120_000 }, async () => {
    const { context, violations: csp } = await watchedContext(browser, { locale: 'en-GB', viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    const found: Record<string, unknown> = {};
    for (const path of SIGNED_OUT) {
      const violations = await scan(page, path);
      if (violations.length) found[path] = violations;
    }
    expect(found).toEqual({});
    expect(csp).toEqual([]);
    await context.close();
  });

  for (const [role, { email, client, pages }] of Object.entries(PAGES)) {
    it(`finds nothing serious or critical on the ${role}’s ${pages.length} pages`, { timeout: 240_000 }, async () => {
      const { context, violations: csp } = await watchedContext(browser, { locale: 'en-GB', viewport: { width: 1280, height: 900 } });
      const page = await context.newPage();
      await signInThroughPage(page, email);
      const { clients } = await page.request.get(`${baseUrl()}/api/clients`).then((r) => r.json());
      const clientId: string = (client ? clients.find((c: { name: string }) => c.name === client) : clients[0]).id;
      const { sessions } = await page.request.get(`${baseUrl()}/api/clients/${clientId}/sessions?limit=1`).then((r) => r.json());
      const found: Record<string, unknown> = {};
      for (const path of pages) {
        const violations = await scan(page, path.replace('{client}', clientId).replace('{session}', sessions[0].id));
        if (violations.length) found[path] = violations;
      }
      expect(found).toEqual({});
      expect(csp).toEqual([]);
      await context.close();
    });
  }
});
