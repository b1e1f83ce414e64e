import { mkdirSync } from 'node:fs';
import path from 'node:path';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seriousViolations } from '../support/axe';
import { baseUrl, launchBrowser, signInThroughPage } from '../support/browser';

// The rider's pages, as Jonah Pryce (client@kinloop.test) sees them. Every
// page passes axe-core at a phone and a desktop width, and the two things a
// rider does here (choose a goal, say how a ride went) work from the keyboard alone.

const WIDTHS = [390, 820, 1280];
/** Set KINLOOP_SHOTS_DIR to keep a full-page screenshot of each page at each width, for looking at the layout. */
const SHOTS = process.env.KINLOOP_SHOTS_DIR;

/** The whole page in screen-high pieces, small enough to look at one by one. */
async function screenshots(p: Page, name: string) {
  const { width, height } = p.viewportSize()!;
  const total = await p.evaluate(() => document.documentElement.scrollHeight);
  for (let y = 0, i = 1; y < total; y += height, i++) {
    await p.screenshot({ path: path.join(SHOTS!, `${name}-${i}.png`), fullPage: true, clip: { x: 0, y, width, height: Math.min(height, total - y) } });
  }
}

let browser: Browser;
let context: BrowserContext;
let page: Page;
beforeAll(async () => {
  browser = await launchBrowser();
  context = await browser.newContext({ locale: 'en-GB', viewport: { width: 1280, height: 900 } });
  page = await context.newPage();
  await signInThroughPage(page, 'client@kinloop.test');
});
afterAll(async () => {
  await browser?.close();
});

/** axe-core at every width (and screenshots when asked for). */
async function checkAtEveryWidth(name: string) {
  for (const width of WIDTHS) {
    await page.setViewportSize({ width, height: 900 });
    expect(await seriousViolations(page), `${name} at ${width} px`).toEqual([]);
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    expect(overflow, `${name} scrolls sideways at ${width} px`).toBeLessThanOrEqual(0);
    if (SHOTS) {
      mkdirSync(SHOTS, { recursive: true });
      await screenshots(page, `rider-${name}-${width}`);
    }
  }
  await page.setViewportSize({ width: 1280, height: 900 });
}

const focused = (p: Page) =>
  p.evaluate(() => {
    const el = document.activeElement as HTMLElement | null;
    const style = el ? getComputedStyle(el) : null;
    return {
      tag: el?.tagName.toLowerCase(),
      type: el?.getAttribute('type'),
      name: el?.getAttribute('name'),
      value: (el as HTMLInputElement | null)?.value,
      text: el?.textContent?.trim(),
      label: (el as HTMLInputElement | null)?.labels?.[0]?.textContent?.trim(),
      outline: style ? style.outlineStyle !== 'none' && parseFloat(style.outlineWidth) >= 2 : false,
    };
  });

/** Presses Tab until the focused element matches, and returns it. */
async function tabUntil(p: Page, matches: (f: Awaited<ReturnType<typeof focused>>) => boolean, limit = 80) {
  for (let i = 0; i < limit; i++) {
    await p.keyboard.press('Tab');
    const f = await focused(p);
    if (matches(f)) return f;
  }
  throw new Error('Tab never reached the element');
}

describe('the rider’s pages', () => {
  it('My week shows the sessions against the prescription, the streak, the next ride and the latest ride', async () => {
    await page.goto(`${baseUrl()}/my-week`);
    await expect(page.getByRole('heading', { level: 1 }).textContent()).resolves.toBe('My week');
    const headline = page.getByTestId('week-headline');
    await headline.waitFor();
    expect(await headline.textContent()).toMatch(/^(\d+ of \d+ sessions? done this week|\d+ sessions? done this week.*|No sessions yet this week)$/);
    expect(await page.getByTestId('next-due').textContent()).toMatch(/Next session: |sessions are done|paused|No sessions are set/);
    expect(await page.getByTestId('streak').textContent()).toMatch(/week streak|No streak yet/);
    const latest = page.getByRole('link', { name: 'See this session in full' });
    expect(await latest.getAttribute('href')).toMatch(/^\/sessions\/[0-9a-f-]{36}$/);
    for (const name of ['Record how a ride went', 'Upload rides', 'My prescription']) {
      const box = await page.getByRole('navigation', { name: 'Things to do' }).getByRole('link', { name }).boundingBox();
      expect(box!.height, name).toBeGreaterThanOrEqual(56);
    }
    await checkAtEveryWidth('my-week');
  });

  it('Progress has the three weekly charts with tables, the personal bests and the goal summary', async () => {
    await page.goto(`${baseUrl()}/progress`);
    await page.getByTestId('totals').waitFor();
    expect(await page.getByTestId('totals').textContent()).toMatch(/^Since your program started: \d+ sessions/);
    await expect(page.locator('canvas[role="img"]').count()).resolves.toBe(3);
    for (const title of ['Mean power', 'Active minutes', 'Distance']) {
      const table = page.getByRole('table', { name: `${title}, week by week` });
      await page.getByText(`Show ${title.toLowerCase()} as a table`).click();
      await expect(table.getByRole('row').count()).resolves.toBeGreaterThan(10);
    }
    const bests = page.getByTestId('best');
    await expect(bests.count()).resolves.toBe(3);
    expect(await bests.nth(0).textContent()).toMatch(/Longest active session\d+ (min|h)/);
    expect(await bests.nth(1).textContent()).toMatch(/Highest 5-second power[\d.]+ W/);
    await page.getByRole('heading', { name: 'Distance goal' }).waitFor();
    await checkAtEveryWidth('progress');
  });

  it('chooses a built-in route and saves it with the keyboard alone, then sees the route drawn with the next milestone', async () => {
    await page.goto(`${baseUrl()}/goal`);
    await page.getByRole('button', { name: 'Save distance goal' }).waitFor();
    await page.waitForFunction(() => !document.querySelector('button[type="submit"]')?.hasAttribute('disabled'));
    await page.locator('body').focus();
    const route = await tabUntil(page, (f) => f.name === 'route');
    expect(route.outline).toBe(true);
    await page.keyboard.press('ArrowDown');
    await page.keyboard.press('ArrowDown');
    const chosen = await focused(page);
    expect(chosen.label).toContain('Down the Danube');
    await tabUntil(page, (f) => f.name === 'count-from');
    await page.keyboard.press('Space');
    const save = await tabUntil(page, (f) => f.tag === 'button' && f.text === 'Save distance goal');
    expect(save.outline).toBe(true);
    await page.keyboard.press('Enter');
    await page.getByRole('status').filter({ hasText: 'Saved. Your distance goal is now Down the Danube: Passau to Vienna.' }).waitFor();
    await expect(page.getByRole('heading', { name: 'Where you are on Down the Danube: Passau to Vienna' }).isVisible()).resolves.toBe(true);
    await expect(page.getByTestId('route-drawing').isVisible()).resolves.toBe(true);
    expect(await page.getByTestId('next-milestone').textContent()).toMatch(/^(Next milestone: .+, [\d.,]+ km to go\.|You have reached the finish)/);
    expect(await page.getByTestId('goal-travelled').first().textContent()).toMatch(/^[\d.,]+ km of [\d.,]+ km \(\d+ %\)$/);
    await checkAtEveryWidth('goal');

    await page.reload();
    await page.getByRole('radio', { name: /Down the Danube/ }).waitFor();
    await expect(page.getByRole('radio', { name: /Down the Danube/ }).isChecked()).resolves.toBe(true);
  });

  it('enters a route of its own with buttons for the rows, and is told which field needs a look', async () => {
    await page.goto(`${baseUrl()}/goal`);
    await page.getByRole('radio', { name: /My own route/ }).check();
    await page.getByRole('button', { name: 'Save distance goal' }).click();
    await page.getByText('The goal was not saved').waitFor();
    await expect(page.getByText('Give the route a name.').isVisible()).resolves.toBe(true);

    await page.getByLabel('Route name').fill('Round the harbour');
    await page.getByRole('button', { name: 'Add a point' }).click();
    const activeName = await focused(page);
    expect(activeName.label).toMatch(/^Name/);
    const points = page.getByRole('group', { name: /^Point \d/ });
    await expect(points.count()).resolves.toBe(3);
    const rows = [
      ['Old pier', '50.8195', '-0.1363'],
      ['Lighthouse', '50.80', '-0.05'],
      ['Boat sheds', '50.79', '0.05'],
    ];
    for (const [i, [name, lat, lon]] of rows.entries()) {
      const row = points.nth(i);
      await row.getByLabel('Name').fill(name);
      await row.getByLabel('Latitude').fill(lat);
      await row.getByLabel('Longitude').fill(lon);
    }
    await page.getByRole('button', { name: 'Remove point 2' }).click();
    await expect(points.count()).resolves.toBe(2);
    await page.getByRole('radio', { name: /^Today/ }).check();
    await page.getByRole('button', { name: 'Save distance goal' }).click();
    await page.getByRole('status').filter({ hasText: 'Saved. Your distance goal is now Round the harbour.' }).waitFor();
    expect(await page.getByTestId('goal-travelled').first().textContent()).toMatch(/^[\d.,]+ km of [\d.,]+ km \(\d+ %\)$/);
    await checkAtEveryWidth('goal-own-route');
  });

  it('My prescription is a printable card with who set it and the safety caution', async () => {
    await page.goto(`${baseUrl()}/my-prescription`);
    const card = page.getByTestId('prescription-card');
    expect(await card.textContent()).toContain('Sessions per week');
    expect((await page.getByTestId('prescription-set-by').textContent())?.trim()).toMatch(/^Set by .+ on \d+ \w+ \d{4}\.$/);
    expect(await page.getByRole('note', { name: 'Safety' }).textContent()).toContain('not a real-time monitor');
    await expect(page.getByRole('button', { name: 'Print this card' }).isVisible()).resolves.toBe(true);
    await checkAtEveryWidth('prescription');
    await page.emulateMedia({ media: 'print' });
    await expect(page.locator('body > header').isVisible()).resolves.toBe(false);
    await expect(page.getByRole('button', { name: 'Print this card' }).isVisible()).resolves.toBe(false);
    await expect(card.isVisible()).resolves.toBe(true);
    await page.emulateMedia({ media: 'screen' });
  });

  it('says how a ride went with the keyboard alone, and finds it among the recent checks', async () => {
    await page.goto(`${baseUrl()}/checks`);
    await expect(page.getByRole('heading', { level: 1 }).textContent()).resolves.toBe('How a ride went');
    await page.getByRole('heading', { name: 'How your ride went' }).waitFor();
    await page.waitForFunction(() => !document.querySelector('button[type="submit"]')?.hasAttribute('disabled'));
    await checkAtEveryWidth('checks');

    await page.locator('body').focus();
    await tabUntil(page, (f) => f.name === 'effort');
    // The radio itself is visually hidden; its box shows the focus ring.
    const ring = await page.evaluate(() => getComputedStyle(document.activeElement!.closest('label')!).outlineStyle);
    expect(ring).toBe('solid');
    for (let i = 0; i < 5; i++) await page.keyboard.press('ArrowRight');
    expect((await focused(page)).value).toBe('6');
    await tabUntil(page, (f) => f.name === 'otherEvents' && f.value === 'spasms');
    await page.keyboard.press('Space');
    await tabUntil(page, (f) => f.tag === 'textarea');
    const comment = `Felt steady today, legs warm by minute ten (${Date.now()}).`;
    await page.keyboard.type(comment);
    await tabUntil(page, (f) => f.tag === 'button' && f.text === 'Save check');
    await page.keyboard.press('Enter');

    const saved = page.getByRole('heading', { name: 'Thank you — your check is saved' });
    await saved.waitFor();
    await page.waitForFunction(() => document.activeElement?.textContent === 'Thank you — your check is saved');
    await expect(page.getByTestId('safety-panel').count()).resolves.toBe(0);
    const latest = page.getByTestId('recent-check').first();
    await latest.getByText(comment).waitFor();
    expect(await latest.textContent()).toContain('6 of 10');
    expect(await latest.textContent()).toContain('Spasms');
    expect(await seriousViolations(page)).toEqual([]);
  });

  it('turns session reminders off from the keyboard in the e-mail settings, and the choice stays', async () => {
    await page.goto(`${baseUrl()}/settings/notifications`);
    const reminders = page.getByRole('checkbox', { name: /^Session reminders/ });
    await reminders.waitFor();
    await expect(page.getByRole('checkbox', { name: /daily digest/i }).count()).resolves.toBe(0);
    await expect(reminders.isChecked()).resolves.toBe(true);
    await page.waitForFunction(() => !document.querySelector('button[type="submit"]')?.hasAttribute('disabled'));
    await checkAtEveryWidth('notifications');
    await page.locator('body').focus();
    await tabUntil(page, (f) => f.type === 'checkbox' && Boolean(f.label?.startsWith('Session reminders')));
    await page.keyboard.press('Space');
    await tabUntil(page, (f) => f.tag === 'button' && f.text === 'Save e-mail settings');
    await page.keyboard.press('Enter');
    await page.getByRole('status').filter({ hasText: 'Saved. Kinloop will send: weekly summary.' }).waitFor();
    await page.reload();
    await reminders.waitFor();
    await expect(reminders.isChecked()).resolves.toBe(false);
  });
});
