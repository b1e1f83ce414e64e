import type { APIRoute } from 'astro';
import { signedIn } from '../../../../lib/auth/context';
import { handle, json } from '../../../../lib/http/respond';
import { riderWeek } from '../../../../lib/riders/week';

export const GET: APIRoute = ({ params, locals }) => handle(async () => json(await riderWeek(signedIn(locals), params.id!)));
