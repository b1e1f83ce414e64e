import { DateTime } from 'luxon';
import { z } from 'zod';
import type { RequestContext } from '../auth/context';
import { scope } from '../data';
import type { DistanceGoalRow } from '../db/tables';
import { readGoalFor } from './goal-progress';
import { builtinRoute } from '../goals/builtin-routes';
import { customRouteSchema } from '../goals/route-schema';
import { badRequest } from '../http/errors';
import { calendarDate, line } from '../validation/fields';

export const goalInputSchema = z
  .object({
    routeId: line(z.string().max(60), 'Route').optional(),
    customRoute: customRouteSchema.optional(),
    countFrom: calendarDate('Count rides from').optional(),
  })
  .strict()
  .refine((g) => Boolean(g.routeId) !== Boolean(g.customRoute), { message: 'Choose one of the routes, or enter your own — not both.', path: ['routeId'] });

export async function readGoal(ctx: RequestContext, clientId: string) {
  const client = await scope(ctx).client(clientId, 'read', 'goal.view');
  return { goal: await readGoalFor(client.db, client.row) };
}

/** A new goal replaces the current one (kept, marked replaced). */
export async function chooseGoal(ctx: RequestContext, clientId: string, input: z.infer<typeof goalInputSchema>) {
  const grant = await scope(ctx).client(clientId, 'contribute', 'goal.choose');
  const client = grant.row;
  if (input.routeId && !builtinRoute(input.routeId)) throw badRequest('That route does not exist; choose one of the listed routes.', { fields: [{ path: 'routeId', message: 'Choose one of the listed routes.' }] });
  const today = DateTime.now().setZone(client.time_zone).toISODate()!;
  const countFrom = input.countFrom ?? client.program_start ?? today;
  const goal = await grant.transaction(async (tx) => {
    await tx.db('distance_goals').whereNull('replaced_at').update({ replaced_at: tx.db.fn.now() });
    const [row] = await tx.db<DistanceGoalRow>('distance_goals')
      .insert({
        builtin_route_id: input.routeId ?? null,
        custom_route: input.customRoute ? (JSON.stringify({ id: 'custom', ...input.customRoute }) as never) : null,
        count_from: countFrom,
        chosen_by: ctx.viewer.userId,
      })
      .returning('*');
    await tx.audit({ action: 'goal.choose', recordType: 'distance_goal', recordId: row.id });
    return row;
  });
  return { goal: await readGoalFor(grant.db, client, goal) };
}
