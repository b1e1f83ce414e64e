// The locale and time zone a page writes dates and numbers in: those of the
// clinic whose records it shows (the client's clinic on a client's pages, else
// the viewer's own clinic, else the clinic of the client they are or care for).
import type { RequestContext } from '../auth/context';
import { scope } from '../data';
import { FALLBACK_LOCALE } from '../time/format';
import { clinicLocale } from '../time/locale';

export interface PageLocale {
  locale: string;
  /** The clinic's time zone, for times that belong to no client (audit log, invitations). */
  timeZone: string;
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export async function pageLocale(ctx: RequestContext, asked?: string | null): Promise<PageLocale> {
  const s = scope(ctx);
  const viewer = ctx.viewer;
  // An id from the address may be anything; one that is not a client the viewer may read takes the viewer's own clinic.
  const clientId = asked && UUID.test(asked) ? asked : null;
  const clinicOfClient = async (id: string | null) => (id ? ((await s.clients().where({ id }).first('clinic_id'))?.clinic_id as string | undefined) : undefined);
  const clinicId = (await clinicOfClient(clientId)) ?? viewer.memberships[0]?.clinicId ?? (await clinicOfClient(viewer.clientId ?? viewer.carerOf[0] ?? null));
  const clinic = clinicId ? await s.clinics().where({ id: clinicId }).first('locale', 'time_zone') : undefined;
  return clinic ? { locale: clinicLocale(clinic), timeZone: clinic.time_zone } : { locale: FALLBACK_LOCALE, timeZone: 'UTC' };
}
