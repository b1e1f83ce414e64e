import type { Db, Query } from '../data/db';
import { DateTime } from 'luxon';
import type { ClientRow, DistanceGoalRow } from '../db/tables';
import { BUILTIN_ROUTES, builtinRoute } from '../goals/builtin-routes';
import { progressAlong, routeLengthM, type Route } from '../goals/route';

export function routeView(route: Route) {
  return { id: route.id, name: route.name, lengthM: Math.round(routeLengthM(route)), points: route.points };
}

export const listRoutes = () => ({ routes: BUILTIN_ROUTES.map(routeView) });

/** The client's current distance goal and how far their rides since its start date have taken them along it. */
export async function readGoalFor(knex: Db, client: ClientRow, goal?: DistanceGoalRow) {
  const row = goal ?? (await knex<DistanceGoalRow>('distance_goals').where({ client_id: client.id }).whereNull('replaced_at').first());
  const route = row ? (row.builtin_route_id ? (builtinRoute(row.builtin_route_id) ?? null) : row.custom_route) : null;
  if (!row || !route) return null;
  const from = DateTime.fromISO(row.count_from, { zone: client.time_zone }).startOf('day').toJSDate();
  const sum = await knex('rides').where({ client_id: client.id }).where('started_at', '>=', from).sum('distance_m as m').first();
  const distanceM = Math.round(Number(sum?.m ?? 0));
  const progress = progressAlong(route, distanceM);
  return {
    route: { ...routeView(route), id: row.builtin_route_id },
    countFrom: row.count_from,
    distanceM,
    progress: { ...progress, passed: progress.passed.map((p) => ({ name: p.name, atM: Math.round(p.atM) })) },
  };
}
