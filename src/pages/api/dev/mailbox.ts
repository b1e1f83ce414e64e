import type { APIRoute } from 'astro';
import { signedIn } from '../../../lib/auth/context';
import { readMailbox } from '../../../lib/dev/mailbox';
import { notFound } from '../../../lib/http/errors';
import { handle, json } from '../../../lib/http/respond';

// Only while Kinloop runs with its local SMTP fake; with a real mail server there is no mailbox to read.
export const GET: APIRoute = ({ locals }) =>
  handle(async () => {
    const mail = await readMailbox(signedIn(locals));
    if (!mail) throw notFound('The development mailbox');
    return json({ messages: mail });
  });
