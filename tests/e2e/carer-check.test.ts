import { mkdirSync } from 'node:fs';
import path from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seriousViolations } from '../support/axe';
import { baseUrl, launchBrowser, signInThroughPage } from '../support/browser';

// A carer records two checks for Jonah Pryce (T4, at risk of autonomic
// dysreflexia): a normal one that gives Kinloop a pre-ride baseline, then one
// with a systolic rise of 32 mmHg after the ride. The safety panel appears at
// once, and the therapist finds an urgent "Blood pressure rise" flag in triage.

const SHOTS = process.env.KINLOOP_SHOTS_DIR;

/** The whole page in screen-high pieces, small enough to look at one by one. */
async function screenshots(p: Page, name: string) {
  const { width, height } = p.viewportSize()!;
  const total = await p.evaluate(() => document.documentElement.scrollHeight);
  for (let y = 0, i = 1; y < total; y += height, i++) {
    await p.screenshot({ path: path.join(SHOTS!, `${name}-${i}.png`), fullPage: true, clip: { x: 0, y, width, height: Math.min(height, total - y) } });
  }
}
const WIDTHS = [390, 820, 1280];

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

async function shots(page: Page, name: string) {
  for (const width of WIDTHS) {
    await page.setViewportSize({ width, height: 900 });
    expect(await seriousViolations(page), `${name} at ${width} px`).toEqual([]);
    if (SHOTS) {
      mkdirSync(SHOTS, { recursive: true });
      await screenshots(page, `carer-${name}-${width}`);
    }
  }
  await page.setViewportSize({ width: 1280, height: 900 });
}

async function fillReading(page: Page, readings: Record<string, string>) {
  for (const [label, value] of Object.entries(readings)) await page.getByLabel(label, { exact: true }).fill(value);
}

async function save(page: Page) {
  await page.getByRole('button', { name: 'Save check' }).first().click();
  await page.getByTestId('check-outcome').waitFor();
}

describe('a carer’s check with a blood pressure rise', () => {
  it('shows the safety panel to the carer and an urgent flag to the therapist', async () => {
    const carer = await browser.newContext({ locale: 'en-GB', viewport: { width: 1280, height: 900 } });
    const page = await carer.newPage();
    await signInThroughPage(page, 'carer@kinloop.test');
    expect(new URL(page.url()).pathname).toBe('/carer');

    const jonah = page.getByTestId('carer-client').filter({ has: page.getByRole('heading', { name: 'Jonah Pryce' }) });
    await jonah.getByTestId('carer-week').waitFor();
    await expect(page.getByTestId('carer-client').count()).resolves.toBe(2);
    expect(await jonah.getByTestId('carer-week').textContent()).toMatch(/done this week|No sessions yet this week/);
    expect(await jonah.getByRole('link', { name: 'Upload rides for Jonah Pryce' }).getAttribute('href')).toMatch(/^\/upload\?clientId=[0-9a-f-]{36}$/);
    await shots(page, 'home');

    await jonah.getByRole('link', { name: 'Jonah Pryce’s prescription' }).click();
    await page.getByTestId('prescription-card').waitFor();
    expect(await page.getByRole('heading', { level: 1 }).textContent()).toBe('Prescription for Jonah Pryce');
    expect(await page.getByLabel('Client', { exact: true }).locator('option:checked').textContent()).toBe('Jonah Pryce');
    await shots(page, 'prescription');
    await page.goBack();
    await jonah.getByTestId('carer-week').waitFor();

    await jonah.getByRole('link', { name: 'Record a check for Jonah Pryce' }).click();
    await page.waitForURL((u) => u.pathname === '/checks');
    await page.getByRole('heading', { name: 'A check for Jonah Pryce' }).waitFor();
    await page.waitForFunction(() => !document.querySelector('button[type="submit"]')?.hasAttribute('disabled'));
    const picker = page.getByLabel('Client', { exact: true });
    expect(await picker.locator('option:checked').textContent()).toBe('Jonah Pryce');
    await shots(page, 'checks');

    // A first, unremarkable check: its pre-ride reading becomes the baseline.
    await fillReading(page, { 'Systolic before (mmHg)': '118', 'Diastolic before (mmHg)': '76', 'Heart rate before (bpm)': '72' });
    await page.getByRole('checkbox', { name: /^None: no warning signs/ }).check();
    await page.getByRole('checkbox', { name: 'Skin normal at every site' }).check();
    await expect(page.getByRole('checkbox', { name: 'Pounding headache' }).count()).resolves.toBe(0);
    await save(page);
    await page.getByRole('heading', { name: 'Check saved for Jonah Pryce' }).waitFor();
    await expect(page.getByTestId('safety-panel').count()).resolves.toBe(0);

    // A mistake is caught before anything is sent.
    await fillReading(page, { 'Systolic after (mmHg)': '150' });
    await page.getByRole('button', { name: 'Save check' }).first().click();
    await page.getByText('The check is not saved yet. Please look at:').waitFor();
    expect(await page.getByText('Diastolic pressure after the ride is missing.').count()).toBeGreaterThan(0);

    await fillReading(page, { 'Systolic before (mmHg)': '118', 'Diastolic before (mmHg)': '76', 'Diastolic after (mmHg)': '90', 'Minutes after the ride': '5', 'Heart rate after (bpm)': '64' });
    await save(page);
    const panel = page.getByTestId('safety-panel');
    await panel.waitFor();
    expect(await panel.getAttribute('role')).toBe('alert');
    await page.waitForFunction(() => document.activeElement?.id === 'safety-panel-h');
    const text = (await panel.textContent()) ?? '';
    for (const words of ['Stop the ride', 'Sit the rider upright', 'Loosen anything tight', 'Check the bladder', 'Measure blood pressure again every few minutes', 'autonomic dysreflexia plan', 'Call emergency services', 'The clinic has been alerted']) {
      expect(text).toContain(words);
    }
    expect(text).toContain('150 mmHg');
    // Jonah's own plan from the clinic, under the general steps, with his contacts as tel: links.
    const plan = panel.getByTestId('ad-plan');
    expect(await plan.textContent()).toContain('Pounding headache');
    expect(await plan.getByRole('link', { name: /^Call Ruth Okafor/ }).getAttribute('href')).toBe('tel:+447700900123');
    await shots(page, 'safety-panel');
    const latest = page.getByTestId('recent-check').first();
    await latest.getByText('Urgent: Blood pressure rise').waitFor();
    await carer.close();

    const clinic = await browser.newContext({ locale: 'en-GB', viewport: { width: 1280, height: 900 } });
    const therapist = await clinic.newPage();
    await signInThroughPage(therapist, 'therapist@kinloop.test');
    const api = await therapist.request.get(`${baseUrl()}/api/triage`);
    const triage = (await api.json()).clients as { clientName: string; flags: { kind: string; severity: string }[] }[];
    const entry = triage.find((c) => c.clientName === 'Jonah Pryce');
    expect(entry?.flags.some((f) => f.kind === 'bp_rise' && f.severity === 'urgent')).toBe(true);

    await therapist.goto(`${baseUrl()}/triage`);
    const row = therapist.getByTestId('client-row').filter({ has: therapist.getByRole('link', { name: 'Jonah Pryce', exact: true }) });
    await row.waitFor();
    const flag = row.locator('[data-testid="flag"][data-kind="bp_rise"]');
    expect(await flag.getAttribute('data-severity')).toBe('urgent');
    const flagText = await flag.textContent();
    expect(flagText).toContain('Blood pressure rise');
    expect(flagText).toContain('Urgent');
    await clinic.close();
  });
});
