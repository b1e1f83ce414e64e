// The plain words for flag kinds and severities, the same in every page and e-mail.
import type { FlagKind, FlagSeverity } from './types';

/**
 * The locale of the reason stored with a flag (used by e-mails and the audit
 * trail); pages word the dates of a reason again in the clinic's locale
 * (src/lib/flags/reason.ts).
 */
export const REASON_LOCALE = 'en-GB';

export const FLAG_KIND_WORDS: Record<FlagKind, string> = {
  missed_sessions: 'Missed sessions',
  power_drop: 'Power drop',
  current_rise: 'Current rise',
  short_session: 'Short sessions',
  bp_rise: 'Blood pressure rise',
  bp_drop: 'Blood pressure fall after riding',
  skin_concern: 'Skin concern',
};

export const FLAG_SEVERITY_WORDS: Record<FlagSeverity, string> = {
  urgent: 'Urgent',
  review: 'Review',
  info: 'Info',
};
