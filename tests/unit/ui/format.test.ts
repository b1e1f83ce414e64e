import { describe, it, expect } from 'vitest';
import {
  channelLabel,
  clock,
  distance,
  duration,
  minutes,
  number,
  PHASE_LABELS,
  sessionDateTime,
  withUnit,
} from '../../../src/components/rides/format';
import { inZone } from '../time/runtime-zone';

describe('number', () => {
  it('shows missing, NaN and infinite values as a dash', () => {
    expect(number(null, 1)).toBe('—');
    expect(number(undefined, 1)).toBe('—');
    expect(number(Number.NaN, 1)).toBe('—');
    expect(number(Number.POSITIVE_INFINITY, 0)).toBe('—');
  });

  it('keeps exactly the asked digits, padding with zeros', () => {
    expect(number(12, 1, 'en-GB')).toBe('12.0');
    expect(number(12.349, 2, 'en-GB')).toBe('12.35');
    expect(number(0, 0, 'en-GB')).toBe('0');
  });

  // from memory (CLDR): British English groups thousands with a comma and a decimal point; German the other way round.
  it('groups thousands and uses the decimal sign of the locale', () => {
    expect(number(1234.5, 1, 'en-GB')).toBe('1,234.5');
    expect(number(1234.5, 2, 'de-DE')).toBe('1.234,50');
  });

  // A slightly negative mean (a power sensor reading a hair below zero at rest)
  // rounds to zero but keeps its minus sign, because Intl's default signDisplay
  // "auto" signs negative zero. The page then reads "-0.0 W". Passing
  // signDisplay: 'negative' to toLocaleString would drop the sign of a zero.
  it('shows a value that rounds to zero without a minus sign', () => {
    expect(number(-0.04, 1, 'en-GB')).toBe('0.0');
  });
});

describe('withUnit', () => {
  it('adds the unit after a space', () => {
    expect(withUnit(12.34, 1, 'W', 'en-GB')).toBe('12.3 W');
  });

  it('leaves the unit off a missing value', () => {
    expect(withUnit(null, 1, 'W')).toBe('—');
    expect(withUnit(Number.NaN, 0, 'rpm')).toBe('—');
  });
});

describe('minutes', () => {
  it('keeps one decimal only where there is a fraction', () => {
    expect(minutes(90, 'en-GB')).toBe('1.5 min');
    expect(minutes(45, 'en-GB')).toBe('0.8 min');
    expect(minutes(300, 'en-GB')).toBe('5 min');
    expect(minutes(600, 'en-GB')).toBe('10 min');
  });

  // A session that counts from 24 minutes must not read "24 min" at 23.9 (1434 s).
  it('keeps the decimal above ten minutes too, rounding half away from zero', () => {
    expect(minutes(1434, 'en-GB')).toBe('23.9 min');
    expect(minutes(1830, 'en-GB')).toBe('30.5 min');
    expect(minutes(1794, 'en-GB')).toBe('29.9 min');
  });

  // from memory (CLDR): German writes a decimal comma.
  it('uses the locale for the decimal sign', () => {
    expect(minutes(90, 'de-DE')).toBe('1,5 min');
  });

  it('shows a missing phase as a dash', () => {
    expect(minutes(null)).toBe('—');
    expect(minutes(Number.NaN)).toBe('—');
  });
});

describe('duration', () => {
  it('gives seconds below a minute', () => {
    expect(duration(0)).toBe('0 s');
    expect(duration(45)).toBe('45 s');
    expect(duration(59.4)).toBe('59 s');
  });

  it('gives rounded minutes below an hour', () => {
    expect(duration(60)).toBe('1 min');
    expect(duration(89)).toBe('1 min');
    expect(duration(90)).toBe('2 min');
    expect(duration(32 * 60)).toBe('32 min');
  });

  it('gives hours and two-digit minutes from an hour on', () => {
    expect(duration(3900)).toBe('1 h 05 min');
    expect(duration(36_000)).toBe('10 h 00 min');
  });

  it('moves to hours when the minutes round up to sixty', () => {
    expect(duration(3570)).toBe('1 h 00 min');
  });

  it('shows a missing duration as a dash', () => {
    expect(duration(null)).toBe('—');
    expect(duration(Number.POSITIVE_INFINITY)).toBe('—');
  });

  // The seconds branch is chosen before rounding: 59.6 s is below 60, then
  // Math.round makes it "60 s", a form the function never gives for 60 s itself
  // ("1 min"). Rounding first (or comparing the rounded value) fixes it.
  it('never shows "60 s"', () => {
    expect(duration(59.6)).toBe('1 min');
  });
});

describe('distance', () => {
  it('gives whole metres below a kilometre', () => {
    expect(distance(0, 'en-GB')).toBe('0 m');
    expect(distance(999, 'en-GB')).toBe('999 m');
  });

  // from memory (CLDR): en-GB 1,500.0 and de-DE 12,3.
  it('gives kilometres with one decimal from a kilometre on, the same as the goal and the e-mails', () => {
    expect(distance(1000, 'en-GB')).toBe('1.0 km');
    expect(distance(12_340, 'en-GB')).toBe('12.3 km');
    expect(distance(12_350, 'en-GB')).toBe('12.4 km');
    expect(distance(12_340, 'de-DE')).toBe('12,3 km');
    expect(distance(1_500_000, 'en-GB')).toBe('1,500.0 km');
  });

  it('shows a missing distance as a dash', () => {
    expect(distance(null)).toBe('—');
    expect(distance(undefined)).toBe('—');
  });

  // Same boundary slip as duration: 999.6 m is below a kilometre, so it is
  // rounded to whole metres and reads "1,000 m" instead of "1.0 km".
  it('never shows "1,000 m"', () => {
    expect(distance(999.6, 'en-GB')).toBe('1.0 km');
  });
});

describe('clock', () => {
  it('gives m:ss with two-digit seconds', () => {
    expect(clock(0)).toBe('0:00');
    expect(clock(65)).toBe('1:05');
    expect(clock(3600)).toBe('60:00');
  });

  it('rounds to the nearest second and carries into the minute', () => {
    expect(clock(59.6)).toBe('1:00');
    expect(clock(59.4)).toBe('0:59');
  });

  it('never goes below zero', () => {
    expect(clock(-3)).toBe('0:00');
  });
});

describe('channelLabel and PHASE_LABELS', () => {
  it('puts the side first and capitalises', () => {
    expect(channelLabel('quadriceps_left')).toBe('Left quadriceps');
    expect(channelLabel('gluteals_right')).toBe('Right gluteals');
    expect(channelLabel('channel_3')).toBe('Channel 3');
  });

  it('names the three phases', () => {
    expect(PHASE_LABELS).toEqual({ passive: 'Warm-up', active: 'Active', cooldown: 'Cool-down' });
  });
});

describe('sessionDateTime', () => {
  it('shows the weekday, date and time in the given time zone', () => {
    const text = sessionDateTime('2026-10-05T09:30:00Z', 'en-GB', 'Europe/London');
    // source: date-fns format('EEEE d MMMM yyyy'): 2026-10-05 is a Monday; BST is UTC+1 in October
    expect(text).toContain('Monday');
    expect(text).toContain('5 October 2026');
    expect(text).toContain('10:30');
  });

  it('moves to the next day where the zone is already past midnight', () => {
    // source: IANA tz database: Pacific/Auckland is on NZDT (UTC+13) from 2026-09-27; date-fns: 2026-10-06 is a Tuesday
    const text = sessionDateTime('2026-10-05T23:30:00Z', 'en-GB', 'Pacific/Auckland');
    expect(text).toContain('Tuesday');
    expect(text).toContain('6 October 2026');
    expect(text).toContain('12:30');
  });

  it('shows the repeated hour of the day BST ends as the same clock time', () => {
    // source: IANA tz database: Europe/London BST ends 2026-10-25 at 01:00 UTC,
    // so 00:30 UTC (BST) and 01:30 UTC (GMT) are both 01:30 local
    const before = sessionDateTime('2026-10-25T00:30:00Z', 'en-GB', 'Europe/London');
    const after = sessionDateTime('2026-10-25T01:30:00Z', 'en-GB', 'Europe/London');
    expect(before).toContain('01:30');
    expect(after).toContain('01:30');
    expect(before).toContain('Sunday');
  });

  it('skips the missing hour of the day BST starts', () => {
    // source: IANA tz database: Europe/London BST starts 2026-03-29 at 01:00 UTC (01:00 GMT → 02:00 BST)
    expect(sessionDateTime('2026-03-29T00:30:00Z', 'en-GB', 'Europe/London')).toContain('00:30');
    expect(sessionDateTime('2026-03-29T01:30:00Z', 'en-GB', 'Europe/London')).toContain('02:30');
  });

  it('words the date in the given locale', () => {
    // source: IANA tz database: Europe/Berlin is on CEST (UTC+2) on 2026-10-05
    const text = sessionDateTime('2026-10-05T09:30:00Z', 'de-DE', 'Europe/Berlin');
    expect(text).toContain('Montag');
    expect(text).toContain('Oktober');
    expect(text).toContain('11:30');
  });

  it('falls back to the runtime time zone when none is given', () => {
    // source: IANA tz database: America/New_York is on EDT (UTC−4) on 2026-10-05
    const text = inZone('America/New_York', () => sessionDateTime('2026-10-05T02:30:00Z', 'en-GB'));
    expect(text).toContain('Sunday');
    expect(text).toContain('4 October 2026');
    expect(text).toContain('22:30');
  });
});
