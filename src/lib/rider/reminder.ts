// Whether to send today's "session due" reminder: a session is due today and
// none has arrived by the client's evening. Once a day is the outbox's dedupe
// key's job (`reminder:user:client:date`), not this rule's.
import { localDate } from '../time/local-date';
import { wallClock } from '../time/zoned';

export interface ReminderInput {
  timeZone: string;
  now: Date | string;
  /** Local hour (0–23) from which the reminder may go out. */
  eveningHour: number;
  /** `dueLocalDate` from nextSessionDue. */
  nextDue: string | null;
  /** Sessions that started on the client's local today. */
  sessionsToday: number;
}

export function reminderDue({ timeZone, now, eveningHour, nextDue, sessionsToday }: ReminderInput): boolean {
  if (!Number.isInteger(eveningHour) || eveningHour < 0 || eveningHour > 23) {
    throw new Error(`eveningHour must be a whole hour from 0 to 23, got ${eveningHour}`);
  }
  const at = new Date(now);
  return nextDue === localDate(at, timeZone) && sessionsToday === 0 && wallClock(at, timeZone).hour >= eveningHour;
}
