import { randomInt } from 'node:crypto';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seriousViolations } from '../support/axe';
import { baseUrl, launchBrowser, signInThroughPage } from '../support/browser';
import { Http } from '../support/http';
import { rideCsv, uploadAndWait } from '../support/rides';

const root = process.env.KINLOOP_ROOT ?? process.cwd();
const REFUSED_NAME = 'refused-no-time-column.csv';
const refusedText = readFileSync(path.join(root, 'fixtures', 'rides', REFUSED_NAME), 'utf8');
const FINAL = ['accepted', 'duplicate', 'refused', 'failed'];
const DEMO_PASSWORD = process.env.KINLOOP_DEMO_PASSWORD ?? 'kinloop-demo-2026';

/**
 * Two-minute rides on days of 2025, long before the demo's rides (which end
 * on the day it is seeded), each test its own, so that none is a duplicate of
 * another session. London is on GMT on these days, so local time is UTC.
 */
const ride = (startedAt: string, powerW: number) => ({ name: `ride-${startedAt.replace(/[:.]/g, '')}.csv`, text: rideCsv({ startedAt, minutes: 2, powerW }), startedAt, powerW });
const DRAGGED = [ride('2025-03-14T09:27:00.000Z', 23.4), ride('2025-03-14T12:27:00.000Z', 27.1)];
const CHOSEN = ride('2025-02-03T10:05:00.000Z', 21.6);

/** Uploads a ride for Jonah through the API as his carer and returns the session page's path. */
async function sessionOfJonah(r: ReturnType<typeof ride>): Promise<string> {
  const carer = await new Http().signIn('carer@kinloop.test', DEMO_PASSWORD);
  const me = (await carer.json('GET', '/api/me')).body as { carerOf: string[] };
  const names = await Promise.all(me.carerOf.map(async (id) => [id, (await carer.json('GET', `/api/clients/${id}`)).body.name] as const));
  const jonah = names.find(([, name]) => name === 'Jonah Pryce')![0];
  const [result] = await uploadAndWait(carer, jonah, [{ name: r.name, content: r.text }]);
  expect(result.status).toBe('accepted');
  return `/sessions/${result.sessionId}`;
}

async function signedIn(email: string): Promise<{ context: BrowserContext; page: Page }> {
  const context = await browser.newContext({ locale: 'en-US', viewport: { width: 1280, height: 900 } });
  const page = await context.newPage();
  await signInThroughPage(page, email);
  return { context, page };
}

async function openUploadFor(page: Page, clientName: string) {
  await page.goto(`${baseUrl()}/upload`);
  const picker = page.getByLabel('Client', { exact: true });
  await page.getByRole('button', { name: /choose (ride files|the client)/i }).waitFor();
  if (await picker.count()) await picker.selectOption({ label: clientName });
  await expect(page.getByRole('button', { name: 'Choose ride files, or drop them here' }).isEnabled()).resolves.toBe(true);
}

/** Drags files onto the drop zone the way a browser does: dragenter, dragover, drop, with a DataTransfer of real File objects. */
async function dragFiles(page: Page, files: { name: string; text: string }[]) {
  const dataTransfer = await page.evaluateHandle((list) => {
    const dt = new DataTransfer();
    for (const f of list) dt.items.add(new File([f.text], f.name, { type: 'text/csv', lastModified: Date.now() }));
    return dt;
  }, files);
  const zone = page.getByRole('button', { name: 'Choose ride files, or drop them here' });
  for (const type of ['dragenter', 'dragover', 'drop']) await zone.dispatchEvent(type, { dataTransfer });
}

async function waitForResults(page: Page, count: number) {
  await page.waitForFunction(
    ({ count, final }) => Array.from(document.querySelectorAll<HTMLElement>('[data-testid="upload-item"]')).filter((e) => final.includes(e.dataset.status ?? '')).length >= count,
    { count, final: FINAL },
    { timeout: 60_000 },
  );
}

const item = (page: Page, name: string) => page.getByTestId('upload-item').filter({ hasText: name });

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

describe('uploading ride files', () => {
  it('a carer drags three files onto the drop zone and sees two sessions and one refusal', async () => {
    const { context, page } = await signedIn('carer@kinloop.test');
    await openUploadFor(page, 'Jonah Pryce');
    expect(await seriousViolations(page)).toEqual([]);

    const rides = DRAGGED;
    await dragFiles(page, [rides[0], { name: REFUSED_NAME, text: refusedText }, rides[1]]);
    await waitForResults(page, 3);

    for (const ride of rides) {
      const row = item(page, ride.name);
      await expect(row.getAttribute('data-status')).resolves.toBe('accepted');
      const text = (await row.textContent()) ?? '';
      // source: tests/support/rides.ts writes 120 one-second samples, 20 passive, 90 active, 10 cool-down, at a constant active power.
      expect(text).toMatch(/Duration\s*2 min/);
      expect(text).toMatch(/Active\s*1\.5 min/);
    }
    // from memory: British English, Kinloop's fallback locale, writes the weekday, day, month and year, then a 24-hour clock.
    await expect(item(page, rides[0].name).textContent()).resolves.toContain('session of Friday, 14 March 2025, 09:27');
    await expect(item(page, rides[0].name).textContent()).resolves.toContain('Mean power23.4 W');
    await expect(item(page, rides[1].name).textContent()).resolves.toContain('session of Friday, 14 March 2025, 12:27');
    await expect(item(page, rides[1].name).textContent()).resolves.toContain('Mean power27.1 W');
    for (const ride of rides) {
      const row = item(page, ride.name);
      await expect(row.getByRole('link', { name: 'Open session' }).getAttribute('href')).resolves.toMatch(/^\/sessions\/[0-9a-f-]{36}$/);
    }
    const refused = item(page, REFUSED_NAME);
    await expect(refused.getAttribute('data-status')).resolves.toBe('refused');
    const refusal = (await refused.textContent()) ?? '';
    expect(refusal).toContain('line 2');
    expect(refusal).toContain('no time column');

    // The results were announced, not only drawn.
    const log = (await page.getByRole('log').textContent()) ?? '';
    expect(log).toContain(`${rides[0].name} accepted`);
    expect(log).toContain(`${REFUSED_NAME} refused at line 2`);

    expect(await seriousViolations(page)).toEqual([]);

    // The same ride again is recognised, and says which session it already is.
    await dragFiles(page, [rides[0]]);
    await waitForResults(page, 4);
    const again = page.getByTestId('upload-item').nth(3);
    await expect(again.getAttribute('data-status')).resolves.toBe('duplicate');
    await expect(again.textContent()).resolves.toContain('Already in Kinloop as the session of Friday, 14 March 2025, 09:27');
    await context.close();
  });

  it('the session page shows the figures and charts, offers the original file to its uploader, and passes axe-core', async () => {
    const sessionUrl = await sessionOfJonah(ride('2025-01-20T15:40:00.000Z', 24.8));
    const { context, page } = await signedIn('carer@kinloop.test');
    await page.goto(`${baseUrl()}${sessionUrl}`);
    await expect(page.getByRole('heading', { level: 1 }).textContent()).resolves.toMatch(/^Session of /);
    const figures = (await page.locator('dl').first().textContent()) ?? '';
    expect(figures).toContain('Duration2 min');
    expect(figures).toContain('Active1.5 min');
    expect(figures).toContain('Mean cadence42 rpm');
    // The charts come after the page, with their series (SessionCharts.tsx).
    await page.locator('canvas[role="img"]').nth(1).waitFor();
    await expect(page.locator('canvas[role="img"]').count()).resolves.toBe(2);
    await expect(page.getByRole('link', { name: 'Download the original file' }).count()).resolves.toBe(1);
    await expect(page.getByRole('link', { name: 'Back to Jonah Pryce' }).count()).resolves.toBe(1);
    await page.getByText('Cadence and power minute by minute').click();
    await expect(page.getByRole('table', { name: /Cadence and power, mean/ }).locator('tbody tr').count()).resolves.toBe(2);
    expect(await seriousViolations(page)).toEqual([]);
    await context.close();
  });

  it('a session the viewer may not see is a friendly 404', async () => {
    const sessionUrl = await sessionOfJonah(ride('2025-01-22T15:40:00.000Z', 25.2));
    const { context, page } = await signedIn('carer2@kinloop.test');
    const res = await page.goto(`${baseUrl()}${sessionUrl}`);
    expect(res?.status()).toBe(404);
    await expect(page.getByRole('heading', { level: 1 }).textContent()).resolves.toBe('Session not found');
    await context.close();
  });

  it('works by keyboard: Tab reaches the drop zone, Enter opens the file chooser', async () => {
    const { context, page } = await signedIn('carer@kinloop.test');
    await openUploadFor(page, 'Jonah Pryce');
    await page.getByLabel('Client', { exact: true }).focus();
    let reached = false;
    for (let i = 0; i < 6 && !reached; i++) {
      await page.keyboard.press('Tab');
      reached = await page.evaluate(() => document.activeElement?.textContent?.includes('Choose ride files, or drop them here') ?? false);
    }
    expect(reached).toBe(true);
    const outline = await page.evaluate(() => getComputedStyle(document.activeElement!).outlineStyle);
    expect(outline).toBe('solid');
    // Playwright turns on file-chooser interception with a round trip of its own;
    // one more round trip to the page before pressing makes sure it is on.
    const chooserOpened = page.waitForEvent('filechooser');
    await page.evaluate(() => new Promise((r) => requestAnimationFrame(r)));
    await page.keyboard.press('Enter');
    const chooser = await chooserOpened;
    expect(chooser.isMultiple()).toBe(true);
    await chooser.setFiles({ name: CHOSEN.name, mimeType: 'text/csv', buffer: Buffer.from(CHOSEN.text) });
    await waitForResults(page, 1);
    await expect(item(page, CHOSEN.name).getAttribute('data-status')).resolves.toBe('accepted');
    await context.close();
  });
});

describe('the devices page', () => {
  it('previews a sample file live as the profile changes, saves the profile and a device, and passes axe-core', async () => {
    const { context, page } = await signedIn('admin@kinloop.test');
    await page.goto(`${baseUrl()}/admin/devices`);
    await page.getByRole('button', { name: 'Save import profile' }).waitFor();
    expect(await seriousViolations(page)).toEqual([]);

    const sample = ['Bench rig K', 'Serial: KL-TEST-7', '', 'Elapsed (s),Crank speed,Power (W)', ...Array.from({ length: 30 }, (_, t) => `${t},${40 + (t % 3)},${12 + (t % 5)}`)].join('\n');
    await page.getByLabel('Sample ride file').setInputFiles({ name: 'bench-k.csv', mimeType: 'text/csv', buffer: Buffer.from(sample) });
    const headers = page.getByRole('table', { name: 'How each header was read' });
    await expect(headers.getByRole('row', { name: /Crank speed/ }).textContent({ timeout: 10_000 })).resolves.toContain('Ignored');

    await page.getByLabel('Header in the file').fill('Crank speed');
    await page.getByLabel('Kinloop field').selectOption('cadence');
    await page.waitForFunction(() => {
      const rows = Array.from(document.querySelectorAll('table tr'));
      return rows.some((r) => r.textContent?.includes('Crank speed') && r.textContent.includes('Cadence'));
    });
    await expect(page.getByRole('table', { name: 'First rows as Kinloop reads them' }).textContent()).resolves.toContain('Cadence (rpm)');

    const name = `Bench rig K ${randomInt(0, 1_000_000)}`;
    await page.getByLabel('Name', { exact: true }).fill(name);
    await page.getByRole('button', { name: 'Save import profile' }).click();
    await page.getByRole('status').filter({ hasText: `Saved “${name}”` }).waitFor();
    await page.getByRole('button', { name: `Edit ${name}` }).waitFor();

    const devices = page.locator('section[aria-labelledby="devices-h"]');
    await devices.getByLabel('Serial').fill('KL-TEST-7');
    await devices.getByLabel('Import profile').selectOption({ label: name });
    await devices.getByRole('button', { name: 'Save device' }).click();
    await page.getByRole('cell', { name: 'KL-TEST-7', exact: true }).waitFor();
    await expect(page.getByRole('row', { name: /KL-TEST-7/ }).textContent()).resolves.toContain(name);

    expect(await seriousViolations(page)).toEqual([]);
    await context.close();
  });
});
