import type { APIRoute } from 'astro';
import { signedIn } from '../../../../lib/auth/context';
import { handle } from '../../../../lib/http/respond';
import { attachmentDisposition } from '../../../../lib/ingest/file-name';
import { rawUpload } from '../../../../lib/ingest/uploads';

export const GET: APIRoute = ({ params, locals }) =>
  handle(async () => {
    const { row, body, length } = await rawUpload(signedIn(locals), params.id!);
    return new Response(body, {
      headers: {
        'content-type': 'application/octet-stream',
        'content-disposition': attachmentDisposition(row.original_name),
        ...(length !== undefined ? { 'content-length': String(length) } : {}),
        'x-content-sha256': row.sha256,
        'cache-control': 'no-store',
      },
    });
  });
