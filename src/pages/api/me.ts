import type { APIRoute } from 'astro';
import { signedIn } from '../../lib/auth/context';
import { meResponse } from '../../lib/auth/viewer';
import { handle, json } from '../../lib/http/respond';

export const GET: APIRoute = ({ locals }) => handle(async () => json(meResponse(signedIn(locals).viewer)));
