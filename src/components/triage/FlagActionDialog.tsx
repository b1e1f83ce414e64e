import { useEffect, useId, useRef, useState, type FormEvent } from 'react';
import { api, ApiError } from '../api';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { TextAreaField, TextField } from '../ui/Field';
import { FLAG_KIND_WORDS } from '../../lib/flags/words';
import { localDateAfter, longDate } from './relative-time';
import { SeverityChip } from './SeverityChip';
import type { FlagAction, FlagItem } from './types';

export interface ActionTarget {
  flag: FlagItem;
  clientName: string;
  action: FlagAction;
}

const WORDING: Record<FlagAction, { title: string; explain: string; confirm: string }> = {
  acknowledge: {
    title: 'Acknowledge this flag',
    explain: 'Acknowledging records that you have seen the flag and takes it off triage. It stays on the client’s record, and comes back to triage if a new episode starts or it becomes more severe.',
    confirm: 'Acknowledge flag',
  },
  snooze: {
    title: 'Snooze this flag',
    explain: 'Snoozing hides the flag from triage up to and including the date you choose. It stays open and comes back the day after.',
    confirm: 'Snooze flag',
  },
  resolve: {
    title: 'Resolve this flag',
    explain: 'Resolving closes the flag. If the same problem starts again later, Kinloop raises a new flag.',
    confirm: 'Resolve flag',
  },
};

/** The sentence announced once an action has been saved. */
export function doneMessage({ flag, clientName, action }: ActionTarget, until?: string): string {
  const what = `${FLAG_KIND_WORDS[flag.kind]} for ${clientName}`;
  if (action === 'snooze') return `Snoozed: ${what}, until ${longDate(`${until}T12:00:00`)}. It has left the open list.`;
  return `${action === 'acknowledge' ? 'Acknowledged' : 'Resolved'}: ${what}. It has left the open list.`;
}

/**
 * A native modal dialog for acknowledging, snoozing or resolving one flag with
 * an optional note. The browser keeps focus inside and closes it on Escape;
 * the caller decides where focus goes afterwards.
 */
export function FlagActionDialog({
  target,
  onDone,
  onCancel,
}: {
  target: ActionTarget | null;
  onDone: (message: string) => void;
  onCancel: () => void;
}) {
  const dialog = useRef<HTMLDialogElement>(null);
  const form = useRef<HTMLFormElement>(null);
  const titleId = useId();
  const [note, setNote] = useState('');
  const [until, setUntil] = useState('');
  const [error, setError] = useState<ApiError | null>(null);
  const [busy, setBusy] = useState(false);
  const finished = useRef(false);

  useEffect(() => {
    const el = dialog.current;
    if (!el) return;
    if (!target) {
      if (el.open) el.close();
      return;
    }
    setNote('');
    setUntil(localDateAfter(new Date(), 7));
    setError(null);
    finished.current = false;
    if (!el.open) el.showModal();
    form.current?.querySelector<HTMLElement>('input, textarea')?.focus();
  }, [target]);

  function onClose() {
    if (!finished.current) onCancel();
  }

  async function submit(e: FormEvent) {
    e.preventDefault();
    if (!target) return;
    setBusy(true);
    setError(null);
    try {
      const body = { action: target.action, ...(note.trim() ? { note: note.trim() } : {}), ...(target.action === 'snooze' ? { until } : {}) };
      await api('POST', `/api/flags/${target.flag.id}`, body);
      finished.current = true;
      dialog.current?.close();
      onDone(doneMessage(target, until));
    } catch (err) {
      setError(err as ApiError);
    } finally {
      setBusy(false);
    }
  }

  const words = target ? WORDING[target.action] : null;
  return (
    <dialog
      ref={dialog}
      aria-labelledby={titleId}
      onClose={onClose}
      className="m-auto w-[min(36rem,calc(100vw-1.5rem))] max-h-[calc(100dvh-1.5rem)] overflow-y-auto rounded-xl border border-line bg-surface p-0 text-ink shadow-xl backdrop:bg-ink/60"
    >
      {target && words && (
        <form ref={form} onSubmit={submit} className="space-y-4 p-5" noValidate>
          <h2 id={titleId} className="text-xl">
            {words.title}
          </h2>
          <div className="space-y-1 rounded-lg bg-paper p-3">
            <p className="flex flex-wrap items-center gap-2">
              <SeverityChip severity={target.flag.severity} />
              <span className="font-semibold">
                {FLAG_KIND_WORDS[target.flag.kind]} · {target.clientName}
              </span>
            </p>
            <p>{target.flag.reason}</p>
          </div>
          <p className="text-ink-soft">{words.explain}</p>
          {error && !error.field('until') && (
            <Alert tone="danger" live>
              {error.message}
            </Alert>
          )}
          {target.action === 'snooze' && (
            <TextField
              label="Snooze until"
              type="date"
              name="until"
              min={localDateAfter(new Date(), 1)}
              value={until}
              onChange={(e) => setUntil(e.target.value)}
              error={error?.field('until')}
            />
          )}
          <TextAreaField
            label="Note"
            optional
            name="note"
            maxLength={2000}
            help="Saved with the flag’s history, for you and your colleagues."
            value={note}
            onChange={(e) => setNote(e.target.value)}
          />
          <div className="flex flex-wrap justify-end gap-2">
            <Button variant="secondary" onClick={() => dialog.current?.close()}>
              Cancel
            </Button>
            <Button type="submit" busy={busy}>
              {words.confirm}
            </Button>
          </div>
        </form>
      )}
    </dialog>
  );
}
