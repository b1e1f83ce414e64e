import type { APIRoute } from 'astro';
import { signedIn } from '../../lib/auth/context';
import { handle, json } from '../../lib/http/respond';
import { listRoutes } from '../../lib/riders/goal-progress';

export const GET: APIRoute = ({ locals }) =>
  handle(async () => {
    signedIn(locals);
    return json(listRoutes());
  });
