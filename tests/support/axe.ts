import AxeBuilder from '@axe-core/playwright';
import type { Page } from 'playwright-core';

/** The serious and critical accessibility violations axe-core finds on the page (WCAG 2.x A and AA rules). */
export async function seriousViolations(page: Page) {
  const result = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa']).analyze();
  return result.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => ({ id: v.id, impact: v.impact, help: v.help, nodes: v.nodes.map((n) => n.target.join(' ')).slice(0, 5) }));
}
