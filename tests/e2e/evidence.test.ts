import { mkdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { parse } from 'csv-parse/sync';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seriousViolations } from '../support/axe';
import { baseUrl, launchBrowser, signInThroughPage, waitForIslands } from '../support/browser';

const SHOTS = process.env.KINLOOP_SHOTS_DIR;

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

async function signedIn(email: string, width = 1280): Promise<{ context: BrowserContext; page: Page }> {
  const context = await browser.newContext({ locale: 'en-GB', viewport: { width, height: 900 }, acceptDownloads: true });
  const page = await context.newPage();
  await signInThroughPage(page, email);
  return { context, page };
}

async function shot(page: Page, name: string) {
  if (!SHOTS) return;
  mkdirSync(SHOTS, { recursive: true });
  await page.screenshot({ path: path.join(SHOTS, `${name}.png`), fullPage: true });
}

async function clientIdOf(page: Page, name: string): Promise<string> {
  const { clients } = await page.request.get(`${baseUrl()}/api/clients`).then((r) => r.json());
  return clients.find((c: { name: string }) => c.name === name).id;
}

describe('clinic overview', () => {
  it('shows the caseload figures with tables, lists the clients behind a number, and passes axe-core at both widths', async () => {
    for (const width of [1280, 390]) {
      const { context, page } = await signedIn('therapist@kinloop.test', width);
      await page.goto(`${baseUrl()}/overview`);
      await expect(page.getByRole('heading', { level: 1 }).textContent()).resolves.toBe('Clinic overview');
      await waitForIslands(page);
      // Every client of the clinic is counted (other tests may have added some), Dev has an urgent power drop.
      const { clients } = await page.request.get(`${baseUrl()}/api/clients`).then((r) => r.json());
      await expect(page.getByTestId('overview-active').innerText()).resolves.toContain(`of ${clients.length};`);
      const flags = page.getByRole('table', { name: 'Clients by open flag' });
      await flags.waitFor();
      await expect(flags.getByRole('row', { name: /Power drop/ }).getByRole('link').textContent()).resolves.toMatch(/^[1-9]\d* clients?$/);
      await expect(page.getByRole('table', { name: 'Sessions per week, last 26 weeks' }).locator('tbody tr').count()).resolves.toBe(26);
      expect(await seriousViolations(page)).toEqual([]);
      await shot(page, `overview-${width}`);

      if (width === 1280) {
        await Promise.all([page.waitForURL((u) => u.searchParams.get('group') === 'flag:power_drop'), flags.getByRole('row', { name: /Power drop/ }).getByRole('link').click()]);
        const list = page.getByTestId('overview-group');
        await expect(list.getByRole('link', { name: 'Dev Ramaswamy' }).count()).resolves.toBe(1);
        await expect(page.getByRole('heading', { name: /^Open power drop flag: \d+$/ }).count()).resolves.toBe(1);
        expect(await seriousViolations(page)).toEqual([]);
        await shot(page, 'overview-group-1280');
        const download = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Download the overview (CSV)' }).click()]).then(([d]) => d);
        const rows: Record<string, string>[] = parse(readFileSync((await download.path())!), { bom: true, columns: true });
        expect(rows.map((r) => r.client).sort()).toEqual(clients.map((c: { name: string }) => c.name).sort());
      }
      await context.close();
    }
  });
});

describe('monitoring time', () => {
  it('offers the timer’s time when the therapist leaves the client page, records it, and the month page totals it', async () => {
    const { context, page } = await signedIn('therapist@kinloop.test');
    const id = await clientIdOf(page, 'Wren Tallis');
    await page.clock.install();
    await page.goto(`${baseUrl()}/clients/${id}`);
    await waitForIslands(page);
    const timer = page.getByTestId('monitoring-timer');
    await expect(timer.getByRole('heading', { name: 'Monitoring time' }).count()).resolves.toBe(1);
    // Ninety seconds on the page, in the page's own clock.
    await page.clock.runFor(90_000);
    await expect(timer.getByRole('timer').textContent()).resolves.toBe('On this page: 1 min 30 s');

    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Clients' }).click();
    const dialog = page.getByRole('dialog', { name: 'Record your time before you leave?' });
    await dialog.waitFor();
    // Focus goes to the minutes, filled from the timer (90 s rounds to 2 min).
    await expect(page.evaluate(() => (document.activeElement as HTMLInputElement).value)).resolves.toBe('2');
    await expect(new URL(page.url()).pathname).toBe(`/clients/${id}`);
    const note = `Reviewed the week (${Date.now()})`;
    await dialog.getByLabel('Activity').selectOption('review');
    await dialog.getByLabel('Note').fill(note);
    expect(await seriousViolations(page)).toEqual([]);
    await shot(page, 'monitoring-leave-dialog-1280');
    await Promise.all([page.waitForURL((u) => u.pathname === '/clients'), dialog.getByRole('button', { name: 'Record and leave' }).click()]);

    const month = await page.request.get(`${baseUrl()}/api/clients/${id}/monitoring`).then((r) => r.json());
    const entry = month.entries.find((e: { note: string }) => e.note === note);
    expect(entry).toMatchObject({ activity: 'review', seconds: 120, source: 'timer' });

    for (const width of [1280, 390]) {
      await page.setViewportSize({ width, height: 900 });
      await page.goto(`${baseUrl()}/monitoring`);
      await expect(page.getByRole('heading', { level: 1 }).textContent()).resolves.toBe('Monitoring time');
      await expect(page.getByText('it does not decide what can be billed', { exact: false }).count()).resolves.toBe(1);
      const row = page.getByTestId('monitoring-client').filter({ hasText: 'Wren Tallis' });
      await expect(row.innerText()).resolves.toMatch(/\d+ min/);
      expect(await seriousViolations(page)).toEqual([]);
      await shot(page, `monitoring-${width}`);
    }
    await context.close();
  });
});

describe('downloads', () => {
  it('a therapist downloads the report PDF with a summary from the report page', async () => {
    const { context, page } = await signedIn('therapist@kinloop.test');
    const id = await clientIdOf(page, 'Annika Brand');
    await page.goto(`${baseUrl()}/reports/${id}?weeks=4`);
    await page.getByLabel('Therapist summary').fill('Riding well; no changes planned.');
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Download PDF' }).click()]);
    expect(download.suggestedFilename()).toMatch(/^kinloop-report-annika-brand-\d{4}-\d{2}-\d{2}-to-\d{4}-\d{2}-\d{2}\.pdf$/);
    expect(readFileSync((await download.path())!).subarray(0, 5).toString()).toBe('%PDF-');
    await context.close();
  });

  it('a rider downloads their own sessions as CSV and FHIR from the progress page', async () => {
    const { context, page } = await signedIn('client@kinloop.test');
    await page.goto(`${baseUrl()}/progress`);
    const me = await page.request.get(`${baseUrl()}/api/me`).then((r) => r.json());
    const [csv] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: /^Download my sessions \(CSV/ }).click()]);
    const rows: Record<string, string>[] = parse(readFileSync((await csv.path())!), { bom: true, columns: true });
    expect(rows.length).toBeGreaterThan(20);
    expect(new Set(rows.map((r) => r.client))).toEqual(new Set(['Jonah Pryce']));
    expect(new Set(rows.map((r) => r.client_id)).size).toBe(1);
    const [fhir] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: /^Download my sessions and checks \(FHIR/ }).click()]);
    const bundle = JSON.parse(readFileSync((await fhir.path())!, 'utf8'));
    expect(bundle.resourceType).toBe('Bundle');
    expect(bundle.entry.find((e: { resource: { resourceType: string } }) => e.resource.resourceType === 'Patient').resource.name[0].text).toBe('Jonah Pryce');
    expect(me.clientId ?? me.client?.id ?? rows[0].client_id).toBeTruthy();
    expect(await seriousViolations(page)).toEqual([]);
    await context.close();
  });
});
