import { describe, expect, it } from 'vitest';
import { sessionStart, startsAfterUpload } from '../../../src/lib/ingest/start-time';

const uploadedAt = new Date('2026-10-06T12:00:00Z');
const base = { fallbackStartedAt: null, uploadedAt, timeZone: 'Europe/London' };

describe('a session’s start', () => {
  it('takes the file’s own start without a warning when it is before the upload', () => {
    const s = sessionStart({ ...base, fileStartedAt: '2026-10-05T08:30:00.000Z', fallbackStartedAt: new Date('2026-10-05T09:00:00Z') });
    expect(s).toEqual({ startedAt: new Date('2026-10-05T08:30:00Z'), source: 'file', warnings: [] });
  });

  // source: DEVELOPERS.md, "Ride files in" — a start more than an hour after the upload is kept with a warning.
  it('keeps a start up to an hour past the upload (a fast cycle clock) without a warning', () => {
    expect(sessionStart({ ...base, fileStartedAt: '2026-10-06T12:59:00.000Z' }).warnings).toEqual([]);
    expect(sessionStart({ ...base, fileStartedAt: '2026-10-06T13:00:00.000Z' }).warnings).toEqual([]);
    expect(startsAfterUpload(new Date('2026-10-06T13:00:00Z'), uploadedAt)).toBe(false);
  });

  it('warns about a start a minute later than that', () => {
    const s = sessionStart({ ...base, fileStartedAt: '2026-10-06T13:01:00.000Z' });
    expect(s.startedAt.toISOString()).toBe('2026-10-06T13:01:00.000Z');
    // from memory: en-GB medium date and short time, as ICU writes them ("6 Oct 2026, 14:01"); London is on BST (UTC+1) until 25 October 2026.
    expect(s.warnings).toEqual(['The file says the ride started on 6 Oct 2026, 14:01, after the file was uploaded: check the date and time set on the cycle.']);
    expect(startsAfterUpload(new Date('2026-10-06T13:01:00Z'), uploadedAt)).toBe(true);
  });

  it('keeps a start much later than that but says so, in the client’s local time, and asks for the cycle’s clock to be checked', () => {
    const s = sessionStart({ ...base, fileStartedAt: '2026-12-31T23:58:00.000Z' });
    expect(s.startedAt.toISOString()).toBe('2026-12-31T23:58:00.000Z');
    expect(s.source).toBe('file');
    // London is on GMT in December: the local time is the UTC time.
    expect(s.warnings).toEqual(['The file says the ride started on 31 Dec 2026, 23:58, after the file was uploaded: check the date and time set on the cycle.']);
    // from memory: Auckland is on NZDT (UTC+13) in summer, so 23:58 UTC is 12:58 the next day.
    const auckland = sessionStart({ ...base, timeZone: 'Pacific/Auckland', fileStartedAt: '2026-12-31T23:58:00.000Z' });
    expect(auckland.warnings[0]).toContain('1 Jan 2027, 12:58');
  });

  it('falls back to the file’s last-modified time, then to the upload time, with a warning either way', () => {
    const modified = new Date('2026-10-04T17:00:00Z');
    expect(sessionStart({ ...base, fileStartedAt: null, fallbackStartedAt: modified })).toMatchObject({ startedAt: modified, source: 'file_modified', warnings: [expect.stringMatching(/last-modified/)] });
    expect(sessionStart({ ...base, fileStartedAt: null })).toMatchObject({ startedAt: uploadedAt, source: 'upload_time', warnings: [expect.stringMatching(/uploaded/)] });
  });
});
