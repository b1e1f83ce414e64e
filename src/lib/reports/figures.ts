// The arithmetic behind a client's progress report (src/pages/reports/[id].astro),
// kept apart from the page so that it is tested directly.

/** Mean power over several sessions, weighted by active time as each session's own mean is. */
export function weightedPower(sessions: { meanPowerW: number | null; activeS: number }[]): number | null {
  const rated = sessions.filter((s) => s.meanPowerW !== null && s.activeS > 0);
  const weight = rated.reduce((sum, s) => sum + s.activeS, 0);
  return weight > 0 ? rated.reduce((sum, s) => sum + s.meanPowerW! * s.activeS, 0) / weight : null;
}

export const meanOf = (values: number[]): number | null => (values.length ? values.reduce((a, b) => a + b, 0) / values.length : null);

/** How many sessions the "first" and "last" groups hold: four, or fewer so that the two never overlap. */
export const comparedCount = (sessions: number): number => Math.min(4, Math.floor(sessions / 2));

/** Half a year of weeks goes in two tables side by side, so that the report still prints on two pages. */
export function halves<T>(rows: T[]): T[][] {
  if (rows.length <= 13) return [rows];
  const cut = Math.ceil(rows.length / 2);
  return [rows.slice(0, cut), rows.slice(cut)];
}

export function weekOutcome(w: { isoWeek: string; prescribed: number; met: boolean; paused: boolean }, currentIsoWeek: string): string {
  if (w.paused) return 'Paused';
  if (w.isoWeek === currentIsoWeek) return w.met ? 'Met (week under way)' : 'Under way';
  if (w.prescribed === 0) return 'No prescription';
  return w.met ? 'Met' : 'Not met';
}

export const SPARK = { width: 420, height: 130, left: 74, right: 10, top: 10, bottom: 24, font: 12 };
type Point = { t: number; y: number };

/** SVG geometry of a small black-and-white chart over [startMs, endMs], its y axis from 0 to a little above the highest value. */
export function drawSpark(values: Point[], reference: Point[], startMs: number, endMs: number) {
  const top = Math.max(...values.map((p) => p.y), ...reference.map((p) => p.y), 0);
  const yMax = top > 0 ? top * 1.1 : 1;
  const x = (t: number) => SPARK.left + ((t - startMs) / Math.max(1, endMs - startMs)) * (SPARK.width - SPARK.left - SPARK.right);
  const y = (v: number) => SPARK.top + (1 - v / yMax) * (SPARK.height - SPARK.top - SPARK.bottom);
  const path = (pts: Point[]) => pts.map((p, i) => `${i ? 'L' : 'M'}${x(p.t).toFixed(1)} ${y(p.y).toFixed(1)}`).join(' ');
  return {
    line: path(values),
    reference: path(reference),
    dots: values.map((p) => ({ cx: x(p.t).toFixed(1), cy: y(p.y).toFixed(1) })),
    top,
    yTop: y(top).toFixed(1),
    yZero: y(0).toFixed(1),
    xRight: (SPARK.width - SPARK.right).toFixed(1),
  };
}
