import { DateTime } from 'luxon';
import { z } from 'zod';
import { accessClient } from '../auth/access';
import { auditAs, type RequestContext } from '../auth/context';
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
  const client = await accessClient(ctx, clientId, 'read', 'goal.view');
  return { goal: await readGoalFor(ctx.knex, client) };
}

/** A new goal replaces the current one (kept, marked replaced). */
export async function chooseGoal(ctx: RequestContext, clientId: string, input: z.infer<typeof goalInputSchema>) {
  const client = await accessClient(ctx, clientId, 'contribute', 'goal.choose');
  if (input.routeId && !builtinRoute(input.routeId)) throw badRequest('That route does not exist; choose one of the listed routes.', { fields: [{ path: 'routeId', message: 'Choose one of the listed routes.' }] });
  const today = DateTime.now().setZone(client.time_zone).toISODate()!;
  const countFrom = input.countFrom ?? client.program_start ?? today;
  const goal = await ctx.knex.transaction(async (trx) => {
    await trx('distance_goals').where({ client_id: client.id }).whereNull('replaced_at').update({ replaced_at: trx.fn.now() });
    const [row] = await trx<DistanceGoalRow>('distance_goals')
      .insert({
        client_id: client.id,
        builtin_route_id: input.routeId ?? null,
        custom_route: input.customRoute ? (JSON.stringify({ id: 'custom', ...input.customRoute }) as never) : null,
        count_from: countFrom,
        chosen_by: ctx.viewer.userId,
      })
      .returning('*');
    await auditAs(ctx, { action: 'goal.choose', clinicId: client.clinic_id, clientId: client.id, recordType: 'distance_goal', recordId: row.id }, trx);
    return row;
  });
  return { goal: await readGoalFor(ctx.knex, client, goal) };
}
