import type { InvitationRole } from '../db/tables';
import { FOOTER_LINE } from '../checks/safety-text';
import { FALLBACK_LOCALE, formatDateTime } from '../time/format';
import { renderEmail } from './render';

/** A role as it reads after "as": "invited … as a therapist". */
export const AS_ROLE: Record<InvitationRole, string> = {
  admin: 'a clinic administrator',
  therapist: 'a therapist',
  client: 'the rider',
  carer: 'a carer',
};


export function invitationEmail(p: {
  inviteeName: string | null;
  inviterName: string;
  clinicName: string;
  role: InvitationRole;
  clientName: string | null;
  url: string;
  expiresAt: Date;
  /** The clinic's zone: the expiry is said in the invitee's likely local time, with the zone named. */
  timeZone: string;
  /** The clinic's locale (src/lib/time/locale.ts). */
  locale?: string;
}) {
  const what =
    p.role === 'client'
      ? 'to follow your home cycling program on Kinloop: your sessions, your progress and your prescription'
      : p.role === 'carer'
        ? `to help ${p.clientName} with their home cycling program on Kinloop: upload ride files, record checks before and after rides, and get reminders`
        : `to join ${p.clinicName} on Kinloop as ${AS_ROLE[p.role]}`;
  const body = renderEmail({
    greeting: p.inviteeName ? `Hello ${p.inviteeName},` : 'Hello,',
    paragraphs: [
      `${p.inviterName} at ${p.clinicName} has invited you ${what}.`,
      `Open the link below to choose your password. The link works once and until ${expiryLabel(p.expiresAt, p.timeZone, p.locale ?? FALLBACK_LOCALE)}.`,
      'If you did not expect this e-mail, you can ignore it.',
    ],
    action: { label: 'Accept the invitation', url: p.url },
    footer: [FOOTER_LINE],
  });
  return { subject: `${p.clinicName} invites you to Kinloop`, ...body };
}

const expiryLabel = (at: Date, timeZone: string, locale: string) => `${formatDateTime(at, locale, timeZone, 'dayLong')} (${timeZone} time)`;

export function passwordResetEmail(p: { name: string; url: string; expiresMinutes: number }) {
  const body = renderEmail({
    greeting: `Hello ${p.name},`,
    paragraphs: [
      'Someone asked to reset the password of your Kinloop account. If it was you, open the link below and choose a new password.',
      `The link works once, for ${p.expiresMinutes} minutes. If you did not ask for this, ignore this e-mail: your password stays as it is.`,
    ],
    action: { label: 'Choose a new password', url: p.url },
    footer: [FOOTER_LINE],
  });
  return { subject: 'Reset your Kinloop password', ...body };
}
