// The plain words for flag kinds and severities, the same in every page and e-mail.
import { FLAG_SEVERITIES, type FlagKind, type FlagSeverity } from './types';

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

/** 0 for the most severe; a client without flags sorts after every severity. */
export function severityRank(severity: FlagSeverity | undefined): number {
  return severity ? FLAG_SEVERITIES.indexOf(severity) : FLAG_SEVERITIES.length;
}
