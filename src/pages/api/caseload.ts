import type { APIRoute } from 'astro';
import { signedIn } from '../../lib/auth/context';
import { handle, json } from '../../lib/http/respond';
import { caseload } from '../../lib/supervision/caseload';

export const GET: APIRoute = ({ locals }) => handle(async () => json({ clients: await caseload(signedIn(locals), { onlyFlagged: false }) }));
