import type { readSession } from '../../lib/sessions/read';

/** GET /api/sessions/:id as the browser receives it. */
export type SessionData = Awaited<ReturnType<typeof readSession>>;
export type SessionSummary = SessionData['summary'];
export type ChartSeries = NonNullable<SessionData['series']>;
export type Point = [number, number];

export interface RideError {
  code: string;
  message: string;
  line?: number;
}

/** One file of POST /api/uploads's answer. */
export interface UploadFileResult {
  name: string;
  uploadId: string;
  status: 'queued' | 'accepted' | 'duplicate' | 'rejected' | 'failed';
  sessionId?: string;
  duplicateOf?: string | null;
  error?: RideError;
}

/** What a file's row shows once Kinloop has answered for it. */
export type UploadOutcome =
  | { kind: 'accepted'; sessionId: string; session: SessionData | null }
  | { kind: 'duplicate'; sessionId: string | null; session: SessionData | null }
  | { kind: 'refused'; error: RideError }
  /** Stored, but Kinloop could not read it on any try: it can be tried again. */
  | { kind: 'unread'; uploadId: string; error: RideError }
  /** Not stored: the request did not get through. */
  | { kind: 'failed'; message: string };

export type UploadStage =
  | { stage: 'waiting' }
  | { stage: 'sending'; loaded: number; total: number }
  | { stage: 'reading' }
  | { stage: 'done'; outcome: UploadOutcome };

/** One row of GET /api/uploads?clientId=…, newest first. */
export interface UploadListItem {
  id: string;
  name: string;
  byteSize: number;
  status: UploadFileResult['status'];
  sessionId: string | null;
  duplicateOf: string | null;
  error: RideError | null;
  uploadedAt: string;
  processedAt: string | null;
  canTryAgain: boolean;
}
