import type { APIRoute } from 'astro';
import { signedIn } from '../../../../lib/auth/context';
import { handle, json } from '../../../../lib/http/respond';
import { riderProgress } from '../../../../lib/riders/progress';

export const GET: APIRoute = ({ params, locals }) => handle(async () => json(await riderProgress(signedIn(locals), params.id!)));
