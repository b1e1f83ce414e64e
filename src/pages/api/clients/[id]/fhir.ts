import type { APIRoute } from 'astro';
import { signedIn } from '../../../../lib/auth/context';
import { clientFhir, fhirQuerySchema } from '../../../../lib/exports/fhir-export';
import { download } from '../../../../lib/http/download';
import { handle } from '../../../../lib/http/respond';

export const GET: APIRoute = ({ params, url, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    const file = await clientFhir(ctx, params.id!, fhirQuerySchema.parse(Object.fromEntries(url.searchParams)));
    return download(JSON.stringify(file.bundle, null, 1), file.filename, 'application/fhir+json; charset=utf-8');
  });
