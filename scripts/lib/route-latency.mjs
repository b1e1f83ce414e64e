// Times and answers of a load run grouped by route pattern (`/api/clients/:id/flags`,
// not each client's URL), with percentiles by nearest rank over every answer.

/** The value below which p % of the sorted values lie, by nearest rank. */
export function percentile(sorted, p) {
  if (!sorted.length) return null;
  return sorted[Math.min(sorted.length, Math.max(1, Math.ceil((p / 100) * sorted.length))) - 1];
}

export class RouteLatency {
  constructor() {
    this.routes = new Map();
    /** Answers of 500 and above, each with the URL asked and the start of its body. */
    this.serverErrors = [];
  }

  record(route, status, ms) {
    let r = this.routes.get(route);
    if (!r) this.routes.set(route, (r = { times: [], statuses: {} }));
    r.times.push(ms);
    r.statuses[status] = (r.statuses[status] ?? 0) + 1;
  }

  serverError(route, path, status, body) {
    let detail = String(body ?? '').slice(0, 300);
    try {
      const error = JSON.parse(body).error;
      if (error) detail = `${error.code}: ${error.message}`;
    } catch {
      // Not JSON (a proxy's page, a cut body): the raw start says what it was.
    }
    this.serverErrors.push({ route, path, status, detail });
  }

  /** Per route: answers, answers per second over `seconds`, p50/p95/p99/max in ms, and the answers that were not 2xx. */
  summary(seconds) {
    /** @type {Record<string, { n: number, perSecond: number, p50: number | null, p95: number | null, p99: number | null, max: number, non2xx: number, serverErrors: number, statuses: Record<string, number> }>} */
    const out = {};
    for (const [route, { times, statuses }] of this.routes) {
      const sorted = [...times].sort((a, b) => a - b);
      const non2xx = Object.entries(statuses).filter(([s]) => !s.startsWith('2')).reduce((n, [, c]) => n + c, 0);
      const serverErrors = Object.entries(statuses).filter(([s]) => Number(s) >= 500).reduce((n, [, c]) => n + c, 0);
      out[route] = {
        n: times.length,
        perSecond: times.length / seconds,
        p50: percentile(sorted, 50),
        p95: percentile(sorted, 95),
        p99: percentile(sorted, 99),
        max: sorted[sorted.length - 1],
        non2xx,
        serverErrors,
        statuses,
      };
    }
    return out;
  }
}
