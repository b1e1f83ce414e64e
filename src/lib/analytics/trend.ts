// Least-squares straight-line trends for progress views (common practice:
// ordinary least squares on centred sums, which stay accurate for large x
// such as timestamps).

export interface LinearTrend {
  slope: number;
  intercept: number;
  /** Coefficient of determination; 1 when every point lies on the line, including a flat series. */
  r2: number;
}

/** Null with fewer than two points or when every x is the same. Points must be finite. */
export function linearTrend(points: { x: number; y: number }[]): LinearTrend | null {
  const n = points.length;
  if (n < 2) return null;
  const meanX = points.reduce((sum, p) => sum + p.x, 0) / n;
  const meanY = points.reduce((sum, p) => sum + p.y, 0) / n;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (const { x, y } of points) {
    sxx += (x - meanX) ** 2;
    sxy += (x - meanX) * (y - meanY);
    syy += (y - meanY) ** 2;
  }
  if (sxx === 0) return null;
  const slope = sxy / sxx;
  const intercept = meanY - slope * meanX;
  const residual = points.reduce((sum, p) => sum + (p.y - (intercept + slope * p.x)) ** 2, 0);
  return { slope, intercept, r2: syy === 0 ? 1 : 1 - residual / syy };
}

const WEEK_MS = 7 * 24 * 3600 * 1000;

/** The weeks the caseload's power trend looks back over. */
export const POWER_TREND_WEEKS = 8;

/**
 * Change of mean power in W per week over the sessions that started in the
 * `weeks` weeks up to `now` (each 7 × 24 h). Null with fewer than three
 * sessions that have a mean power.
 */
export function powerTrendPerWeek(
  sessions: { startedAt: string; meanPowerW: number | null }[],
  now: string,
  weeks = POWER_TREND_WEEKS,
): number | null {
  const nowMs = Date.parse(now);
  if (Number.isNaN(nowMs)) throw new RangeError(`now is not an instant: ${now}`);
  const fromMs = nowMs - weeks * WEEK_MS;
  const points = sessions
    .map((s) => ({ t: Date.parse(s.startedAt), y: s.meanPowerW }))
    .filter((p): p is { t: number; y: number } => p.t > fromMs && p.t <= nowMs && p.y !== null && Number.isFinite(p.y))
    .map((p) => ({ x: (p.t - nowMs) / WEEK_MS, y: p.y }));
  if (points.length < 3) return null;
  return linearTrend(points)?.slope ?? null;
}
