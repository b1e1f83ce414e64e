import type { Browser, Page } from 'playwright-core';

/** A context that records every CSP violation its pages report, and console errors that mention the policy. */
export async function watchedContext(browser: Browser, options: Parameters<Browser['newContext']>[0] = {}) {
  const context = await browser.newContext(options);
  const violations: string[] = [];
  await context.exposeFunction('__kinloopCspViolation', (v: string) => violations.push(v));
  // Injected by the browser's debugging protocol, which the page's policy does not govern.
  await context.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (e) => {
      (window as unknown as { __kinloopCspViolation: (v: string) => void }).__kinloopCspViolation(`${e.violatedDirective} blocked ${e.blockedURI || 'inline'} on ${location.pathname}`);
    });
  });
  const watch = (page: Page) =>
    page.on('console', (m) => {
      if (m.type() === 'error' && /Content Security Policy/i.test(m.text())) violations.push(`${new URL(page.url()).pathname}: ${m.text()}`);
    });
  context.on('page', watch);
  return { context, violations };
}
