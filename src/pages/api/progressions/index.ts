import type { APIRoute } from 'astro';
import { signedIn } from '../../../lib/auth/context';
import { readyToProgress } from '../../../lib/care/progression-service';
import { handle, json } from '../../../lib/http/respond';

export const GET: APIRoute = ({ locals }) => handle(async () => json({ proposals: await readyToProgress(signedIn(locals)) }));
