// The custom-route form's rows as typed, and the route they make. Errors are
// keyed by the same paths the server uses under `customRoute`, so both kinds
// of message land beside the same field.
import type { RoutePoint } from '../../lib/goals/route';

export interface PointRow {
  key: string;
  name: string;
  lat: string;
  lon: string;
  milestone: boolean;
}

export interface RouteDraft {
  name: string;
  rows: PointRow[];
}

export const MIN_POINTS = 2;

/** Accepts a decimal point or a decimal comma, and a leading minus or plus sign. */
export function parseCoordinate(text: string): number | null {
  const t = text.trim().replace(',', '.').replace(/^\u2212/, '-');
  if (!/^[+-]?(\d+(\.\d*)?|\.\d+)$/.test(t)) return null;
  return Number(t);
}

export function routeFromDraft(draft: RouteDraft): { route: { name: string; points: RoutePoint[] } | null; errors: Record<string, string> } {
  const errors: Record<string, string> = {};
  if (!draft.name.trim()) errors.name = 'Give the route a name.';
  if (draft.rows.length < MIN_POINTS) errors.points = `A route needs at least ${MIN_POINTS} points.`;
  const last = draft.rows.length - 1;
  const points = draft.rows.map((row, i) => {
    const lat = parseCoordinate(row.lat);
    const lon = parseCoordinate(row.lon);
    const milestone = row.milestone || i === last;
    if (lat === null) errors[`points.${i}.lat`] = 'Enter the latitude as a number of degrees, for example 50.82.';
    else if (lat < -90 || lat > 90) errors[`points.${i}.lat`] = 'Latitude is between -90 and 90 degrees.';
    if (lon === null) errors[`points.${i}.lon`] = 'Enter the longitude as a number of degrees, for example -0.14.';
    else if (lon < -180 || lon > 180) errors[`points.${i}.lon`] = 'Longitude is between -180 and 180 degrees.';
    if (milestone && !row.name.trim()) errors[`points.${i}.name`] = i === last ? 'The finish needs a name.' : 'A milestone needs a name.';
    return { name: row.name.trim(), lat: lat ?? 0, lon: lon ?? 0, ...(milestone ? { milestone: true } : {}) };
  });
  return Object.keys(errors).length ? { route: null, errors } : { route: { name: draft.name.trim(), points }, errors };
}

export function draftFromPoints(name: string, points: RoutePoint[], key: (i: number) => string): RouteDraft {
  return {
    name,
    rows: points.map((p, i) => ({ key: key(i), name: p.name, lat: coordinate(p.lat), lon: coordinate(p.lon), milestone: Boolean(p.milestone) })),
  };
}

/** Six decimals (about 0.1 m), never in exponent notation, so a saved point reads back into the form. */
function coordinate(value: number): string {
  return String(Number(value.toFixed(6)));
}
