// Words for screening statuses, shared by the server and the browser (no server imports here).
import type { ScreeningStatus } from './readiness';

export const SCREENING_STATUS_LABELS: Record<ScreeningStatus, string> = {
  not_assessed: 'Not assessed',
  no_concern: 'No concern',
  concern: 'Concern',
};
