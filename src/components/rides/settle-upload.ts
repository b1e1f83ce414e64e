// From a per-file answer to what its row shows: a queued file is asked after
// once a second until the worker has read it (however long that takes), then
// the session's figures are fetched for an accepted file or a duplicate.
import { api, ApiError } from '../api';
import type { RideError, SessionData, UploadFileResult, UploadOutcome } from './types';

const POLL_MS = 1000;

interface UploadView {
  status: UploadFileResult['status'];
  sessionId: string | null;
  duplicateOf: string | null;
  error: RideError | null;
}

async function untilRead(result: UploadFileResult): Promise<UploadFileResult> {
  let current = result;
  while (current.status === 'queued') {
    await new Promise((r) => setTimeout(r, POLL_MS));
    try {
      const u = await api<UploadView>('GET', `/api/uploads/${result.uploadId}`);
      current = { ...current, status: u.status, sessionId: u.sessionId ?? undefined, duplicateOf: u.duplicateOf, error: u.error ?? undefined };
    } catch (err) {
      // A dropped connection is not an answer about the file; keep asking.
      if (!(err instanceof ApiError) || err.status !== 0) throw err;
    }
  }
  return current;
}

async function sessionOrNull(id: string): Promise<SessionData | null> {
  // Ten points are the fewest the API sends: the row needs the summary, not the series.
  return api<SessionData>('GET', `/api/sessions/${id}?points=10`).catch(() => null);
}

export async function settleUpload(result: UploadFileResult): Promise<UploadOutcome> {
  let final: UploadFileResult;
  try {
    final = await untilRead(result);
  } catch (err) {
    return { kind: 'failed', message: (err as Error).message };
  }
  switch (final.status) {
    case 'accepted':
      return { kind: 'accepted', sessionId: final.sessionId!, session: await sessionOrNull(final.sessionId!) };
    case 'failed':
      return { kind: 'unread', uploadId: final.uploadId, error: final.error ?? { code: 'read_failed', message: 'Kinloop could not read this file.' } };
    case 'duplicate':
      return { kind: 'duplicate', sessionId: final.duplicateOf ?? null, session: final.duplicateOf ? await sessionOrNull(final.duplicateOf) : null };
    default:
      return { kind: 'refused', error: final.error ?? { code: 'refused', message: 'Kinloop could not read this file.' } };
  }
}
