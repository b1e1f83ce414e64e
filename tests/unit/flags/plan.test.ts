import { describe, expect, it } from 'vitest';
import { applyFlagChanges, planFlagChanges, type ExistingFlag, type FlagInput } from '../../../src/lib/flags';
import { at, flagInput, ride, steadySessions, withSession, ZONE } from './scenario';

const MON = 's-2026-10-12-1000';
const WED = 's-2026-10-14-1000';

let ids = 0;
const newId = () => `f${++ids}`;

/** Plans and applies, as the ingest does after each file. */
function step(flags: ExistingFlag[], input: FlagInput) {
  const changes = planFlagChanges(flags, input);
  return { changes, flags: applyFlagChanges(flags, changes, input.now, newId) };
}

const open = (flags: ExistingFlag[]) => flags.filter((f) => f.state === 'open' || f.state === 'acknowledged');

const powerDrop = (power = 12) => withSession(withSession(steadySessions(), MON, { meanPowerW: power }), WED, { meanPowerW: power });

describe('planFlagChanges', () => {
  it('raises a flag for a new condition and then leaves it alone', () => {
    const first = step([], flagInput({ sessions: powerDrop(15) }));
    expect(first.changes).toEqual([{ type: 'raise', condition: expect.objectContaining({ kind: 'power_drop', anchor: WED }) }]);
    expect(planFlagChanges(first.flags, flagInput({ sessions: powerDrop(15) }))).toEqual([]);
  });

  it('updates and reopens an acknowledged flag on a new drop instead of raising a second one', () => {
    const raised = step([], flagInput({ sessions: powerDrop(15) })).flags;
    const acknowledged = raised.map((f) => ({ ...f, state: 'acknowledged' as const }));
    // Friday is low as well: the latest two are now Wednesday and Friday.
    const friday = ride('2026-10-16', ZONE, { power: 14 });
    const later = flagInput({ sessions: [...powerDrop(15), friday], now: at('2026-10-16', '20:00', ZONE) });
    const { changes, flags } = step(acknowledged, later);
    expect(changes).toEqual([
      { type: 'update', flagId: raised[0].id, condition: expect.objectContaining({ kind: 'power_drop', anchor: friday.id }), reopen: true },
    ]);
    expect(open(flags)).toHaveLength(1);
    expect(open(flags)[0]).toMatchObject({ state: 'open', anchor: friday.id });
  });

  it('reopens an acknowledged flag that turns worse, and updates an open one silently', () => {
    const raised = step([], flagInput({ sessions: powerDrop(15) })).flags;
    const acknowledged = raised.map((f) => ({ ...f, state: 'acknowledged' as const }));
    // A corrected file for the same sessions makes the same episode urgent.
    const worse = step(acknowledged, flagInput({ sessions: powerDrop(12) }));
    expect(worse.changes).toEqual([expect.objectContaining({ type: 'update', reopen: true, condition: expect.objectContaining({ severity: 'urgent', anchor: WED }) })]);
    // On a flag still open, new evidence is an update without reopening.
    const stillOpen = step(raised, flagInput({ sessions: powerDrop(12) }));
    expect(stillOpen.changes).toEqual([expect.objectContaining({ type: 'update', reopen: false })]);
  });

  it('keeps the snooze of a snoozed flag while updating it', () => {
    const raised = step([], flagInput({ sessions: powerDrop(15) })).flags;
    const snoozed = raised.map((f) => ({ ...f, state: 'acknowledged' as const, snoozedUntil: '2026-10-30' }));
    const friday = ride('2026-10-16', ZONE, { power: 14 });
    const { flags } = step(snoozed, flagInput({ sessions: [...powerDrop(15), friday], now: at('2026-10-16', '20:00', ZONE) }));
    expect(flags[0]).toMatchObject({ anchor: friday.id, snoozedUntil: '2026-10-30' });
  });

  it('withdraws a missed-week flag when a late file fills the week', () => {
    const missing = steadySessions().filter((s) => s.id !== 's-2026-10-09-1000');
    const raised = step([], flagInput({ sessions: missing })).flags;
    expect(raised).toEqual([expect.objectContaining({ kind: 'missed_sessions', anchor: '2026-W41', state: 'open' })]);
    // Friday's file arrives a day later.
    const { changes, flags } = step(raised, flagInput({ now: at('2026-10-15', '09:00', ZONE) }));
    expect(changes).toEqual([
      {
        type: 'withdraw',
        flagId: raised[0].id,
        why:
          'With the files now in, this never held while the flag was open: when it was raised, the week of 5 October had 3 of the 3 prescribed sessions counted, and the latest session was on Wednesday 14 October.',
      },
    ]);
    expect(flags[0].state).toBe('withdrawn');
  });

  it('clears, not withdraws, a power drop that held and has recovered', () => {
    const raised = step([], flagInput({ sessions: powerDrop(12) })).flags;
    const recovered = [...powerDrop(12), ride('2026-10-16', ZONE), ride('2026-10-19', ZONE)];
    const { changes, flags } = step(raised, flagInput({ sessions: recovered, now: at('2026-10-19', '20:00', ZONE) }));
    expect(changes).toEqual([
      {
        type: 'clear',
        flagId: raised[0].id,
        why: 'Cleared: mean power was 20.0 W and 20.0 W in the last two sessions, against the usual 20.0 W (not both more than 20 % below).',
        condition: expect.objectContaining({ kind: 'power_drop', anchor: WED, severity: 'urgent' }),
        reopen: false,
      },
    ]);
    expect(flags[0]).toMatchObject({ state: 'open', anchor: WED, clearedAt: at('2026-10-19', '20:00', ZONE) });
    // Nothing more to do until the data changes.
    expect(planFlagChanges(flags, flagInput({ sessions: recovered, now: at('2026-10-20', '08:00', ZONE) }))).toEqual([]);
  });

  it('updates a cleared flag when its condition holds again', () => {
    const raised = step([], flagInput({ sessions: powerDrop(12) })).flags;
    const recovered = [...powerDrop(12), ride('2026-10-16', ZONE), ride('2026-10-19', ZONE)];
    const cleared = step(raised, flagInput({ sessions: recovered, now: at('2026-10-19', '20:00', ZONE) })).flags;
    const again = [...recovered, ride('2026-10-21', ZONE, { power: 13 }), ride('2026-10-23', ZONE, { power: 13 })];
    const { changes, flags } = step(cleared, flagInput({ sessions: again, now: at('2026-10-23', '20:00', ZONE) }));
    expect(changes).toEqual([expect.objectContaining({ type: 'update', flagId: raised[0].id })]);
    expect(flags[0]).toMatchObject({ clearedAt: null, anchor: 's-2026-10-23-1000' });
  });

  it('withdraws a power drop when a late file dated between the two latest shows it never held', () => {
    const raised = step([], flagInput({ sessions: powerDrop(12) })).flags;
    // A normal session on Tuesday: as of Wednesday the latest two are Tuesday and Wednesday.
    const { changes } = step(raised, flagInput({ sessions: [...powerDrop(12), ride('2026-10-13', ZONE)] }));
    expect(changes).toEqual([
      expect.objectContaining({
        type: 'withdraw',
        why: 'With the files now in, this never held while the flag was open: when it was raised, mean power was 20.0 W and 12.0 W in the last two sessions, against the usual 20.0 W (not both more than 20 % below).',
      }),
    ]);
  });

  it('clears, not withdraws, a drop whose recovery came in later: the drop held on Wednesday whenever the files came', () => {
    // Raised on Friday morning with Monday and Wednesday low; Thursday's normal
    // ride reaches Kinloop only later. Uploaded as ridden, the drop would have
    // been flagged on Wednesday and cleared on Thursday: so it ends here.
    const raisedAt = at('2026-10-16', '07:00', ZONE);
    const raised = step([], flagInput({ sessions: powerDrop(12), now: raisedAt })).flags;
    expect(raised).toHaveLength(1);
    const late = [...powerDrop(12), ride('2026-10-15', ZONE)];
    const { changes } = step(raised, flagInput({ sessions: late, now: at('2026-10-16', '20:00', ZONE) }));
    expect(changes).toEqual([expect.objectContaining({ type: 'clear', condition: expect.objectContaining({ kind: 'power_drop', anchor: WED }) })]);
  });

  it('raises a drop that held and recovered within one late batch as a cleared flag, saying why it cleared', () => {
    const recovered = [...powerDrop(12), ride('2026-10-15', ZONE)];
    const now = at('2026-10-16', '20:00', ZONE);
    const { changes, flags } = step([], flagInput({ sessions: recovered, now }));
    expect(changes).toEqual([
      {
        type: 'raise',
        condition: expect.objectContaining({ kind: 'power_drop', severity: 'urgent', anchor: WED }),
        cleared: { why: 'Cleared: mean power was 12.0 W and 20.0 W in the last two sessions, against the usual 20.0 W (not both more than 20 % below).' },
      },
    ]);
    expect(flags).toEqual([expect.objectContaining({ state: 'open', clearedAt: now, raisedAt: now })]);
    // Nothing more to do until the data changes.
    expect(planFlagChanges(flags, flagInput({ sessions: recovered, now: at('2026-10-17', '08:00', ZONE) }))).toEqual([]);
  });

  it('does not raise again an episode a therapist resolved, once it has cleared', () => {
    const raised = step([], flagInput({ sessions: powerDrop(12) })).flags;
    const resolved = raised.map((f) => ({ ...f, state: 'resolved' as const }));
    const recovered = [...powerDrop(12), ride('2026-10-16', ZONE), ride('2026-10-19', ZONE)];
    expect(planFlagChanges(resolved, flagInput({ sessions: recovered, now: at('2026-10-19', '20:00', ZONE) }))).toEqual([]);
  });

  it('never touches a resolved flag, raises a new one for a new episode and not for the resolved one', () => {
    const raised = step([], flagInput({ sessions: powerDrop(12) })).flags;
    const resolved = raised.map((f) => ({ ...f, state: 'resolved' as const }));
    expect(planFlagChanges(resolved, flagInput({ sessions: powerDrop(12) }))).toEqual([]);
    const later = [...powerDrop(12), ride('2026-10-16', ZONE, { power: 12 })];
    const { changes } = step(resolved, flagInput({ sessions: later, now: at('2026-10-16', '20:00', ZONE) }));
    expect(changes).toEqual([{ type: 'raise', condition: expect.objectContaining({ kind: 'power_drop', anchor: 's-2026-10-16-1000' }) }]);
    // And a resolved flag whose condition cleared is not withdrawn or cleared either.
    expect(planFlagChanges(resolved, flagInput())).toEqual([]);
  });

  it('moves a missed-sessions flag from a missed week to a gap, reopening it', () => {
    const sessions = steadySessions().filter((s) => s.startedAt < at('2026-10-03', '00:00', ZONE));
    const review = step([], flagInput({ sessions, now: at('2026-10-12', '09:00', ZONE) })).flags;
    expect(review).toEqual([expect.objectContaining({ severity: 'review', anchor: '2026-W41' })]);
    const acknowledged = review.map((f) => ({ ...f, state: 'acknowledged' as const }));
    const { changes } = step(acknowledged, flagInput({ sessions, now: at('2026-10-13', '09:00', ZONE) }));
    expect(changes).toEqual([
      expect.objectContaining({ type: 'update', reopen: true, condition: expect.objectContaining({ severity: 'urgent', anchor: 'gap:s-2026-10-02-1000' }) }),
    ]);
  });

  it('leaves check-derived flags alone', () => {
    const bp: ExistingFlag = {
      id: 'bp1',
      kind: 'bp_rise',
      severity: 'urgent',
      state: 'open',
      anchor: 'check-17',
      reason: 'Systolic 172 mmHg after the ride.',
      evidence: {},
      raisedAt: at('2026-10-01', '10:00', ZONE),
      clearedAt: null,
      snoozedUntil: null,
    };
    expect(planFlagChanges([bp], flagInput())).toEqual([]);
  });
});
