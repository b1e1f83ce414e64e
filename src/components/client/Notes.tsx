import { useState, type FormEvent } from 'react';
import { api, ApiError, useApi } from '../api';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { TextAreaField } from '../ui/Field';
import { Loaded } from '../ui/Loading';
import { formatDateTime } from '../../lib/time/format';
import type { NoteView } from './types';

/** Dated notes by the clinic's staff, newest first, and a form to add one. */
export default function Notes({ clientId, locale, timeZone }: { clientId: string; locale: string; timeZone: string }) {
  const [notes, reload] = useApi<{ notes: NoteView[] }>(`/api/clients/${clientId}/notes`);
  const [body, setBody] = useState('');
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<ApiError | null>(null);
  const [saved, setSaved] = useState(false);

  async function submit(e: FormEvent) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    setSaved(false);
    try {
      await api('POST', `/api/clients/${clientId}/notes`, { body });
      setBody('');
      setSaved(true);
      reload();
    } catch (err) {
      setError(err as ApiError);
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="grid gap-4 lg:grid-cols-[2fr_3fr]">
      <form method="post" onSubmit={submit} noValidate className="card space-y-3 self-start">
        {saved && (
          <Alert tone="success" live>
            Note added.
          </Alert>
        )}
        <TextAreaField label="New note" value={body} onChange={(e) => setBody(e.target.value)} help="Seen by the clinic’s staff only, not by the client or carers." error={error ? (error.field('body') ?? error.message) : undefined} />
        <Button type="submit" busy={busy}>
          Add note
        </Button>
      </form>
      <Loaded value={notes} reload={reload} label="the notes">
        {({ notes }) =>
          notes.length ? (
            <ol className="space-y-3" aria-label="Notes, newest first">
              {notes.map((n) => (
                <li key={n.id} className="card">
                  <p className="text-sm text-ink-soft">
                    {n.author.name} · <time dateTime={n.createdAt}>{formatDateTime(n.createdAt, locale, timeZone, 'day')}</time>
                  </p>
                  <p className="mt-1 whitespace-pre-line">{n.body}</p>
                </li>
              ))}
            </ol>
          ) : (
            <p className="text-ink-soft">No notes yet.</p>
          )
        }
      </Loaded>
    </div>
  );
}
