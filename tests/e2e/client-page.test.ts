import { DateTime } from 'luxon';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seriousViolations } from '../support/axe';
import { baseUrl, launchBrowser } from '../support/browser';

// Annika Brand's program is steady and no other test reads it, so the writes
// (a prescription version, a pause, a note) go to her record.
const WRITABLE = 'Annika Brand';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

/** Every island has hydrated (Astro drops the `ssr` attribute then), so typing reaches React. */
async function hydrated(page: Page) {
  await page.waitForFunction(() => document.querySelector('astro-island[ssr]') === null);
}

async function signedIn(email: string): Promise<{ context: BrowserContext; page: Page }> {
  const context = await browser.newContext({ locale: 'en-GB', viewport: { width: 1280, height: 900 } });
  const page = await context.newPage();
  // As signInThroughPage, but typing starts once the form has hydrated: on a busy
  // machine hydration can otherwise land mid-typing and empty the fields.
  await page.goto(`${baseUrl()}/sign-in`);
  await hydrated(page);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(process.env.KINLOOP_DEMO_PASSWORD ?? 'kinloop-demo-2026');
  await Promise.all([page.waitForURL((u) => !u.pathname.startsWith('/sign-in')), page.getByRole('button', { name: 'Sign in' }).click()]);
  return { context, page };
}

async function clientIdOf(page: Page, name: string): Promise<string> {
  const { clients } = await page.request.get(`${baseUrl()}/api/clients`).then((r) => r.json());
  const found = clients.find((c: { name: string }) => c.name === name);
  if (!found) throw new Error(`No demo client called ${name}`);
  return found.id;
}

async function openClient(page: Page, name: string, view = ''): Promise<string> {
  const id = await clientIdOf(page, name);
  await page.goto(`${baseUrl()}/clients/${id}${view}`);
  await hydrated(page);
  return id;
}

const sessionRows = (page: Page, caption: string) => page.getByRole('region', { name: caption }).locator('tbody tr');

describe('the client page', () => {
  it('answers "is this client all right, and what changed?" on the overview: flags, program, four charts with their tables, the latest sessions; passes axe-core', async () => {
    const { context, page } = await signedIn('therapist@kinloop.test');
    await openClient(page, 'Dev Ramaswamy');
    await expect(page.getByRole('heading', { level: 1 }).textContent()).resolves.toBe('Dev Ramaswamy');
    await expect(page.getByText('Spinal cord injury, C6 AIS B').count()).resolves.toBe(1);
    await page.getByText('Prescription in effect', { exact: true }).waitFor();
    await page.getByText(/\d+ sessions a week, \d+ min each/).first().waitFor();
    // The seeded power drop is on the overview, worded as on triage.
    const flag = page.getByTestId('overview-flag').filter({ hasText: 'Power drop' });
    await expect(flag.count()).resolves.toBe(1);

    await page.locator('canvas').nth(3).waitFor();
    await expect(page.locator('canvas').count()).resolves.toBe(4);
    for (const title of ['Mean power per session', 'Session length against the prescription', 'Current per watt', 'Sessions per week']) {
      await expect(page.getByRole('heading', { name: title, exact: true }).count()).resolves.toBe(1);
    }
    // Each chart's numbers are there as a table too.
    await page.getByText('The numbers behind this chart').first().click();
    await expect(page.getByRole('region', { name: 'Mean power per session, with the usual level and the review line' }).locator('tbody tr').count()).resolves.toBeGreaterThan(10);

    // One baseline, one rounding: the usual level in the flag's reason is the one the chart's sentence gives.
    const reason = (await flag.textContent()) ?? '';
    const sentence = (await page.locator('#power-chart-summary').textContent()) ?? '';
    const usual = /the usual ([\d.]+ W)/.exec(reason)?.[1];
    expect(usual).toBeTruthy();
    expect(sentence).toContain(`The usual level is ${usual}`);

    // The latest five sessions, and all of them on their own view.
    await sessionRows(page, 'Latest sessions, newest first').first().waitFor();
    await expect(sessionRows(page, 'Latest sessions, newest first').count()).resolves.toBe(5);
    expect(await seriousViolations(page)).toEqual([]);
    // Far shorter than the one long page it replaces (9,435 px at this width).
    expect(await page.evaluate(() => document.documentElement.scrollHeight)).toBeLessThan(3000);

    await Promise.all([page.waitForURL(/\/sessions$/), page.getByRole('navigation', { name: 'Client record' }).getByRole('link', { name: 'All sessions' }).click()]);
    await hydrated(page);
    await expect(page.getByRole('link', { name: 'All sessions' }).getAttribute('aria-current')).resolves.toBe('page');
    await sessionRows(page, 'Sessions, newest first').first().waitFor();
    // Half a year at three a week is more than one page of fifty sessions.
    await expect(sessionRows(page, 'Sessions, newest first').count()).resolves.toBe(50);
    expect(await sessionRows(page, 'Sessions, newest first').first().getByRole('link').getAttribute('href')).toMatch(/^\/sessions\/[0-9a-f-]{36}$/);
    await page.getByRole('button', { name: 'Load older sessions' }).click();
    await page.waitForFunction(() => document.querySelectorAll('[aria-label="Sessions, newest first"] tbody tr').length > 50);
    expect(await seriousViolations(page)).toEqual([]);
    await context.close();
  });

  it('shows a client’s flags with their history and actions on the flags view, with the caution, and passes axe-core', async () => {
    const { context, page } = await signedIn('therapist@kinloop.test');
    await openClient(page, 'Noor Haddad', '/flags');
    await page.getByRole('note', { name: 'Safety' }).waitFor();
    await page.getByRole('heading', { name: 'Missed sessions' }).first().waitFor();
    // The actions name the flag, so a voice user can tell one flag's buttons from another's.
    await expect(page.getByRole('button', { name: 'Acknowledge missed sessions' }).count()).resolves.toBe(1);
    await expect(page.getByText('Urgent').count()).resolves.toBeGreaterThan(0);
    await expect(page.getByText(/No session for \d+ days since the last one on [A-Z][a-z]+day \d+ [A-Z][a-z]+\./).count()).resolves.toBeGreaterThan(0);
    expect(await seriousViolations(page)).toEqual([]);
    await context.close();
  });

  it('refuses an out-of-range value with a summary at the top that has focus and links to the field, then saves and keeps focus on the message', async () => {
    const { context, page } = await signedIn('therapist@kinloop.test');
    await openClient(page, WRITABLE, '/prescription');
    await page.getByRole('button', { name: 'Change the prescription' }).click();
    const form = page.locator('form', { has: page.getByRole('heading', { name: 'New prescription version' }) });
    const minutes = form.getByLabel('Minutes per session');
    const usual = await minutes.inputValue();
    const save = form.getByRole('button', { name: /^Save as version \d+$/ });
    const version = Number((await save.textContent())!.replace(/\D+/g, ''));
    // The channel limits stay folded while unchanged.
    await expect(form.getByRole('button', { name: 'Change the channel limits' }).count()).resolves.toBe(1);

    await minutes.fill('70');
    await save.click();
    const summary = page.getByTestId('rx-error-summary');
    await summary.waitFor();
    await page.waitForFunction(() => document.activeElement?.getAttribute('data-testid') === 'rx-error-summary');
    await summary.getByRole('link', { name: /Minutes per session: enter 10–60 minutes/ }).click();
    await expect(minutes.evaluate((el) => el === document.activeElement)).resolves.toBe(true);
    await expect(minutes.getAttribute('aria-invalid')).resolves.toBe('true');

    // A version that changes nothing is refused (the notes of the version before are kept only when asked for).
    await minutes.fill(usual);
    const keep = form.getByLabel(/^Keep these notes for version/);
    const hadNotes = (await keep.count()) > 0;
    if (hadNotes) await keep.check();
    await save.click();
    await summary.getByText(/Nothing differs from version \d+/).waitFor();

    if (hadNotes) await keep.uncheck();
    const cadence = form.getByLabel('Target cadence (rpm)');
    await cadence.fill((await cadence.inputValue()) === '44' ? '46' : '44');
    await form.getByLabel(/^Notes for version/).fill('Cadence eased a little while the new cycle settles in.');
    await save.click();
    const saved = page.getByTestId('rx-saved');
    await saved.getByText(`Version ${version} saved`).waitFor();
    await page.waitForFunction(() => document.activeElement?.getAttribute('data-testid') === 'rx-saved');

    const history = page.getByRole('list', { name: 'Prescription versions, newest first' });
    const newest = history.locator(':scope > li').first();
    await newest.filter({ hasText: new RegExp(`^\\s*Version ${version}\\D`) }).waitFor();
    await expect(newest.textContent()).resolves.toContain('Saved by Tomás Whitcombe');
    await expect(newest.textContent()).resolves.toMatch(/Target cadence: .+ → 4[46] rpm/);
    await context.close();
  });

  it('adds a pause that is listed as planned, cancels it, and adds a note', async () => {
    const { context, page } = await signedIn('therapist@kinloop.test');
    await openClient(page, WRITABLE, '/pauses');
    // Far ahead, so that this run's pause changes nothing in the weeks the other tests look at.
    const from = DateTime.now().setZone('Europe/London').plus({ days: 300 + Math.floor(Math.random() * 30) }).startOf('day');
    const reason = `Holiday abroad ${from.toMillis()}`;
    const pauses = page.locator('main');
    await pauses.getByLabel('From').fill(from.toISODate()!);
    await pauses.getByLabel('To', { exact: true }).fill(from.plus({ days: 6 }).toISODate()!);
    await pauses.getByLabel('Reason').fill(reason);
    await pauses.getByRole('button', { name: 'Add pause' }).click();
    const item = pauses.getByRole('listitem').filter({ hasText: reason });
    await item.waitFor();
    await expect(item.textContent()).resolves.toContain('Planned');

    await item.getByRole('button', { name: /^Cancel pause of / }).click();
    await item.getByRole('button', { name: 'Yes, cancel it' }).click();
    await pauses.getByRole('listitem').filter({ hasText: reason }).filter({ hasText: 'Cancelled' }).waitFor();

    await openClient(page, WRITABLE, '/notes');
    const note = `Spoke with Annika about the new cycle (${from.toMillis()}).`;
    const notes = page.locator('main');
    await notes.getByLabel('New note').fill(note);
    await notes.getByRole('button', { name: 'Add note' }).click();
    await notes.getByRole('listitem').filter({ hasText: note }).waitFor();
    await expect(notes.getByRole('listitem').filter({ hasText: note }).textContent()).resolves.toContain('Tomás Whitcombe');
    await context.close();
  });

  it('shows a carer the program but not the notes, flags or invitations', async () => {
    const { context, page } = await signedIn('carer@kinloop.test');
    await openClient(page, 'Jonah Pryce');
    await page.locator('canvas').first().waitFor();
    const views = page.getByRole('navigation', { name: 'Client record' });
    for (const hidden of ['Flags', 'Notes', 'Details and invitations']) {
      await expect(views.getByRole('link', { name: hidden, exact: true }).count()).resolves.toBe(0);
    }
    expect(await seriousViolations(page)).toEqual([]);
    await openClient(page, 'Jonah Pryce', '/prescription');
    await page.getByRole('heading', { name: 'In effect now' }).waitFor();
    await expect(page.getByRole('note', { name: 'Safety' }).count()).resolves.toBe(1);
    await expect(page.getByRole('button', { name: 'Change the prescription' }).count()).resolves.toBe(0);
    const flags = await page.goto(`${baseUrl()}/clients/${await clientIdOf(page, 'Jonah Pryce')}/flags`);
    expect(flags?.status()).toBe(404);
    await context.close();
  });
});

describe('adding a client', () => {
  it('creates a client through /clients/new and lands on their page; the form passes axe-core', async () => {
    const { context, page } = await signedIn('therapist@kinloop.test');
    await page.goto(`${baseUrl()}/clients/new`);
    await hydrated(page);
    expect(await seriousViolations(page)).toEqual([]);

    const name = `Ilse Marwood ${Date.now()}`;
    await page.getByRole('button', { name: 'Add client' }).click();
    await page.getByText('Name: enter the client’s name.').waitFor();

    await page.getByLabel('Name').fill(name);
    await page.getByLabel('Time zone').selectOption('Europe/Dublin');
    await page.getByLabel('Diagnosis').selectOption('sci');
    await page.getByLabel('Neurological level').fill('T6');
    await page.getByLabel('AIS grade').selectOption('B');
    await page.getByLabel('Autonomic dysreflexia risk').selectOption('at_risk');
    await Promise.all([page.waitForURL(/\/clients\/[0-9a-f-]{36}$/), page.getByRole('button', { name: 'Add client' }).click()]);
    await expect(page.getByRole('heading', { level: 1 }).textContent()).resolves.toBe(name);
    await expect(page.getByText('Spinal cord injury, T6 AIS B').count()).resolves.toBe(1);
    await hydrated(page);
    await page.getByText('No prescription in effect yet').waitFor();
    expect(await seriousViolations(page)).toEqual([]);
    await page.getByRole('navigation', { name: 'Client record' }).getByRole('link', { name: 'Details and invitations' }).click();
    await expect(page.getByText('Europe/Dublin').count()).resolves.toBe(1);
    await hydrated(page);
    expect(await seriousViolations(page)).toEqual([]);
    await context.close();
  });
});

describe('clinic settings', () => {
  it('explains each threshold with its default, shows the server’s message by the field, and passes axe-core', async () => {
    const { context, page } = await signedIn('admin@kinloop.test');
    await page.goto(`${baseUrl()}/admin/settings`);
    await hydrated(page);
    const urgent = page.getByLabel(/^Power drop that is urgent/);
    await urgent.waitFor();
    await page.getByRole('note', { name: 'Safety' }).waitFor();
    await expect(page.getByText('Kinloop’s default: 35.').count()).resolves.toBe(1);
    expect(await seriousViolations(page)).toEqual([]);

    // Below the review drop: refused, nothing saved.
    await urgent.fill('10');
    await page.getByRole('button', { name: 'Save thresholds' }).click();
    await page.getByText('The urgent power drop must be at least the review power drop').waitFor();
    const { flagThresholds } = await page.request.get(`${baseUrl()}/api/clinic/settings`).then((r) => r.json());
    expect(flagThresholds.powerDropUrgentPct).not.toBe(10);
    await context.close();
  });
});
