// Field schemas for what people type: text that PostgreSQL can store (no NUL,
// no broken UTF-16) and dates that exist on the calendar. Each refusal names
// the field, so a bad value is a 400 with a message, never a database error.
import { z } from 'zod';

// A code point in Cs is a lone surrogate (half of a broken UTF-16 pair): with
// the `u` flag a valid pair is one astral code point and passes.
const SINGLE_LINE = /^[^\p{Cc}\p{Cs}]*$/u;
const MULTI_LINE = /^(?:[\t\n\r]|[^\p{Cc}\p{Cs}])*$/u;

/** One line of text: no control characters (NUL, tabs, line breaks) and no broken characters. */
export function line(schema: z.ZodString, label: string): z.ZodString {
  return schema.regex(SINGLE_LINE, `${label}: remove the control characters (such as tabs, line breaks or NUL) or broken characters from it.`);
}

/** Text of several lines: line breaks and tabs are fine, other control characters (NUL) and broken characters are not. */
export function paragraph(schema: z.ZodString, label: string): z.ZodString {
  return schema.regex(MULTI_LINE, `${label}: remove the control characters (such as NUL) or broken characters from it.`);
}

// Kinloop's dates are birth dates, program and pause days, snoozes and goals:
// all fall well inside these years (and PostgreSQL has no year 0).
const FIRST_YEAR = 1900;
const LAST_YEAR = 2199;

/** A local calendar date, 'YYYY-MM-DD', that exists (no 2026-13-45, no 2099-02-31). */
export function calendarDate(label: string) {
  return z
    .string({ invalid_type_error: `${label}: use the form YYYY-MM-DD.` })
    .regex(/^\d{4}-\d{2}-\d{2}$/, `${label}: use the form YYYY-MM-DD.`)
    .date(`${label}: that day does not exist on the calendar; check the month and the day.`)
    .refine((v) => {
      const year = Number(v.slice(0, 4));
      return year >= FIRST_YEAR && year <= LAST_YEAR;
    }, `${label}: choose a date between ${FIRST_YEAR} and ${LAST_YEAR}.`);
}

/**
 * An ISO 8601 date-time with a time zone that names a real instant within the
 * same years. `formatMessage` replaces the words for a value of the wrong form.
 */
export function instant(label: string, formatMessage = `${label}: use an ISO 8601 date-time with a time zone, e.g. 2026-10-05T09:30:00Z.`) {
  return z
    .string({ invalid_type_error: formatMessage })
    .datetime({ offset: true, message: formatMessage })
    .refine((v) => {
      const at = new Date(v);
      return !Number.isNaN(at.getTime()) && at.getUTCFullYear() >= FIRST_YEAR && at.getUTCFullYear() <= LAST_YEAR;
    }, `${label}: that is not a real moment between ${FIRST_YEAR} and ${LAST_YEAR}; check the date and the offset.`);
}

/** A row id as a query parameter: a positive whole number that PostgreSQL's bigint holds. */
export function rowId(label: string) {
  return z.coerce
    .number({ invalid_type_error: `${label}: use a whole number.` })
    .int(`${label}: use a whole number.`)
    .positive(`${label}: use a number above 0.`)
    .max(Number.MAX_SAFE_INTEGER, `${label}: that number is too large.`);
}
