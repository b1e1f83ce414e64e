import { startsAfterUpload } from '../../lib/ingest/start-time';
import { Button } from '../ui/Button';
import { duration, minutes, sessionDateTime, withUnit } from './format';
import type { SessionData, UploadOutcome, UploadStage } from './types';

export interface UploadEntry {
  key: string;
  file: File;
  clientName: string;
  timeZone: string;
  stage: UploadStage;
}

const kilobytes = (bytes: number) => `${Math.max(1, Math.round(bytes / 1024)).toLocaleString()} KB`;

/** The sentence a screen reader hears when a file's outcome arrives. */
export function outcomeSentence(entry: UploadEntry, outcome: UploadOutcome): string {
  const name = entry.file.name;
  switch (outcome.kind) {
    case 'accepted':
      return outcome.session
        ? `${name} accepted: session of ${sessionDateTime(outcome.session.startedAt, undefined, entry.timeZone)}, ${duration(outcome.session.summary.durationS)}.`
        : `${name} accepted.`;
    case 'duplicate':
      return outcome.session
        ? `${name} is already in Kinloop as the session of ${sessionDateTime(outcome.session.startedAt, undefined, entry.timeZone)}.`
        : `${name} is already in Kinloop.`;
    case 'refused':
      return `${name} refused${outcome.error.line ? ` at line ${outcome.error.line}` : ''}: ${outcome.error.message}`;
    case 'unread':
      return `${name} could not be read: ${outcome.error.message}`;
    case 'failed':
      return `${name} was not uploaded: ${outcome.message}`;
  }
}

function SessionFacts({ session }: { session: SessionData }) {
  const s = session.summary;
  return (
    <dl className="mt-2 grid grid-cols-2 gap-x-4 gap-y-1 sm:grid-cols-3">
      <div>
        <dt className="text-sm text-ink-soft">Duration</dt>
        <dd className="font-semibold">{duration(s.durationS)}</dd>
      </div>
      <div>
        <dt className="text-sm text-ink-soft">Active</dt>
        <dd className="font-semibold">{minutes(s.activeS)}</dd>
      </div>
      <div>
        <dt className="text-sm text-ink-soft">Mean power</dt>
        <dd className="font-semibold">{withUnit(s.meanPowerW, 1, 'W')}</dd>
      </div>
    </dl>
  );
}

function SessionLink({ id, children }: { id: string; children: string }) {
  return (
    <a href={`/sessions/${id}`} className="mt-3 inline-flex min-h-12 items-center rounded-lg border-2 border-lagoon px-4 font-semibold no-underline hover:bg-lagoon-tint">
      {children}
    </a>
  );
}

function Outcome({ entry, outcome }: { entry: UploadEntry; outcome: UploadOutcome }) {
  switch (outcome.kind) {
    case 'accepted': {
      const session = outcome.session;
      return (
        <div>
          <p className="font-semibold text-moss">
            Accepted
            {session && <span className="font-normal text-ink">: session of {sessionDateTime(session.startedAt, undefined, entry.timeZone)}</span>}
          </p>
          {session?.startedAtSource === 'file_modified' && <p className="text-sm text-ink-soft">The file has no start time, so the date comes from when the file was last changed.</p>}
          {session?.startedAtSource === 'upload_time' && <p className="text-sm text-ink-soft">The file has no start time, so the date is when it was uploaded.</p>}
          {session?.startedAtSource === 'file' && startsAfterUpload(new Date(session.startedAt), new Date()) && (
            <p className="text-sm font-semibold text-brick">The file’s start time is later than now: check the date and time set on the cycle.</p>
          )}
          {session && <SessionFacts session={session} />}
          <SessionLink id={outcome.sessionId}>Open session</SessionLink>
        </div>
      );
    }
    case 'duplicate':
      return (
        <div>
          <p className="font-semibold text-slate">
            {outcome.session ? `Already in Kinloop as the session of ${sessionDateTime(outcome.session.startedAt, undefined, entry.timeZone)}` : 'Already in Kinloop'}
          </p>
          <p className="text-sm text-ink-soft">Nothing new was added, so the ride is not counted twice.</p>
          {outcome.sessionId && <SessionLink id={outcome.sessionId}>Open that session</SessionLink>}
        </div>
      );
    case 'refused':
      return (
        <div>
          <p className="font-semibold text-brick">
            Refused{outcome.error.line ? ` · line ${outcome.error.line}` : ''}
          </p>
          <p>{outcome.error.message}</p>
        </div>
      );
    case 'unread':
      return (
        <div>
          <p className="font-semibold text-brick">Could not be read</p>
          <p>{outcome.error.message}</p>
        </div>
      );
    case 'failed':
      return (
        <div>
          <p className="font-semibold text-brick">Not uploaded</p>
          <p>{outcome.message}</p>
        </div>
      );
  }
}

export function UploadItem({ entry, onRetry, onTryAgain }: { entry: UploadEntry; onRetry: (key: string) => void; onTryAgain: (key: string, uploadId: string) => void }) {
  const { stage, file } = entry;
  // The request's total includes the form around the file, so progress is measured against it.
  const percent = stage.stage === 'waiting' ? 0 : stage.stage === 'sending' ? (stage.total ? Math.min(100, Math.round((stage.loaded / stage.total) * 100)) : 0) : 100;
  const tone =
    stage.stage !== 'done'
      ? 'border-line'
      : stage.outcome.kind === 'accepted'
        ? 'border-moss'
        : stage.outcome.kind === 'duplicate'
          ? 'border-slate'
          : 'border-brick';
  return (
    <li className={`card border-l-8 ${tone}`} data-testid="upload-item" data-status={stage.stage === 'done' ? stage.outcome.kind : stage.stage}>
      <div className="flex flex-wrap items-baseline justify-between gap-x-4">
        <p className="font-semibold break-all">{file.name}</p>
        <p className="text-sm text-ink-soft">
          {kilobytes(file.size)} · for {entry.clientName}
        </p>
      </div>
      {stage.stage !== 'done' && (
        <div className="mt-2 space-y-1">
          <progress className="block h-3 w-full appearance-none overflow-hidden rounded-full bg-line [&::-moz-progress-bar]:bg-lagoon [&::-webkit-progress-bar]:bg-line [&::-webkit-progress-value]:bg-lagoon" max={100} value={percent} aria-label={`Upload of ${file.name}`} />
          <p className="text-sm text-ink-soft">
            {stage.stage === 'waiting' && 'Waiting to send…'}
            {stage.stage === 'sending' && `Sending… ${percent} %`}
            {stage.stage === 'reading' && 'Sent. Kinloop is reading the ride file; you may leave this page, the session will appear once it is read.'}
          </p>
        </div>
      )}
      {stage.stage === 'done' && (
        <div className="mt-2">
          <Outcome entry={entry} outcome={stage.outcome} />
          {stage.outcome.kind === 'failed' && (
            <Button variant="secondary" className="mt-3" onClick={() => onRetry(entry.key)}>
              Send {file.name} again
            </Button>
          )}
          {stage.outcome.kind === 'unread' && (
            <Button variant="secondary" className="mt-3" onClick={() => onTryAgain(entry.key, (stage.outcome as { uploadId: string }).uploadId)}>
              Try again to read {file.name}
            </Button>
          )}
        </div>
      )}
    </li>
  );
}
