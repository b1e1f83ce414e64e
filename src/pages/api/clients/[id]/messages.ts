import type { APIRoute } from 'astro';
import { signedIn } from '../../../../lib/auth/context';
import { messageInputSchema, readThread, sendMessage } from '../../../../lib/care/messages';
import { readJson } from '../../../../lib/http/request';
import { handle, json } from '../../../../lib/http/respond';

export const GET: APIRoute = ({ params, locals }) => handle(async () => json(await readThread(signedIn(locals), params.id!)));

export const POST: APIRoute = ({ params, request, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    return json(await sendMessage(ctx, params.id!, await readJson(request, messageInputSchema)), 201);
  });
