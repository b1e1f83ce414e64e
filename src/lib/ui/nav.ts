import type { Viewer } from '../auth/viewer';

export interface NavLink {
  href: string;
  label: string;
}
export interface NavSection {
  title: string;
  links: NavLink[];
}

/** Navigation per role; a person with several roles gets each role's section. */
export function navFor(viewer: Viewer, options: { mailbox: boolean }): NavSection[] {
  const sections: NavSection[] = [];
  const roles = new Set(viewer.memberships.map((m) => m.role));
  if (roles.has('therapist') || roles.has('admin')) {
    sections.push({
      title: 'Supervise',
      links: [
        { href: '/triage', label: 'Triage' },
        { href: '/overview', label: 'Clinic overview' },
        { href: '/clients', label: 'Clients' },
        { href: '/reports', label: 'Reports' },
        { href: '/monitoring', label: 'Monitoring time' },
        { href: '/upload', label: 'Upload rides' },
      ],
    });
  }
  if (viewer.carerOf.length) {
    sections.push({
      title: 'Care',
      links: [
        { href: '/carer', label: 'Home' },
        { href: '/upload', label: 'Upload rides' },
        { href: '/clients', label: viewer.carerOf.length > 1 ? 'My clients' : 'My client' },
        { href: '/checks', label: 'Checks' },
        { href: '/my-prescription', label: 'Prescriptions' },
        { href: '/messages', label: 'Messages' },
      ],
    });
  }
  if (viewer.clientId) {
    sections.push({
      title: 'My riding',
      links: [
        { href: '/my-week', label: 'My week' },
        { href: '/progress', label: 'Progress' },
        { href: '/goal', label: 'Distance goal' },
        { href: '/checks', label: 'How a ride went' },
        { href: '/my-prescription', label: 'My prescription' },
        { href: '/messages', label: 'Messages' },
        { href: '/upload', label: 'Upload rides' },
      ],
    });
  }
  if (roles.has('admin')) {
    sections.push({
      title: 'Clinic',
      links: [
        { href: '/admin/staff', label: 'Staff' },
        { href: '/admin/settings', label: 'Clinic settings' },
        { href: '/admin/devices', label: 'Devices' },
        { href: '/admin/audit', label: 'Audit log' },
        ...(options.mailbox ? [{ href: '/admin/mailbox', label: 'Dev mailbox' }] : []),
      ],
    });
  }
  // The same page can appear for two roles (a therapist who is also a carer); show it once.
  const seen = new Set<string>();
  return sections
    .map((s) => ({ ...s, links: s.links.filter((l) => !seen.has(l.href) && seen.add(l.href)) }))
    .filter((s) => s.links.length);
}
