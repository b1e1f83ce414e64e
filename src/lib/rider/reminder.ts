// Whether to send today's "session due" reminder: a session is due today, none
// has arrived by the client's evening, and none was sent earlier today.
import { inZone, localDateOf, type Instant } from './calendar';

export interface ReminderInput {
  timeZone: string;
  now: Instant;
  /** Local hour (0–23) from which the reminder may go out. */
  eveningHour?: number;
  /** `dueLocalDate` from nextSessionDue. */
  nextDue: string | null;
  lastReminderSentAt: Instant | null;
  /** Sessions that started on the client's local today. */
  sessionsToday: number;
}

export function reminderDue({
  timeZone,
  now,
  eveningHour = 18,
  nextDue,
  lastReminderSentAt,
  sessionsToday,
}: ReminderInput): boolean {
  if (!Number.isInteger(eveningHour) || eveningHour < 0 || eveningHour > 23) {
    throw new Error(`eveningHour must be a whole hour from 0 to 23, got ${eveningHour}`);
  }
  const local = inZone(now, timeZone);
  const today = local.toISODate();
  if (nextDue !== today || sessionsToday > 0 || local.hour < eveningHour) return false;
  return lastReminderSentAt === null || localDateOf(lastReminderSentAt, timeZone) !== today;
}
