import type { APIRoute } from 'astro';
import { signedIn } from '../../../../lib/auth/context';
import { handle, json } from '../../../../lib/http/respond';
import { readUpload } from '../../../../lib/ingest/uploads';

export const GET: APIRoute = ({ params, locals }) => handle(async () => json(await readUpload(signedIn(locals), params.id!)));
