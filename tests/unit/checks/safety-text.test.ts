import { describe, it, expect } from 'vitest';
import { AD_SAFETY_PANEL, GENERAL_CAUTION, PRE_PROGRAM_SCREENING } from '../../../src/lib/checks/safety-text';

// source: PRODUCT.md "Safety", which lists the steps and the screening items.
describe('safety text', () => {
  it('starts by stopping the ride and ends with emergency services', () => {
    expect(AD_SAFETY_PANEL.steps[0]).toMatch(/^Stop the ride/);
    expect(AD_SAFETY_PANEL.steps[AD_SAFETY_PANEL.steps.length - 1]).toMatch(/emergency services/);
    const order = ['upright', 'Loosen', 'bladder', 'every few minutes', 'autonomic dysreflexia plan'].map((w) =>
      AD_SAFETY_PANEL.steps.findIndex((s) => s.includes(w)),
    );
    expect(order.every((i) => i > 0)).toBe(true);
    expect([...order].sort((a, b) => a - b)).toEqual(order);
  });

  it('carries the general caution', () => {
    expect(GENERAL_CAUTION).toContain('not a real-time monitor');
    expect(GENERAL_CAUTION).toContain('does not diagnose');
    expect(GENERAL_CAUTION).toContain('local regulations');
  });

  it('lists every screening item once', () => {
    const ids = PRE_PROGRAM_SCREENING.items.map((i) => i.id);
    expect(new Set(ids).size).toBe(ids.length);
    expect(ids).toEqual([
      'bone_health',
      'heterotopic_ossification',
      'electrode_site_skin',
      'autonomic_dysreflexia',
      'implanted_devices',
      'epilepsy',
      'pregnancy',
      'active_thrombosis',
    ]);
  });
});
