import { useState, type FormEvent } from 'react';
import { api, ApiError, useApi } from '../api';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { TextField } from '../ui/Field';
import { Loaded } from '../ui/Loading';
import { announceProgramChange } from './changes';
import { formatDate } from '../../lib/time/format';
import { formErrorText } from './form-errors';
import type { PauseView } from './types';

const STATE_LABELS: Record<PauseView['state'], string> = { upcoming: 'Planned', active: 'Under way', ended: 'Ended', cancelled: 'Cancelled' };
const STATE_TONES: Record<PauseView['state'], string> = {
  upcoming: 'border-slate bg-slate-tint text-slate',
  active: 'border-ochre bg-ochre-tint text-ochre',
  ended: 'border-line-strong bg-surface text-ink-soft',
  cancelled: 'border-line-strong bg-surface text-ink-soft',
};

function PauseItem({ pause, clientId, locale, manage, onChanged }: { pause: PauseView; clientId: string; locale: string; manage: boolean; onChanged: (message: string) => void }) {
  const [confirming, setConfirming] = useState(false);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<ApiError | null>(null);
  const range = `${formatDate(pause.from, locale, 'day')} to ${formatDate(pause.to, locale, 'day')}`;
  const live = pause.state === 'active' || pause.state === 'upcoming';

  async function end() {
    setBusy(true);
    setError(null);
    try {
      await api('POST', `/api/clients/${clientId}/pauses/${pause.id}/end`);
      onChanged(pause.state === 'upcoming' ? `The pause from ${range} is cancelled.` : 'The pause has ended; from today sessions count again.');
    } catch (err) {
      setError(err as ApiError);
      setBusy(false);
    }
  }

  return (
    <li className="card space-y-2">
      <div className="flex flex-wrap items-center gap-2">
        <p className="mr-2 font-semibold">{range}</p>
        <span className={`rounded-full border px-3 py-0.5 text-sm font-semibold ${STATE_TONES[pause.state]}`}>{STATE_LABELS[pause.state]}</span>
      </div>
      <p>{pause.reason}</p>
      {error && (
        <Alert tone="danger" live>
          {error.message}
        </Alert>
      )}
      {manage && live && !confirming && (
        <Button variant="secondary" onClick={() => setConfirming(true)}>
          {pause.state === 'upcoming' ? 'Cancel pause' : 'End pause'}
          <span className="sr-only"> of {range}</span>
        </Button>
      )}
      {manage && live && confirming && (
        <div className="space-y-2 rounded-lg bg-paper p-3" role="group" aria-label="Confirm">
          <p>{pause.state === 'upcoming' ? 'Cancel this pause? It will not start.' : 'End this pause? It ends yesterday, so today’s sessions count again.'}</p>
          <div className="flex flex-wrap gap-3">
            <Button busy={busy} onClick={end}>
              {pause.state === 'upcoming' ? 'Yes, cancel it' : 'Yes, end it'}
            </Button>
            <Button variant="quiet" onClick={() => setConfirming(false)}>
              Keep it
            </Button>
          </div>
        </div>
      )}
    </li>
  );
}

/** Pauses of the program (illness, hospital stay, holiday): staff add and end them; everyone who reads the client sees them. */
export default function Pauses({ clientId, locale, today, manage }: { clientId: string; locale: string; today: string; manage: boolean }) {
  const [pauses, reload] = useApi<{ pauses: PauseView[] }>(`/api/clients/${clientId}/pauses`);
  const [from, setFrom] = useState(today);
  const [to, setTo] = useState('');
  const [reason, setReason] = useState('');
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<ApiError | null>(null);
  const [message, setMessage] = useState<string | null>(null);

  const changed = (text: string) => {
    setMessage(text);
    reload();
    announceProgramChange();
  };

  async function submit(e: FormEvent) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    setMessage(null);
    try {
      const created = await api<PauseView>('POST', `/api/clients/${clientId}/pauses`, { from, to, reason });
      setTo('');
      setReason('');
      changed(`Pause added: ${formatDate(created.from, locale, 'day')} to ${formatDate(created.to, locale, 'day')}.`);
    } catch (err) {
      setError(err as ApiError);
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className={manage ? 'grid gap-4 lg:grid-cols-[2fr_3fr]' : ''}>
      {manage && (
        <form method="post" onSubmit={submit} noValidate className="card space-y-4 self-start">
          <h3 className="text-lg">Add a pause</h3>
          <p className="text-sm text-ink-soft">Days in a pause raise no flags and do not break the streak. A week with a paused day is neither met nor missed.</p>
          {error && (
            <Alert tone="danger" live>
              {formErrorText(error, (path) => ['from', 'to', 'reason'].includes(path))}
            </Alert>
          )}
          <div className="grid gap-4 sm:grid-cols-2">
            <TextField label="From" type="date" value={from} onChange={(e) => setFrom(e.target.value)} help="The first paused day." error={error?.field('from')} />
            <TextField label="To" type="date" min={from} value={to} onChange={(e) => setTo(e.target.value)} help="The last paused day." error={error?.field('to')} />
          </div>
          <TextField label="Reason" value={reason} maxLength={200} onChange={(e) => setReason(e.target.value)} help="For example: hospital stay, holiday, cycle away for repair." error={error?.field('reason')} />
          <Button type="submit" busy={busy}>
            Add pause
          </Button>
        </form>
      )}
      <div className="space-y-3">
        {message && (
          <Alert tone="success" live>
            {message}
          </Alert>
        )}
        <Loaded value={pauses} reload={reload} label="the pauses">
          {({ pauses }) =>
            pauses.length ? (
              <ul className="space-y-3" aria-label="Pauses, latest first">
                {pauses.map((p) => (
                  <PauseItem key={p.id} pause={p} clientId={clientId} locale={locale} manage={manage} onChanged={changed} />
                ))}
              </ul>
            ) : (
              <p className="text-ink-soft">No pauses so far.</p>
            )
          }
        </Loaded>
      </div>
    </div>
  );
}
