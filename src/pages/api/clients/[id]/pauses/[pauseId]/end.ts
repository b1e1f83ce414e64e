import type { APIRoute } from 'astro';
import { signedIn } from '../../../../../../lib/auth/context';
import { handle, json } from '../../../../../../lib/http/respond';
import { endPause } from '../../../../../../lib/supervision/pauses';

export const POST: APIRoute = ({ params, locals }) => handle(async () => json(await endPause(signedIn(locals), params.id!, params.pauseId!)));
