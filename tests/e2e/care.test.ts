import { mkdirSync } from 'node:fs';
import path from 'node:path';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seriousViolations } from '../support/axe';
import { baseUrl, launchBrowser, signInThroughPage, waitForIslands } from '../support/browser';

// Before and between rides, as each role meets it on the demo: the therapist
// screens Wren (not screened yet), uploads her clearance, writes Dev's plan
// (at risk, none on file), accepts Jonah's proposed step and writes to him;
// Jonah sees his new target and answers.

const SHOTS = process.env.KINLOOP_SHOTS_DIR;

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

async function look(page: Page, name: string) {
  expect(await seriousViolations(page), name).toEqual([]);
  if (SHOTS) {
    mkdirSync(SHOTS, { recursive: true });
    await page.screenshot({ path: path.join(SHOTS, `care-${name}.png`), fullPage: true });
  }
}

async function as(email: string): Promise<{ context: BrowserContext; page: Page }> {
  const context = await browser.newContext({ locale: 'en-GB', viewport: { width: 1280, height: 900 } });
  const page = await context.newPage();
  await signInThroughPage(page, email);
  return { context, page };
}

async function clientId(page: Page, name: string): Promise<string> {
  const { clients } = await page.request.get(`${baseUrl()}/api/clients`).then((r) => r.json());
  return clients.find((c: { name: string }) => c.name === name).id;
}

/** A small PDF made here: its first bytes are what Kinloop checks. */
const PDF = Buffer.from('%PDF-1.4\n1 0 obj\n<< /Type /Catalog >>\nendobj\ntrailer\n<< /Root 1 0 R >>\n%%EOF\n', 'latin1');

describe('screening, clearance and the plan, as the therapist', () => {
  it('screens Wren and uploads her clearance; her readiness becomes cleared', async () => {
    const { context, page } = await as('therapist@kinloop.test');
    const wren = await clientId(page, 'Wren Tallis');
    await page.goto(`${baseUrl()}/clients/${wren}`);
    const care = page.getByTestId('client-care');
    expect(await care.getByTestId('readiness').textContent()).toContain('Not screened');
    await page.getByRole('navigation', { name: 'Client record' }).getByRole('link', { name: 'Screening and clearance' }).click();
    await page.waitForURL(`**/clients/${wren}/care`);
    await waitForIslands(page);
    await page.getByTestId('screening-bone_health').waitFor();
    for (const item of ['bone_health', 'heterotopic_ossification', 'electrode_site_skin', 'autonomic_dysreflexia', 'implanted_devices', 'epilepsy', 'pregnancy', 'active_thrombosis']) {
      await page.getByTestId(`screening-${item}`).getByLabel('No concern').check();
    }
    await page.getByTestId('screening-pregnancy').getByLabel('Note on pregnancy').fill('Not pregnant; asked at the assessment.');
    await page.getByRole('button', { name: 'Save screening' }).click();
    await page.getByText('Screening saved as a new version.').waitFor();
    await page.getByText(/^Version 1, assessed on/).waitFor();

    await page.locator('#clearance-file').setInputFiles({ name: 'wren-clearance.pdf', mimeType: 'application/pdf', buffer: PDF });
    await page.getByLabel('Clearing clinician').fill('Dr Oriel Vantongeren');
    await page.getByRole('button', { name: 'Upload clearance' }).click();
    await page.getByText(/^Clearance saved: wren-clearance\.pdf, review on/).waitFor();
    const listed = page.getByTestId('clearance').first();
    expect(await listed.textContent()).toContain('Dr Oriel Vantongeren');
    const download = await page.request.get(`${baseUrl()}${await listed.getByRole('link', { name: /^Download/ }).getAttribute('href')}`);
    expect(Buffer.from(await download.body()).equals(PDF)).toBe(true);
    await look(page, 'therapist-screening-clearance');

    await page.reload();
    expect(await page.getByTestId('readiness').first().textContent()).toContain('Cleared');
    await context.close();
  });

  it('writes Dev’s plan: triage no longer says “No plan on file”', async () => {
    const { context, page } = await as('therapist@kinloop.test');
    await page.goto(`${baseUrl()}/triage`);
    const dev = page.getByTestId('client-row').filter({ has: page.getByRole('link', { name: 'Dev Ramaswamy', exact: true }) });
    await dev.getByTestId('no-plan').waitFor();

    const id = await clientId(page, 'Dev Ramaswamy');
    await page.goto(`${baseUrl()}/clients/${id}/care#plan`);
    await waitForIslands(page);
    await page.getByText(/has no plan on file/).waitFor();
    await page.getByLabel('Systolic (mmHg)').fill('100');
    await page.getByLabel('Diastolic (mmHg)').fill('62');
    await page.getByLabel('Signs this rider gets').fill('Headache behind the eyes, sweating on the face, a stuffy nose.');
    await page.getByLabel('First steps').fill('Stop the ride, sit Dev up, loosen the leg straps, check the catheter.');
    await page.getByLabel('Who to call').fill('His support worker, then the clinic; emergency services if it does not settle.');
    await page.getByRole('button', { name: 'Add an emergency contact' }).click();
    await page.getByLabel('Contact 1: name').fill('Ruth Okafor');
    await page.getByLabel('Contact 1: relationship').fill('support worker');
    await page.getByLabel('Contact 1: phone').fill('+44 7700 900123');
    await page.getByRole('button', { name: 'Save plan' }).click();
    await page.getByText(/^Plan saved as a new version/).waitFor();
    const card = page.getByTestId('ad-plan');
    expect(await card.getByRole('link', { name: /^Call Ruth Okafor/ }).getAttribute('href')).toBe('tel:+447700900123');
    await look(page, 'therapist-plan');

    await page.goto(`${baseUrl()}/triage`);
    await dev.waitFor();
    await expect(dev.getByTestId('no-plan').count()).resolves.toBe(0);
    await context.close();
  });
});

describe('progression and messages', () => {
  it('the therapist accepts Jonah’s proposed step and writes to him; Jonah sees the new target and answers', async () => {
    const { context, page } = await as('therapist@kinloop.test');
    await page.goto(`${baseUrl()}/triage`);
    await waitForIslands(page);
    const proposal = page.getByTestId('progression-proposal').filter({ hasText: 'Jonah Pryce' });
    await proposal.waitFor();
    const step = (await proposal.textContent())!.match(/(\d+) → (\d+) minutes per session/)!;
    await look(page, 'therapist-ready-to-progress');
    await proposal.getByRole('button', { name: /^Accept/ }).click();
    await page.getByTestId('progression-message').filter({ hasText: 'Accepted for Jonah Pryce' }).waitFor();

    const jonah = await clientId(page, 'Jonah Pryce');
    await page.goto(`${baseUrl()}/messages?clientId=${jonah}`);
    await waitForIslands(page);
    await page.getByLabel('Message', { exact: true }).fill('From Monday your rides are a little longer. How are the legs feeling?');
    await page.getByRole('button', { name: 'Send message' }).click();
    await page.getByText(/^Message sent/).waitFor();
    await look(page, 'therapist-messages');
    await context.close();

    const rider = await as('client@kinloop.test');
    await rider.page.goto(`${baseUrl()}/my-week`);
    const next = rider.page.getByTestId('next-target');
    await next.waitFor();
    expect(await next.textContent()).toContain(`${step[2]} minutes each session`);
    await look(rider.page, 'rider-week');

    await rider.page.goto(`${baseUrl()}/messages`);
    await waitForIslands(rider.page);
    const thread = rider.page.getByTestId('messages');
    await thread.waitFor();
    const newest = thread.locator(':scope > li').first();
    expect(await newest.textContent()).toContain('How are the legs feeling?');
    expect(await newest.textContent()).toContain('New');
    await rider.page.getByLabel('Message', { exact: true }).fill('Legs feel good, happy to go longer.');
    await rider.page.getByRole('button', { name: 'Send message' }).click();
    await thread.locator(':scope > li').first().filter({ hasText: 'Legs feel good' }).waitFor();
    await look(rider.page, 'rider-messages');
    await rider.context.close();
  });

  it('“Contact …” on a triage flag opens the thread with the flag quoted', async () => {
    const { context, page } = await as('therapist@kinloop.test');
    await page.goto(`${baseUrl()}/triage`);
    const dev = page.getByTestId('client-row').filter({ has: page.getByRole('link', { name: 'Dev Ramaswamy', exact: true }) });
    await dev.getByRole('link', { name: /^Contact Dev Ramaswamy about/ }).first().click();
    await page.waitForURL(/\/messages\?clientId=.+&flag=/);
    await waitForIslands(page);
    const quote = page.getByTestId('flag-quote');
    expect(await quote.textContent()).toMatch(/Power/);
    await page.getByLabel('Message', { exact: true }).fill('Your power has dropped; shall we talk on the phone this week?');
    await page.getByRole('button', { name: 'Send message' }).click();
    await page.getByTestId('messages').locator(':scope > li').first().filter({ hasText: 'About:' }).waitFor();
    await context.close();
  });
});
