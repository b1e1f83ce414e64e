// What every view of a client's record needs before it renders: the client
// (404 when the caller may not see them), whether the caller manages them,
// the clinic's locale and the client's today. The views are separate pages
// (/clients/:id, …/sessions, …/prescription …) so each is linkable and works
// without JavaScript.
import type { AstroGlobal } from 'astro';
import { canManageClient } from '../auth/access';
import { signedIn } from '../auth/context';
import { readClient } from '../clients/read';
import { HttpError } from '../http/errors';
import { localDate } from '../time/local-date';
import { pageLocale } from './locale';

export type ClientView = 'overview' | 'sessions' | 'prescription' | 'pauses' | 'checks' | 'flags' | 'notes' | 'details';

export interface ClientViewLink {
  view: ClientView;
  label: string;
  href: string;
}

const VIEWS: { view: ClientView; label: string; path: string; staffOnly: boolean }[] = [
  { view: 'overview', label: 'Overview', path: '', staffOnly: false },
  { view: 'sessions', label: 'All sessions', path: '/sessions', staffOnly: false },
  { view: 'prescription', label: 'Prescription', path: '/prescription', staffOnly: false },
  { view: 'pauses', label: 'Pauses', path: '/pauses', staffOnly: false },
  { view: 'checks', label: 'Checks', path: '/checks', staffOnly: false },
  { view: 'flags', label: 'Flags', path: '/flags', staffOnly: true },
  { view: 'notes', label: 'Notes', path: '/notes', staffOnly: true },
  { view: 'details', label: 'Details and invitations', path: '/details', staffOnly: true },
];

export async function clientPage(astro: AstroGlobal, view: ClientView) {
  const ctx = signedIn(astro.locals);
  let client: Awaited<ReturnType<typeof readClient>> | null = null;
  try {
    client = await readClient(ctx, astro.params.id!);
  } catch (err) {
    if (!(err instanceof HttpError)) throw err;
  }
  // Notes, flags and changes to the program are for the clinic's staff; carers and the client read the rest.
  const manage = client ? canManageClient(ctx.viewer, { clinic_id: client.clinicId }) : false;
  const found = client !== null && (manage || !VIEWS.find((v) => v.view === view)!.staffOnly);
  if (!found) astro.response.status = 404;
  const { locale } = await pageLocale(ctx, client?.id);
  const links: ClientViewLink[] = client ? VIEWS.filter((v) => manage || !v.staffOnly).map((v) => ({ view: v.view, label: v.label, href: `/clients/${client!.id}${v.path}` })) : [];
  return {
    ctx,
    client: found ? client : null,
    manage,
    locale,
    links,
    today: client ? localDate(new Date(), client.timeZone) : '',
    shared: client ? { clientId: client.id, locale, timeZone: client.timeZone } : null,
  };
}
