import { chromium, type Browser, type Page } from 'playwright-core';

// Debian's Chromium, headless, with every background connection off: the
// network here is closed and Chromium would otherwise retry its own services.
export function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--no-first-run',
      '--disable-quic',
      '--disable-dev-shm-usage',
    ],
  });
}

export const baseUrl = () => process.env.KINLOOP_BASE_URL ?? 'http://127.0.0.1:4391';

/** Signs in through the real sign-in page and waits for the role's home. */
export async function signInThroughPage(page: Page, email: string, password = process.env.KINLOOP_DEMO_PASSWORD ?? 'kinloop-demo-2026') {
  await page.goto(`${baseUrl()}/sign-in`);
  await waitForIslands(page);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await Promise.all([page.waitForURL((u) => !u.pathname.startsWith('/sign-in')), page.getByRole('button', { name: 'Sign in' }).click()]);
}

/**
 * Waits until every island on the page has hydrated (Astro drops the `ssr`
 * attribute then): typing into a form before that can be undone by hydration.
 */
export async function waitForIslands(page: Page) {
  await page.waitForFunction(() => document.querySelectorAll('astro-island[ssr]').length === 0);
}
