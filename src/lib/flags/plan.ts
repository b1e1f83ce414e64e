// Reconciles stored session flags with the data. Rules from the Kinloop
// supervision issue, and the arrival rule of DEVELOPERS.md ("Flags depend on
// the data and the clock"):
// - the flags a client's history leaves are those a planner judging at every
//   moment, with each file in from the moment its ride started, would have
//   left: per kind, the latest episode that held at any moment of the program
//   (judged with the data now in), cleared when it does not hold now. So a
//   short week made up the week after leaves a cleared flag whether the files
//   came week by week or in one late batch;
// - one open flag (open or acknowledged) per kind per client: new evidence
//   updates it rather than stacking copies;
// - an acknowledged flag whose new evidence names a new anchor or a worse
//   severity is reopened;
// - a resolved flag is never touched, and when the latest episode is the one a
//   therapist resolved, no flag is raised for it again;
// - snoozed flags are updated like any other; the snooze is left in place;
// - an open flag for which no episode held at any moment is withdrawn: it
//   was raised on a partial view (files missing) and should never have stood;
// - check-derived kinds are left alone.
// planFlagChanges is a pure function of (stored flags, data, now); what it
// leaves live depends on the stored flags only through resolved episodes, so
// neither the order nor the time at which files arrived changes the result.
import { latestHeldBetween, assessAsOf } from './evaluate';
import { startOfLocalDay } from '../time/zoned';
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
  const latest = current.condition ?? latestHeldInProgram(kind, data);
  const resolvedEpisode = latest !== null && ofKind.some((f) => f.state === 'resolved' && f.anchor === latest.anchor);
  const target = resolvedEpisode ? null : latest;
  const holdsNow = target !== null && target === current.condition;
  // Should several be open (the store is meant to prevent it), the earliest
  // raised is the one kept up to date.
  const open = ofKind
    .filter(isOpen)
    .sort((a, b) => Date.parse(a.raisedAt) - Date.parse(b.raisedAt) || a.id.localeCompare(b.id))[0];

  if (!open) {
    if (!target) return [];
    return [holdsNow ? { type: 'raise', condition: target } : { type: 'raise', condition: target, cleared: { why: `Cleared: ${current.status}.` } }];
  }
  if (!target) {
    const atRaise = assessAsOf(kind, data, Math.min(Date.parse(open.raisedAt), data.nowMs));
    return [
      {
        type: 'withdraw',
        flagId: open.id,
        why: `With the files now in, this never held while the flag was open: when it was raised, ${atRaise.status}.`,
      },
    ];
  }
  if (holdsNow) {
    if (sameRecord(open, target) && open.clearedAt === null) return [];
    return [{ type: 'update', flagId: open.id, condition: target, reopen: shouldReopen(open, target) }];
  }
  if (open.clearedAt !== null && sameRecord(open, target)) return [];
  return [{ type: 'clear', flagId: open.id, why: `Cleared: ${current.status}.`, condition: target, reopen: shouldReopen(open, target) }];
}

/** The latest episode of `kind` that held at any moment from the program start until now, or null. */
function latestHeldInProgram(kind: SessionFlagKind, data: FlagData): FlagCondition | null {
  const start = data.calendar.timeline.programStart;
  if (start === null) return null;
  return latestHeldBetween(kind, data, Date.parse(startOfLocalDay(start, data.timeZone)), data.nowMs);
}

export function planFlagChanges(existing: ExistingFlag[], input: FlagInput): FlagChange[] {
  const data = prepareFlagData(input);
  return SESSION_FLAG_KINDS.flatMap((kind) => planKind(kind, existing, data));
}
