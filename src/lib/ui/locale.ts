// The locale and time zone a page writes dates and numbers in: those of the
// clinic whose records it shows (the client's clinic on a client's pages, else
// the viewer's own clinic, else the clinic of the client they are or care for).
import type { Knex } from 'knex';
import type { Viewer } from '../auth/viewer';
import { FALLBACK_LOCALE } from '../time/format';
import { clinicLocale } from '../time/locale';

export interface PageLocale {
  locale: string;
  /** The clinic's time zone, for times that belong to no client (audit log, invitations). */
  timeZone: string;
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export async function pageLocale(knex: Knex, viewer: Viewer, asked?: string | null): Promise<PageLocale> {
  // An id from the address may be anything; one that is not a client's id takes the viewer's clinic.
  const clientId = asked && UUID.test(asked) ? asked : null;
  const ownClient = clientId ?? viewer.clientId ?? viewer.carerOf[0] ?? null;
  const clinic =
    clientId || !viewer.memberships.length
      ? ownClient && (await knex('clinics').join('clients', 'clients.clinic_id', 'clinics.id').where('clients.id', ownClient).first('clinics.locale', 'clinics.time_zone'))
      : await knex('clinics').where({ id: viewer.memberships[0].clinicId }).first('locale', 'time_zone');
  return clinic ? { locale: clinicLocale(clinic), timeZone: clinic.time_zone } : { locale: FALLBACK_LOCALE, timeZone: 'UTC' };
}
