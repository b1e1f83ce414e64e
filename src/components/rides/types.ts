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
  status: 'queued' | 'accepted' | 'duplicate' | 'rejected';
  sessionId?: string;
  duplicateOf?: string | null;
  error?: RideError;
}

/** What a file's row shows once Kinloop has answered for it. */
export type UploadOutcome =
  | { kind: 'accepted'; sessionId: string; session: SessionData | null }
  | { kind: 'duplicate'; sessionId: string | null; session: SessionData | null }
  | { kind: 'refused'; error: RideError }
  | { kind: 'failed'; message: string };

export type UploadStage =
  | { stage: 'waiting' }
  | { stage: 'sending'; loaded: number; total: number }
  | { stage: 'reading' }
  | { stage: 'done'; outcome: UploadOutcome };
