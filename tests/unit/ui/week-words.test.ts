import { describe, it, expect } from 'vitest';
import { nextDueWords, shortNote, streakWords, weekHeadline } from '../../../src/components/rider/week-words';
import type { NextDueReason } from '../../../src/components/rider/types';

// source: date-fns format('EEEE'): 2026-03-10 is a Tuesday, 2026-03-13 a Friday, 2026-03-16 a Monday,
// 2026-03-17 a Tuesday, 2026-03-19 a Thursday
const TODAY = '2026-03-10';
const due = (reason: NextDueReason, date: string | null) => nextDueWords({ nextDue: { reason, date } }, TODAY, 'en-GB');

describe('weekHeadline', () => {
  it('counts against the prescription: 0 of 3, 2 of 3, 3 of 3', () => {
    expect(weekHeadline({ prescribed: 3, counted: 0 })).toBe('0 of 3 sessions done this week');
    expect(weekHeadline({ prescribed: 3, counted: 2 })).toBe('2 of 3 sessions done this week');
    expect(weekHeadline({ prescribed: 3, counted: 3 })).toBe('3 of 3 sessions done this week');
  });

  it('uses the singular for a prescription of one session', () => {
    expect(weekHeadline({ prescribed: 1, counted: 0 })).toBe('0 of 1 session done this week');
  });

  it('says how many more than the set number were done', () => {
    expect(weekHeadline({ prescribed: 3, counted: 4 })).toBe('4 sessions done this week, 1 more than the 3 set');
    expect(weekHeadline({ prescribed: 2, counted: 5 })).toBe('5 sessions done this week, 3 more than the 2 set');
  });

  it('counts sessions without a prescription, singular and plural', () => {
    expect(weekHeadline({ prescribed: null, counted: 0 })).toBe('No sessions yet this week');
    expect(weekHeadline({ prescribed: null, counted: 1 })).toBe('1 session done this week');
    expect(weekHeadline({ prescribed: null, counted: 2 })).toBe('2 sessions done this week');
  });

  it('treats a prescription of zero as none', () => {
    expect(weekHeadline({ prescribed: 0, counted: 0 })).toBe('No sessions yet this week');
    expect(weekHeadline({ prescribed: 0, counted: 2 })).toBe('2 sessions done this week');
  });
});

describe('shortNote', () => {
  it('says nothing without short sessions', () => {
    expect(shortNote({ short: 0 })).toBeNull();
  });

  it('uses the singular for one short session and the plural for more', () => {
    expect(shortNote({ short: 1 })).toBe('1 more session this week was shorter than the set time, so it is not counted.');
    expect(shortNote({ short: 2 })).toBe('2 more sessions this week were shorter than the set time, so they are not counted.');
  });
});

describe('nextDueWords', () => {
  it('explains that the prescription sets the sessions when there is none', () => {
    expect(due('no_target', null)).toEqual({
      tone: 'none',
      headline: 'No sessions are set yet',
      detail: 'The number of sessions a week comes from the prescription, which the therapist sets.',
    });
  });

  it('gives the date the pause runs until (the first day sessions are due again), and that it does not break the streak', () => {
    const words = due('paused', '2026-03-19');
    expect(words.tone).toBe('paused');
    expect(words.headline).toBe('Program paused until Thursday 19 March');
    expect(words.detail).toContain('does not break the streak');
  });

  it('words an open-ended pause without a date', () => {
    const words = due('paused', null);
    expect(words.headline).toBe('Program paused for now');
    expect(words.detail).toBe('The clinic will say when sessions start again. A pause does not break the streak.');
  });

  it('words the date of a pause in the viewer’s language', () => {
    expect(nextDueWords({ nextDue: { reason: 'paused', date: '2026-03-19' } }, TODAY, 'de-DE').headline).toContain('19. März');
  });

  it('praises a week that is done and gives the next session when known', () => {
    expect(due('week_met', '2026-03-16')).toEqual({ tone: 'done', headline: 'This week’s sessions are done — well done', detail: 'Next session: Monday' });
    expect(due('week_met', null).detail).toBeNull();
  });

  it('says today, tomorrow, the weekday within a week, and the date beyond', () => {
    expect(due('due_today', TODAY)).toEqual({ tone: 'due', headline: 'Next session: today', detail: null });
    expect(due('due', '2026-03-11').headline).toBe('Next session: tomorrow');
    expect(due('due', '2026-03-13').headline).toBe('Next session: Friday');
    expect(due('due', '2026-03-17').headline).toBe('Next session: Tuesday 17 March');
  });

  it('says when no session is planned', () => {
    expect(due('due', null)).toEqual({ tone: 'due', headline: 'Next session: not planned yet', detail: null });
  });
});

describe('streakWords', () => {
  it('encourages a first streak at zero, and treats a negative count as zero', () => {
    const none = { headline: 'No streak yet', detail: 'A streak starts with the first week in which all the set sessions are done.' };
    expect(streakWords(0)).toEqual(none);
    expect(streakWords(-1)).toEqual(none);
  });

  it('uses the singular for one week and the plural for more', () => {
    expect(streakWords(1)).toEqual({ headline: '1-week streak', detail: 'One week with all the set sessions done.' });
    expect(streakWords(4)).toEqual({ headline: '4-week streak', detail: '4 weeks in a row with all the set sessions done.' });
  });
});
