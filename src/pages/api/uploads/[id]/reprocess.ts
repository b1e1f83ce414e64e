import type { APIRoute } from 'astro';
import { signedIn } from '../../../../lib/auth/context';
import { handle, json } from '../../../../lib/http/respond';
import { reprocessUpload } from '../../../../lib/ingest/uploads';

export const POST: APIRoute = ({ params, locals }) => handle(async () => json(await reprocessUpload(signedIn(locals), params.id!), 202));
