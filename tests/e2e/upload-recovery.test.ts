// A file Kinloop stored but could not read shows on the upload page with why
// and a "Try again" button for the person who sent it; trying again reads it.
import { randomUUID } from 'node:crypto';
import { Readable } from 'node:stream';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../src/lib/db/knex';
import { putObjectStream } from '../../src/lib/storage/s3';
import { seriousViolations } from '../support/axe';
import { baseUrl, launchBrowser, signInThroughPage } from '../support/browser';
import { rideCsv } from '../support/rides';
import { createWorld, PASSWORD, type World } from '../support/world';

let browser: Browser;
let world: World;
beforeAll(async () => {
  [browser, world] = await Promise.all([launchBrowser(), createWorld('recovery')]);
});
afterAll(async () => {
  await browser?.close();
  await closeDb();
});

describe('the upload page and a file that could not be read', () => {
  it('shows the file, why it failed and "Try again"; trying again reads it and says so', async () => {
    const content = rideCsv({ startedAt: '2026-06-02T09:00:00Z' });
    const key = `rides/${world.clinicId}/${world.clientId}/${randomUUID()}`;
    await putObjectStream(key, Readable.from([Buffer.from(content)]));
    const message = 'Kinloop could not finish reading this file: reading the file took longer than 120 s. Kinloop tried 7 times. Choose “Try again” to read it once more; if it fails again, tell the clinic.';
    await world.knex('uploads').insert({
      client_id: world.clientId,
      clinic_id: world.clinicId,
      uploaded_by: world.users.carer.id,
      original_name: 'tuesday-ride.csv',
      byte_size: content.length,
      sha256: randomUUID(),
      storage_key: key,
      status: 'failed',
      error: JSON.stringify({ code: 'read_failed', message }),
      attempts: 7,
      processed_at: new Date(),
    });

    const context = await browser.newContext({ locale: 'en-GB', viewport: { width: 1000, height: 900 } });
    const page = await context.newPage();
    await signInThroughPage(page, world.users.carer.email, PASSWORD);
    await page.goto(`${baseUrl()}/upload`);
    const row = page.getByTestId('recent-upload').filter({ hasText: 'tuesday-ride.csv' });
    await row.waitFor();
    await expect(row.getByText('Could not be read', { exact: true }).isVisible()).resolves.toBe(true);
    await expect(row.getByText(message).isVisible()).resolves.toBe(true);
    expect(await seriousViolations(page)).toEqual([]);
    await page.screenshot({ path: '/tmp/kinloop-upload-failed.png', fullPage: true });

    await row.getByRole('button', { name: 'Try again: read tuesday-ride.csv' }).click();
    // Focus follows the file to its new state rather than falling back to the page.
    await page.waitForFunction(() => (document.activeElement as HTMLElement | null)?.dataset.role === 'upload-status');
    expect(await page.evaluate(() => document.activeElement?.closest('li')?.textContent)).toContain('tuesday-ride.csv');
    await row.getByText('Read', { exact: true }).waitFor({ timeout: 30_000 });
    await expect(row.getByRole('link', { name: 'Open the session of tuesday-ride.csv' }).isVisible()).resolves.toBe(true);
    await expect(row.getByRole('button').count()).resolves.toBe(0);
    await page.screenshot({ path: '/tmp/kinloop-upload-read-again.png', fullPage: true });
    await context.close();
  });
});
