import { useEffect, useId, useRef, useState } from 'react';
import { api, ApiError, useApi } from '../api';
import { Button } from '../ui/Button';
import { sessionDateTime } from './format';
import type { UploadListItem } from './types';

// Enough to see the last fortnight of rides and what became of each file.
const SHOWN = 20;
const POLL_MS = 3000;

const STATUS: Record<UploadListItem['status'], { label: string; tone: string }> = {
  queued: { label: 'Waiting to be read', tone: 'border-line' },
  accepted: { label: 'Read', tone: 'border-moss' },
  duplicate: { label: 'Already in Kinloop', tone: 'border-slate' },
  rejected: { label: 'Refused', tone: 'border-brick' },
  failed: { label: 'Could not be read', tone: 'border-brick' },
};

/**
 * The client's most recent uploads, whoever sent them, with what became of
 * each: a file that could not be read can be tried again from here by the
 * person who sent it and by the clinic.
 */
export function RecentUploads({ clientId, clientName, timeZone, refresh }: { clientId: string; clientName: string; timeZone: string; refresh: number }) {
  const [list, reload] = useApi<{ uploads: UploadListItem[] }>(`/api/uploads?clientId=${clientId}`);
  const [problem, setProblem] = useState<string | null>(null);
  const statusRefs = useRef(new Map<string, HTMLParagraphElement>());
  // Files sent back to be read, shown as waiting until the list says otherwise.
  const [retried, setRetried] = useState<ReadonlySet<string>>(new Set());
  const heading = useId();

  useEffect(reload, [refresh, reload]);
  const uploads = (list.state === 'ready' ? list.data.uploads.slice(0, SHOWN) : []).map((u) =>
    retried.has(u.id) && u.status === 'failed' ? { ...u, status: 'queued' as const, error: null, canTryAgain: false } : u,
  );
  const waiting = uploads.some((u) => u.status === 'queued');
  useEffect(() => {
    if (!waiting) return;
    const timer = setInterval(reload, POLL_MS);
    return () => clearInterval(timer);
  }, [waiting, reload]);

  async function tryAgain(upload: UploadListItem) {
    setProblem(null);
    try {
      await api('POST', `/api/uploads/${upload.id}/reprocess`);
      setRetried((s) => new Set(s).add(upload.id));
      // The button goes away with the failure: focus moves to the file's new state instead of falling back to the page.
      statusRefs.current.get(upload.id)?.focus();
      reload();
    } catch (err) {
      setProblem(err instanceof ApiError ? err.message : 'Kinloop could not be reached. Try again in a moment.');
    }
  }

  if (list.state !== 'ready' || uploads.length === 0) return null;
  return (
    <section aria-labelledby={heading} className="space-y-3">
      <h2 id={heading} className="text-xl">
        Recent files for {clientName}
      </h2>
      {problem && (
        <p role="alert" className="font-semibold text-brick">
          {problem}
        </p>
      )}
      <ul className="space-y-3">
        {uploads.map((u) => {
          const status = STATUS[u.status];
          const session = u.status === 'accepted' ? u.sessionId : u.status === 'duplicate' ? u.duplicateOf : null;
          return (
            <li key={u.id} className={`card border-l-8 ${status.tone}`} data-testid="recent-upload" data-status={u.status}>
              <div className="flex flex-wrap items-baseline justify-between gap-x-4">
                <p className="font-semibold break-all">{u.name}</p>
                <p className="text-sm text-ink-soft">sent {sessionDateTime(u.uploadedAt, undefined, timeZone)}</p>
              </div>
              <p
                tabIndex={-1}
                data-role="upload-status"
                ref={(el) => {
                  if (el) statusRefs.current.set(u.id, el);
                  else statusRefs.current.delete(u.id);
                }}
                className={`mt-1 font-semibold ${u.status === 'rejected' || u.status === 'failed' ? 'text-brick' : u.status === 'accepted' ? 'text-moss' : 'text-ink'}`}
              >
                {status.label}
                {u.status === 'rejected' && u.error?.line ? ` · line ${u.error.line}` : ''}
              </p>
              {(u.status === 'rejected' || u.status === 'failed') && u.error && <p>{u.error.message}</p>}
              {session && (
                <a href={`/sessions/${session}`} aria-label={`Open the session of ${u.name}`} className="mt-2 inline-flex min-h-12 items-center font-semibold">
                  Open the session
                </a>
              )}
              {u.canTryAgain && (
                <Button variant="secondary" className="mt-3" aria-label={`Try again: read ${u.name}`} onClick={() => void tryAgain(u)}>
                  Try again
                </Button>
              )}
            </li>
          );
        })}
      </ul>
    </section>
  );
}
