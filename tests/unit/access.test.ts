import { describe, expect, it } from 'vitest';
import { canManageClient, canReadClient, staffClinic } from '../../src/lib/auth/access';
import type { Viewer } from '../../src/lib/auth/viewer';
import { homePath } from '../../src/lib/auth/viewer';
import { pageAllowed } from '../../src/lib/ui/guard';
import { navFor } from '../../src/lib/ui/nav';

const base: Viewer = { userId: 'u', email: 'u@x.test', name: 'U', sessionId: 's', memberships: [], carerOf: [], clientId: null };
const client = { id: 'c1', clinic_id: 'k1' };

describe('access rules', () => {
  it('staff of the clinic read and manage; a carer and the client read only; others neither', () => {
    const therapist = { ...base, memberships: [{ clinicId: 'k1', role: 'therapist' as const }] };
    const elsewhere = { ...base, memberships: [{ clinicId: 'k2', role: 'admin' as const }] };
    const carer = { ...base, carerOf: ['c1'] };
    const self = { ...base, clientId: 'c1' };
    expect([therapist, elsewhere, carer, self, base].map((v) => canReadClient(v, client))).toEqual([true, false, true, true, false]);
    expect([therapist, elsewhere, carer, self, base].map((v) => canManageClient(v, client))).toEqual([true, false, false, false, false]);
  });

  it('staff actions need the role in the clinic asked for', () => {
    const v = { ...base, memberships: [{ clinicId: 'k1', role: 'therapist' as const }, { clinicId: 'k2', role: 'admin' as const }] };
    expect(staffClinic(v, ['admin'])).toBe('k2');
    expect(() => staffClinic(v, ['admin'], 'k1')).toThrow(/role does not allow/);
  });

  it('homes and navigation follow the roles, staff first', () => {
    const both = { ...base, memberships: [{ clinicId: 'k1', role: 'therapist' as const }], carerOf: ['c9'] };
    expect(homePath(both)).toBe('/triage');
    expect(homePath({ ...base, carerOf: ['c9'] })).toBe('/carer');
    expect(homePath({ ...base, clientId: 'c1' })).toBe('/my-week');
    expect(homePath(base)).toBe('/no-access');
    const hrefs = navFor(both, { mailbox: false }).flatMap((s) => s.links.map((l) => l.href));
    expect(hrefs).toEqual(['/triage', '/overview', '/clients', '/reports', '/monitoring', '/upload', '/carer', '/checks', '/my-prescription', '/messages']);
    expect(pageAllowed(both, 'admin')).toBe(false);
    expect(pageAllowed({ ...base, clientId: 'c1' }, 'client')).toBe(true);
  });
});
