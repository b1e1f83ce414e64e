import { describe, expect, it } from 'vitest';
import { invitationEmail } from '../../../src/lib/mail/templates';

const base = {
  inviteeName: 'Nia New',
  inviterName: 'Priya Lindqvist',
  clinicName: 'Larchfield Neuro Outreach',
  clientName: null,
  url: 'http://localhost:4321/invite/abc',
  expiresAt: new Date('2026-12-09T04:27:44Z'),
  timeZone: 'Europe/London',
};

describe('the invitation e-mail', () => {
  it('names the role with its article, in both the text and the HTML', () => {
    const mail = invitationEmail({ ...base, role: 'therapist' });
    expect(mail.text).toContain('to join Larchfield Neuro Outreach on Kinloop as a therapist.');
    expect(mail.html).toContain('as a therapist.');
    expect(invitationEmail({ ...base, role: 'admin' }).text).toContain('as a clinic administrator.');
  });

  it('says when the link stops working in the clinic’s time, naming the zone', () => {
    expect(invitationEmail({ ...base, role: 'therapist' }).text).toContain('until Wednesday, 9 December 2026, 04:27 (Europe/London time).');
    expect(invitationEmail({ ...base, role: 'therapist', timeZone: 'America/Chicago' }).text).toContain('until Tuesday, 8 December 2026, 22:27 (America/Chicago time).');
  });
});
