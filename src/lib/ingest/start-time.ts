// Where a session's start comes from, and what the session page should say
// about it. Pure: the upload row's times are passed in.
import type { StartedAtSource } from '../db/tables';

/** A cycle whose clock runs a little fast is common; a start later than this past the upload is not a clock drift. */
export const FUTURE_START_TOLERANCE_MS = 60 * 60_000;

/** Does a ride start later than its upload allows (the cycle's clock is off)? The upload page passes "now". */
export function startsAfterUpload(startedAt: Date, uploadedAt: Date): boolean {
  return startedAt.getTime() > uploadedAt.getTime() + FUTURE_START_TOLERANCE_MS;
}

export interface StartTimeInput {
  /** The start the parser read from the file, ISO 8601, or null. */
  fileStartedAt: string | null;
  /** The file's last-modified time the upload page sent, if any. */
  fallbackStartedAt: Date | null;
  uploadedAt: Date;
  /** The client's zone, to name the start in the warning as the carer would read it on the cycle. */
  timeZone: string;
}

export function sessionStart(input: StartTimeInput): { startedAt: Date; source: StartedAtSource; warnings: string[] } {
  if (input.fileStartedAt) {
    const startedAt = new Date(input.fileStartedAt);
    const warnings = startsAfterUpload(startedAt, input.uploadedAt)
      ? [`The file says the ride started on ${localLabel(startedAt, input.timeZone)}, after the file was uploaded: check the date and time set on the cycle.`]
      : [];
    return { startedAt, source: 'file', warnings };
  }
  if (input.fallbackStartedAt) {
    return { startedAt: input.fallbackStartedAt, source: 'file_modified', warnings: ['The file has no start time; the session date is the file’s last-modified time.'] };
  }
  return { startedAt: input.uploadedAt, source: 'upload_time', warnings: ['The file has no start time; the session date is the time it was uploaded.'] };
}

const localLabel = (at: Date, timeZone: string) => new Intl.DateTimeFormat('en-GB', { timeZone, dateStyle: 'medium', timeStyle: 'short' }).format(at);
