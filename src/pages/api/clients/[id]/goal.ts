import type { APIRoute } from 'astro';
import { signedIn } from '../../../../lib/auth/context';
import { readJson } from '../../../../lib/http/request';
import { handle, json } from '../../../../lib/http/respond';
import { chooseGoal, goalInputSchema, readGoal } from '../../../../lib/riders/goals';

export const GET: APIRoute = ({ params, locals }) => handle(async () => json(await readGoal(signedIn(locals), params.id!)));

export const PUT: APIRoute = ({ params, request, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    return json(await chooseGoal(ctx, params.id!, await readJson(request, goalInputSchema)));
  });
