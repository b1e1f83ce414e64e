import type { APIRoute } from 'astro';
import { signedIn } from '../../../../../lib/auth/context';
import { clearanceDocument } from '../../../../../lib/care/clearances';
import { handle } from '../../../../../lib/http/respond';
import { attachmentDisposition } from '../../../../../lib/ingest/file-name';

export const GET: APIRoute = ({ params, locals }) =>
  handle(async () => {
    const { row, body, length } = await clearanceDocument(signedIn(locals), params.id!, params.clearanceId!);
    return new Response(body, {
      headers: {
        'content-type': row.content_type,
        'content-disposition': attachmentDisposition(row.original_name),
        ...(length !== undefined ? { 'content-length': String(length) } : {}),
        'x-content-sha256': row.sha256,
        'cache-control': 'no-store',
      },
    });
  });
