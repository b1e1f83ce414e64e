import { useEffect, useId, useRef, useState, type FormEvent } from 'react';
import { flagReason } from '../../lib/flags/reason';
import { FLAG_KIND_WORDS } from '../../lib/flags/words';
import { formatDate } from '../../lib/time/format';
import { addDays, localDate } from '../../lib/time/local-date';
import { api, ApiError } from '../api';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { TextAreaField, TextField } from '../ui/Field';
import { SeverityChip } from './SeverityChip';
import type { FlagAction, FlagItem } from './types';

export interface ActionTarget {
  flag: FlagItem;
  clientName: string;
  /** The client's zone: snooze dates are their calendar days. */
  timeZone: string;
}

const CHOICES: { action: FlagAction; label: string; explain: string; confirm: string }[] = [
  {
    action: 'acknowledge',
    label: 'Acknowledge',
    explain: 'Records that you have seen the flag and takes it off triage. It stays on the client’s record, and comes back to triage if a new episode starts or it becomes more severe.',
    confirm: 'Acknowledge flag',
  },
  {
    action: 'snooze',
    label: 'Snooze',
    explain: 'Hides the flag from triage up to and including the date you choose. It stays open and comes back the day after.',
    confirm: 'Snooze flag',
  },
  {
    action: 'resolve',
    label: 'Resolve',
    explain: 'Closes the flag. If the same problem starts again later, Kinloop raises a new flag.',
    confirm: 'Resolve flag',
  },
];

/** The sentence announced once an action has been saved. */
export function doneMessage({ flag, clientName }: ActionTarget, action: FlagAction, locale: string, until?: string): string {
  const what = `${FLAG_KIND_WORDS[flag.kind]} for ${clientName}`;
  if (action === 'snooze') return `Snoozed: ${what}, until ${formatDate(until!, locale, 'dayLong')}. It has left the open list.`;
  return `${action === 'acknowledge' ? 'Acknowledged' : 'Resolved'}: ${what}. It has left the open list.`;
}

/**
 * A native modal dialog for one flag: acknowledge, snooze or resolve it, with
 * an optional note. The browser keeps focus inside and closes it on Escape;
 * the caller decides where focus goes afterwards.
 */
export function FlagActionDialog({
  target,
  locale,
  onDone,
  onCancel,
}: {
  target: ActionTarget | null;
  locale: string;
  onDone: (message: string) => void;
  onCancel: () => void;
}) {
  const dialog = useRef<HTMLDialogElement>(null);
  const form = useRef<HTMLFormElement>(null);
  const titleId = useId();
  const [action, setAction] = useState<FlagAction>('acknowledge');
  const [note, setNote] = useState('');
  const [until, setUntil] = useState('');
  const [error, setError] = useState<ApiError | null>(null);
  const [busy, setBusy] = useState(false);
  const finished = useRef(false);
  const today = target ? localDate(new Date(), target.timeZone) : '';

  useEffect(() => {
    const el = dialog.current;
    if (!el) return;
    if (!target) {
      if (el.open) el.close();
      return;
    }
    setAction('acknowledge');
    setNote('');
    setUntil(addDays(localDate(new Date(), target.timeZone), 7));
    setError(null);
    finished.current = false;
    if (!el.open) el.showModal();
    form.current?.querySelector<HTMLElement>('input:checked')?.focus();
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
      const body = { action, ...(note.trim() ? { note: note.trim() } : {}), ...(action === 'snooze' ? { until } : {}) };
      await api('POST', `/api/flags/${target.flag.id}`, body);
      finished.current = true;
      dialog.current?.close();
      onDone(doneMessage(target, action, locale, until));
    } catch (err) {
      setError(err as ApiError);
    } finally {
      setBusy(false);
    }
  }

  const chosen = CHOICES.find((c) => c.action === action)!;
  return (
    <dialog
      ref={dialog}
      aria-labelledby={titleId}
      onClose={onClose}
      className="m-auto w-[min(36rem,calc(100vw-1.5rem))] max-h-[calc(100dvh-1.5rem)] overflow-y-auto rounded-xl border border-line bg-surface p-0 text-ink shadow-xl backdrop:bg-ink/60"
    >
      {target && (
        <form ref={form} onSubmit={submit} className="space-y-4 p-5" noValidate>
          <h2 id={titleId} className="text-xl">
            {FLAG_KIND_WORDS[target.flag.kind]} for {target.clientName}
          </h2>
          <div className="space-y-1 rounded-lg bg-paper p-3">
            <SeverityChip severity={target.flag.severity} />
            <p>{flagReason(target.flag, locale)}</p>
          </div>
          <fieldset className="space-y-2">
            <legend className="font-semibold">What to do with this flag</legend>
            <div className="flex flex-wrap gap-2">
              {CHOICES.map((c) => (
                <label key={c.action} className="flex min-h-12 cursor-pointer items-center gap-2 rounded-lg border-2 border-line px-3 has-[:checked]:border-lagoon has-[:checked]:bg-lagoon-tint">
                  <input type="radio" name="action" value={c.action} checked={action === c.action} onChange={() => setAction(c.action)} className="h-5 w-5 accent-lagoon" />
                  {c.label}
                </label>
              ))}
            </div>
            <p className="text-ink-soft">{chosen.explain}</p>
          </fieldset>
          {error && !error.field('until') && (
            <Alert tone="danger" live>
              {error.message}
            </Alert>
          )}
          {action === 'snooze' && (
            <TextField label="Snooze until" type="date" name="until" min={addDays(today, 1)} value={until} onChange={(e) => setUntil(e.target.value)} error={error?.field('until')} />
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
              {chosen.confirm}
            </Button>
          </div>
        </form>
      )}
    </dialog>
  );
}
