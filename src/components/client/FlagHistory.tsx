import { useState, type FormEvent } from 'react';
import { api, ApiError, useApi } from '../api';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { EmptyState } from '../ui/EmptyState';
import { TextAreaField, TextField } from '../ui/Field';
import { Loaded } from '../ui/Loading';
import { formatDate, formatDateTime } from '../../lib/time/format';
import { addDays } from '../../lib/time/local-date';
import { flagReason } from '../../lib/flags/reason';
import { FLAG_KIND_WORDS, FLAG_SEVERITY_WORDS } from '../../lib/flags/words';
import { eventLabel, isLive, SEVERITY_TONES, STATE_LABELS } from './flag-labels';
import type { FlagWithHistory } from './types';

type Action = 'acknowledge' | 'snooze' | 'resolve';
const DONE: Record<Action, string> = { acknowledge: 'Acknowledged.', snooze: 'Snoozed.', resolve: 'Resolved.' };

interface Shared {
  locale: string;
  timeZone: string;
  today: string;
}

/** The three actions; their visible words name the flag's kind, so a voice user can tell one flag's buttons from another's. */
function FlagActions({ flag, today, onDone }: { flag: FlagWithHistory; today: string; onDone: (message: string) => void }) {
  const kind = FLAG_KIND_WORDS[flag.kind].toLowerCase();
  const [note, setNote] = useState('');
  const [until, setUntil] = useState(addDays(today, 7));
  const [busy, setBusy] = useState<Action | null>(null);
  const [error, setError] = useState<ApiError | null>(null);

  async function act(action: Action) {
    setBusy(action);
    setError(null);
    try {
      await api('POST', `/api/flags/${flag.id}`, { action, ...(note.trim() ? { note } : {}), ...(action === 'snooze' ? { until } : {}) });
      onDone(`${FLAG_KIND_WORDS[flag.kind]}: ${DONE[action]}`);
    } catch (err) {
      setError(err as ApiError);
    } finally {
      setBusy(null);
    }
  }

  return (
    <form method="post" noValidate onSubmit={(e: FormEvent) => e.preventDefault()}>
      <fieldset className="space-y-3 rounded-lg border border-line p-4">
        <legend className="px-1 font-semibold">Act on the {kind} flag</legend>
        {error && (
          <Alert tone="danger" live>
            {error.message}
          </Alert>
        )}
        <TextAreaField label="Note" optional rows={2} className="field-input min-h-20" value={note} onChange={(e) => setNote(e.target.value)} help="Kept in the flag’s history, for example what you did or agreed with the client." error={error?.field('note')} />
        <div className="flex flex-wrap items-end gap-3">
          {flag.state === 'open' && (
            <Button busy={busy === 'acknowledge'} disabled={busy !== null} onClick={() => act('acknowledge')}>
              Acknowledge {kind}
            </Button>
          )}
          <Button variant={flag.state === 'open' ? 'secondary' : 'primary'} busy={busy === 'resolve'} disabled={busy !== null} onClick={() => act('resolve')}>
            Resolve {kind}
          </Button>
        </div>
        <div className="flex flex-wrap items-end gap-3">
          <div className="w-48">
            <TextField label="Snooze until" type="date" min={addDays(today, 1)} value={until} onChange={(e) => setUntil(e.target.value)} error={error?.field('until')} />
          </div>
          <Button variant="secondary" busy={busy === 'snooze'} disabled={busy !== null} onClick={() => act('snooze')}>
            Snooze {kind}
          </Button>
        </div>
      </fieldset>
    </form>
  );
}

function FlagCard({ flag, locale, timeZone, today, onDone }: Shared & { flag: FlagWithHistory; onDone: (message: string) => void }) {
  const snoozed = flag.snoozedUntil && flag.snoozedUntil > today && isLive(flag.state);
  return (
    <article aria-labelledby={`flag-${flag.id}`} className="card space-y-3">
      <div className="flex flex-wrap items-center gap-2">
        <h3 id={`flag-${flag.id}`} className="mr-2 text-lg">
          {FLAG_KIND_WORDS[flag.kind]}
        </h3>
        <span className={`rounded-full border px-3 py-0.5 text-sm font-semibold ${SEVERITY_TONES[flag.severity]}`}>{FLAG_SEVERITY_WORDS[flag.severity]}</span>
        <span className="rounded-full border border-line-strong bg-surface px-3 py-0.5 text-sm font-semibold">{STATE_LABELS[flag.state]}</span>
        {snoozed && <span className="rounded-full border border-slate bg-slate-tint px-3 py-0.5 text-sm font-semibold text-slate">Snoozed until {formatDate(flag.snoozedUntil!, locale, 'day')}</span>}
      </div>
      <p>{flagReason(flag, locale)}</p>
      <p className="text-sm text-ink-soft">
        Raised {formatDateTime(flag.raisedAt, locale, timeZone, 'day')}
        {flag.clearedAt && `; the condition cleared ${formatDateTime(flag.clearedAt, locale, timeZone, 'day')}`}
      </p>
      {flag.history.length > 0 && (
        <details>
          <summary className="inline-flex min-h-12 cursor-pointer items-center font-medium text-lagoon-dark">History ({flag.history.length})</summary>
          <ol className="mt-2 space-y-2 border-l-2 border-line pl-4">
            {flag.history.map((h, i) => (
              <li key={i}>
                <span className="font-medium">{eventLabel(h.action)}</span>
                {h.action === 'snoozed' && typeof h.detail?.until === 'string' && ` until ${formatDate(h.detail.until, locale, 'day')}`}
                <span className="text-ink-soft">
                  {' '}
                  {/* One raise time per flag: the history's "Raised" is the flag's own. */}
                  · {formatDateTime(h.action === 'raised' ? flag.raisedAt : h.at, locale, timeZone, 'day')} · {h.by?.name ?? 'Kinloop'}
                </span>
                {h.note && <p className="mt-1 whitespace-pre-line">“{h.note}”</p>}
              </li>
            ))}
          </ol>
        </details>
      )}
      {isLive(flag.state) && <FlagActions flag={flag} today={today} onDone={onDone} />}
    </article>
  );
}

/** The client's flags: live ones with their actions, then the closed ones, each with its history. */
export default function FlagHistory({ clientId, locale, timeZone, today }: Shared & { clientId: string }) {
  const [flags, reload] = useApi<{ flags: FlagWithHistory[] }>(`/api/clients/${clientId}/flags`);
  const [done, setDone] = useState<string | null>(null);
  const onDone = (message: string) => {
    setDone(message);
    reload();
  };
  return (
    <Loaded value={flags} reload={reload} label="the flags">
      {({ flags }) => {
        const live = flags.filter((f) => isLive(f.state));
        const closed = flags.filter((f) => !isLive(f.state));
        return (
          <div className="space-y-4">
            {done && (
              <Alert tone="success" live>
                {done}
              </Alert>
            )}
            {live.length ? (
              live.map((f) => <FlagCard key={f.id} flag={f} locale={locale} timeZone={timeZone} today={today} onDone={onDone} />)
            ) : (
              <EmptyState title="No open flags">Nothing in this client’s sessions or checks needs a look at the moment.</EmptyState>
            )}
            {closed.length > 0 && (
              <details className="card">
                <summary className="inline-flex min-h-12 cursor-pointer items-center font-semibold">Earlier flags ({closed.length})</summary>
                <div className="mt-3 space-y-3">
                  {closed.map((f) => (
                    <FlagCard key={f.id} flag={f} locale={locale} timeZone={timeZone} today={today} onDone={onDone} />
                  ))}
                </div>
              </details>
            )}
          </div>
        );
      }}
    </Loaded>
  );
}
