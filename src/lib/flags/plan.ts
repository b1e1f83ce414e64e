// Reconciles stored session flags with the data. Rules from the Kinloop
// supervision issue:
// - one open flag (open or acknowledged) per kind per client: new evidence
//   updates it rather than stacking copies;
// - an acknowledged flag whose new evidence names a new anchor or a worse
//   severity is reopened;
// - a resolved flag is never touched; a new episode raises a new flag, but the
//   episode a therapist resolved is not raised again;
// - snoozed flags are updated like any other; the snooze is left in place;
// - when the condition no longer holds: `clear` if it held at some moment
//   while the flag was open (from raisedAt until now, judged with all data we
//   have now), else `withdraw` — the flag should never have stood.
// - check-derived kinds are left alone.
// planFlagChanges is a pure function of (stored flags, data). Judging "held"
// over the flag's open life, rather than at its anchor alone, is what keeps a
// batch's result independent of the order its files are parsed in: a flag
// raised mid-batch on a partial view, whose condition does not hold with the
// whole batch, is withdrawn instead of lingering as cleared.
import { latestHeldBetween, assessAsOf } from './evaluate';
import { prepareFlagData, type FlagData } from './flag-data';
import {
  FLAG_SEVERITIES,
  SESSION_FLAG_KINDS,
  type ExistingFlag,
  type FlagChange,
  type FlagCondition,
  type FlagInput,
  type FlagSeverity,
  type SessionFlagKind,
} from './types';

const isOpen = (flag: ExistingFlag) => flag.state === 'open' || flag.state === 'acknowledged';

const worse = (a: FlagSeverity, b: FlagSeverity) => FLAG_SEVERITIES.indexOf(a) < FLAG_SEVERITIES.indexOf(b);

function shouldReopen(flag: ExistingFlag, condition: FlagCondition): boolean {
  return flag.state === 'acknowledged' && (condition.anchor !== flag.anchor || worse(condition.severity, flag.severity));
}

function sameRecord(flag: ExistingFlag, condition: FlagCondition): boolean {
  return (
    flag.severity === condition.severity &&
    flag.anchor === condition.anchor &&
    flag.reason === condition.reason &&
    canonicalJson(flag.evidence) === canonicalJson(condition.evidence)
  );
}

/** JSON with object keys sorted, so that evidence read back from storage compares equal. */
function canonicalJson(value: unknown): string {
  return JSON.stringify(value, (_key, v: unknown) =>
    v && typeof v === 'object' && !Array.isArray(v)
      ? Object.fromEntries(Object.entries(v as Record<string, unknown>).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)))
      : v,
  );
}

function planKind(kind: SessionFlagKind, flags: ExistingFlag[], data: FlagData): FlagChange[] {
  const ofKind = flags.filter((f) => f.kind === kind);
  const current = assessAsOf(kind, data, data.nowMs);
  // Should several be open (the store is meant to prevent it), the earliest
  // raised is the one kept up to date.
  const open = ofKind
    .filter(isOpen)
    .sort((a, b) => Date.parse(a.raisedAt) - Date.parse(b.raisedAt) || a.id.localeCompare(b.id))[0];

  if (!open) {
    const resolvedEpisode = ofKind.some((f) => f.state === 'resolved' && f.anchor === current.condition?.anchor);
    return current.condition && !resolvedEpisode ? [{ type: 'raise', condition: current.condition }] : [];
  }
  if (current.condition) {
    if (sameRecord(open, current.condition) && open.clearedAt === null) return [];
    return [{ type: 'update', flagId: open.id, condition: current.condition, reopen: shouldReopen(open, current.condition) }];
  }
  const held = latestHeldBetween(kind, data, Date.parse(open.raisedAt), data.nowMs);
  if (!held) {
    const atRaise = assessAsOf(kind, data, Math.min(Date.parse(open.raisedAt), data.nowMs));
    return [
      {
        type: 'withdraw',
        flagId: open.id,
        why: `With the files now in, this never held while the flag was open: when it was raised, ${atRaise.status}.`,
      },
    ];
  }
  if (open.clearedAt !== null && sameRecord(open, held)) return [];
  return [
    {
      type: 'clear',
      flagId: open.id,
      why: `Cleared: ${current.status}.`,
      condition: held,
      reopen: shouldReopen(open, held),
    },
  ];
}

export function planFlagChanges(existing: ExistingFlag[], input: FlagInput): FlagChange[] {
  const data = prepareFlagData(input);
  return SESSION_FLAG_KINDS.flatMap((kind) => planKind(kind, existing, data));
}
