import type { FlagKind } from '../flags';

export const FLAG_KIND_WORDS: Record<FlagKind, string> = {
  missed_sessions: 'Missed sessions',
  power_drop: 'Power drop',
  current_rise: 'Current rise',
  short_session: 'Short sessions',
  bp_rise: 'Blood pressure rise',
  bp_drop: 'Blood pressure fall after riding',
  skin_concern: 'Skin concern',
};
