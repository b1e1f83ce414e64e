// Applies planned flag changes to a list of stored flags, as documented on
// FlagChange; the storage layer does the same to its rows.
import type { ExistingFlag, FlagChange } from './types';

export function applyFlagChanges(
  flags: ExistingFlag[],
  changes: FlagChange[],
  now: string,
  newId: () => string,
): ExistingFlag[] {
  const byId = new Map(flags.map((f) => [f.id, { ...f }]));
  const raised: ExistingFlag[] = [];
  for (const change of changes) {
    if (change.type === 'raise') {
      const { kind, severity, anchor, reason, evidence } = change.condition;
      raised.push({ id: newId(), kind, severity, state: 'open', anchor, reason, evidence, raisedAt: now, clearedAt: change.cleared ? now : null, snoozedUntil: null });
      continue;
    }
    const flag = byId.get(change.flagId);
    if (!flag) throw new RangeError(`No flag ${change.flagId}`);
    if (change.type === 'withdraw') {
      flag.state = 'withdrawn';
      continue;
    }
    const { severity, anchor, reason, evidence } = change.condition;
    Object.assign(flag, { severity, anchor, reason, evidence });
    if (change.reopen) flag.state = 'open';
    flag.clearedAt = change.type === 'clear' ? (flag.clearedAt ?? now) : null;
  }
  return [...byId.values(), ...raised];
}
