import type { APIRoute } from 'astro';
import { signedIn } from '../../../../lib/auth/context';
import { clientSessionsCsv } from '../../../../lib/exports/sessions';
import { download } from '../../../../lib/http/download';
import { handle } from '../../../../lib/http/respond';

export const GET: APIRoute = ({ params, locals }) =>
  handle(async () => {
    const file = await clientSessionsCsv(signedIn(locals), params.id!);
    return download(file.text, file.filename, 'text/csv; charset=utf-8');
  });
