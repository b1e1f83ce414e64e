// bench:load's figures per route: nearest-rank percentiles and the grouping of answers.
import { describe, expect, it } from 'vitest';
import { percentile, RouteLatency } from '../../../scripts/lib/route-latency.mjs';

describe('percentile', () => {
  // source: Wikipedia, "Percentile", nearest-rank method, worked example 1 (15, 20, 35, 40, 50)
  it('takes the nearest rank', () => {
    const sorted = [15, 20, 35, 40, 50];
    expect(percentile(sorted, 5)).toBe(15);
    // Hand-worked from the definition: 15 covers only 20 % of the values, so p21 is the next one.
    expect(percentile(sorted, 21)).toBe(20);
    expect(percentile(sorted, 30)).toBe(20);
    expect(percentile(sorted, 40)).toBe(20);
    expect(percentile(sorted, 50)).toBe(35);
    expect(percentile(sorted, 100)).toBe(50);
    expect(percentile([], 50)).toBeNull();
  });
});

describe('RouteLatency', () => {
  it('groups answers by route, counts what was not 2xx and keeps the 5xx with their message', () => {
    const r = new RouteLatency();
    // Hand-worked: 100 answers of 1…100 ms on one route: p50 = 50, p95 = 95, p99 = 99.
    for (let ms = 1; ms <= 100; ms++) r.record('/api/triage', 200, ms);
    r.record('POST /api/uploads', 202, 900);
    r.record('POST /api/uploads', 413, 5);
    r.record('POST /api/uploads', 503, 40);
    r.serverError('POST /api/uploads', '/api/uploads', 503, JSON.stringify({ error: { code: 'storage_unavailable', message: 'The file store did not answer.' } }));
    r.serverError('/api/triage', '/api/triage', 502, '<html>Bad gateway</html>');
    const s = r.summary(10);
    expect(s['/api/triage']).toMatchObject({ n: 100, perSecond: 10, p50: 50, p95: 95, p99: 99, max: 100, non2xx: 0, serverErrors: 0 });
    expect(s['POST /api/uploads']).toMatchObject({ n: 3, non2xx: 2, serverErrors: 1, statuses: { 202: 1, 413: 1, 503: 1 } });
    expect(r.serverErrors).toEqual([
      { route: 'POST /api/uploads', path: '/api/uploads', status: 503, detail: 'storage_unavailable: The file store did not answer.' },
      { route: '/api/triage', path: '/api/triage', status: 502, detail: '<html>Bad gateway</html>' },
    ]);
  });
});
