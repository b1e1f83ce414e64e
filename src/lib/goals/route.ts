// A distance goal's virtual route and how far along it a rider has come.
// Position between two points is interpolated linearly in latitude and
// longitude (by the segment's share of distance): a map marker only needs to
// sit on the line drawn between the points.
import { haversineM, type LatLon } from './haversine';

export interface RoutePoint extends LatLon {
  name: string;
  milestone?: boolean;
}

export interface Route {
  id: string;
  name: string;
  points: RoutePoint[];
}

export interface PassedMilestone extends LatLon {
  name: string;
  /** Distance from the start of the route. */
  atM: number;
}

export interface RouteProgress {
  travelledM: number;
  totalM: number;
  /** 0..1 */
  fraction: number;
  passed: PassedMilestone[];
  next: { name: string; remainingM: number } | null;
  position: LatLon;
  finished: boolean;
}

/** Cumulative distance from the start to each point. */
export function cumulativeM(route: Route): number[] {
  const out = [0];
  for (let i = 1; i < route.points.length; i++) {
    out.push(out[i - 1] + haversineM(route.points[i - 1], route.points[i]));
  }
  return out;
}

export function routeLengthM(route: Route): number {
  const cum = cumulativeM(route);
  return cum[cum.length - 1] ?? 0;
}

/**
 * Milestones are the points marked `milestone`, plus the last point, which is
 * always the finish. A milestone counts as passed once the distance reaches it.
 */
export function progressAlong(route: Route, distanceM: number): RouteProgress {
  const { points } = route;
  if (points.length === 0) throw new Error(`Route ${route.id} has no points`);
  const cum = cumulativeM(route);
  const totalM = cum[cum.length - 1];
  const travelledM = Math.min(Number.isFinite(distanceM) && distanceM > 0 ? distanceM : 0, totalM);
  const finished = travelledM >= totalM;

  const passed: PassedMilestone[] = [];
  let next: RouteProgress['next'] = null;
  points.forEach((p, i) => {
    if (!p.milestone && i !== points.length - 1) return;
    if (cum[i] <= travelledM) passed.push({ name: p.name, lat: p.lat, lon: p.lon, atM: cum[i] });
    else if (next === null) next = { name: p.name, remainingM: cum[i] - travelledM };
  });

  return {
    travelledM,
    totalM,
    fraction: totalM > 0 ? travelledM / totalM : 1,
    passed,
    next,
    position: positionAt(points, cum, travelledM),
    finished,
  };
}

function positionAt(points: RoutePoint[], cum: number[], d: number): LatLon {
  let i = 0;
  while (i < points.length - 2 && cum[i + 1] <= d) i++;
  const a = points[i];
  const b = points[Math.min(i + 1, points.length - 1)];
  const span = cum[Math.min(i + 1, cum.length - 1)] - cum[i];
  const f = span > 0 ? Math.min(1, (d - cum[i]) / span) : 0;
  // Take the short way round across the antimeridian.
  let dLon = b.lon - a.lon;
  if (dLon > 180) dLon -= 360;
  else if (dLon < -180) dLon += 360;
  let lon = a.lon + dLon * f;
  if (lon > 180) lon -= 360;
  else if (lon < -180) lon += 360;
  return { lat: a.lat + (b.lat - a.lat) * f, lon };
}
