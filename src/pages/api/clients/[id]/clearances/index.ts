import type { APIRoute } from 'astro';
import { signedIn } from '../../../../../lib/auth/context';
import { listClearances, uploadClearance } from '../../../../../lib/care/clearances';
import { handle, json } from '../../../../../lib/http/respond';

export const GET: APIRoute = ({ params, locals }) => handle(async () => json(await listClearances(signedIn(locals), params.id!)));

export const POST: APIRoute = ({ params, request, locals }) => handle(async () => json(await uploadClearance(signedIn(locals), params.id!, request), 201));
