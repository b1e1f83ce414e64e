import type { Viewer } from '../auth/viewer';

export type PageAudience = 'staff' | 'admin' | 'carer' | 'client' | 'contributor';

/** Whether a page is meant for the viewer; pages answer 403 with an explanation otherwise. */
export function pageAllowed(viewer: Viewer, audience: PageAudience): boolean {
  switch (audience) {
    case 'staff':
      return viewer.memberships.length > 0;
    case 'admin':
      return viewer.memberships.some((m) => m.role === 'admin');
    case 'carer':
      return viewer.carerOf.length > 0;
    case 'client':
      return viewer.clientId !== null;
    case 'contributor':
      return viewer.memberships.length > 0 || viewer.carerOf.length > 0 || viewer.clientId !== null;
  }
}
