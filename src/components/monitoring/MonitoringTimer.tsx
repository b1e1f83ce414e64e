import { useCallback, useEffect, useId, useRef, useState, type FormEvent } from 'react';
import type { MonitoringActivity } from '../../lib/db/tables';
import { ACTIVITY_WORDS, MONITORING_ACTIVITIES, minutesText, type DataPeriod, type Totals } from '../../lib/monitoring/periods';
import { api, ApiError, useApi } from '../api';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { SelectField, TextAreaField, TextField } from '../ui/Field';
import { Loaded } from '../ui/Loading';

interface Entry {
  id: string;
  staff: { name: string | null };
  activity: MonitoringActivity;
  source: 'timer' | 'manual';
  startedAt: string;
  seconds: number;
  note: string | null;
}
interface MonthData {
  month: string;
  timeZone: string;
  entries: Entry[];
  totals: Totals;
  dataPeriods: DataPeriod[];
}

/** Less than this on the page is not offered for recording when leaving. */
const OFFER_FROM_S = 60;
const storageKey = (clientId: string) => `kinloop.monitoring.${clientId}`;

interface Pending {
  seconds: number;
  startedAt: string;
}
type Ask = { why: 'stop' | 'leave' | 'earlier'; seconds: number; startedAt: string; href?: string };

const activityOptions = MONITORING_ACTIVITIES.map((a) => ({ value: a, label: ACTIVITY_WORDS[a] }));

/**
 * Time spent on a client, for funders that pay for monitoring by documented
 * minutes: a timer that runs while this page is open and visible, offered for
 * recording (or discarding) when the therapist leaves, and entry by hand.
 * Self-contained, so the client page only has to include it.
 */
export default function MonitoringTimer({ clientId, clientName, locale }: { clientId: string; clientName: string; locale: string }) {
  const [seconds, setSeconds] = useState(0);
  const startedAt = useRef(new Date().toISOString());
  const leaving = useRef(false);
  const [ask, setAsk] = useState<Ask | null>(null);
  const [earlier, setEarlier] = useState<Pending | null>(null);
  const [message, setMessage] = useState<string | null>(null);
  const [month, reload] = useApi<MonthData>(`/api/clients/${clientId}/monitoring`);
  const secondsRef = useRef(0);
  secondsRef.current = seconds;

  // Counts only while the page is visible: a tab left in the background is not time spent.
  useEffect(() => {
    const tick = setInterval(() => {
      if (document.visibilityState === 'visible') setSeconds((s) => s + 1);
    }, 1000);
    return () => clearInterval(tick);
  }, []);

  // Time from a visit that ended without an answer (reload, closed tab, the back button).
  useEffect(() => {
    const raw = sessionStorage.getItem(storageKey(clientId));
    if (!raw) return;
    sessionStorage.removeItem(storageKey(clientId));
    try {
      const p = JSON.parse(raw) as Pending;
      if (p.seconds >= OFFER_FROM_S) setEarlier(p);
    } catch {
      // A value that is not ours: nothing to offer.
    }
  }, [clientId]);

  useEffect(() => {
    const keep = () => {
      if (leaving.current || secondsRef.current < OFFER_FROM_S) return;
      sessionStorage.setItem(storageKey(clientId), JSON.stringify({ seconds: secondsRef.current, startedAt: startedAt.current }));
    };
    const onClick = (e: MouseEvent) => {
      if (leaving.current || secondsRef.current < OFFER_FROM_S || e.defaultPrevented || e.button !== 0 || e.metaKey || e.ctrlKey || e.shiftKey || e.altKey) return;
      const link = (e.target as Element | null)?.closest?.('a[href]') as HTMLAnchorElement | null;
      if (!link || link.target === '_blank' || link.hasAttribute('download')) return;
      const to = new URL(link.href, window.location.href);
      if (to.origin !== window.location.origin || (to.pathname === window.location.pathname && to.search === window.location.search)) return;
      e.preventDefault();
      setAsk({ why: 'leave', seconds: secondsRef.current, startedAt: startedAt.current, href: to.href });
    };
    window.addEventListener('pagehide', keep);
    document.addEventListener('click', onClick, true);
    return () => {
      window.removeEventListener('pagehide', keep);
      document.removeEventListener('click', onClick, true);
    };
  }, [clientId]);

  const restart = useCallback(() => {
    setSeconds(0);
    startedAt.current = new Date().toISOString();
  }, []);

  function finished(result: 'recorded' | 'discarded', a: Ask, recordedSeconds?: number) {
    if (a.why === 'leave' && a.href) {
      leaving.current = true;
      window.location.assign(a.href);
      return;
    }
    if (a.why === 'earlier') setEarlier(null);
    else restart();
    setMessage(result === 'recorded' ? `Recorded ${minutesText(recordedSeconds ?? a.seconds)} for ${clientName}.` : 'The time was discarded; nothing was recorded.');
    if (result === 'recorded') reload();
  }

  return (
    <section aria-labelledby="monitoring-h" className="card space-y-4" data-testid="monitoring-timer">
      <div className="flex flex-wrap items-baseline justify-between gap-x-6 gap-y-2">
        <h2 id="monitoring-h" className="text-xl">
          Monitoring time
        </h2>
        <p role="timer" className="font-medium tabular-nums">
          On this page: {minutesText(seconds)}
        </p>
      </div>
      <p className="text-sm text-ink-soft">
        The timer runs while this page is open and in view. When you leave after a minute or more, Kinloop asks whether to record the time. Kinloop records and totals
        minutes; whether they can be billed is for your local billing rules.
      </p>
      {message && (
        <Alert tone="success" live>
          {message}
        </Alert>
      )}
      {earlier && (
        <Alert tone="caution" title={`${minutesText(earlier.seconds)} from your last visit to this page were not recorded`}>
          <div className="mt-2 flex flex-wrap gap-2">
            <Button onClick={() => setAsk({ why: 'earlier', ...earlier })}>Record that time</Button>
            <Button variant="secondary" onClick={() => finished('discarded', { why: 'earlier', ...earlier })}>
              Discard it
            </Button>
          </div>
        </Alert>
      )}
      <div className="flex flex-wrap gap-2">
        <Button onClick={() => setAsk({ why: 'stop', seconds: Math.max(seconds, 60), startedAt: startedAt.current })}>Record time now</Button>
        <Button variant="secondary" onClick={restart}>
          Reset the timer
        </Button>
      </div>
      <RecordDialog clientId={clientId} ask={ask} onClose={() => setAsk(null)} onDone={finished} />
      <ManualEntry clientId={clientId} onSaved={(s) => { setMessage(`Recorded ${minutesText(s)} for ${clientName}.`); reload(); }} />
      <Loaded value={month} reload={reload} label="this month’s time">{(data) => <ThisMonth data={data} locale={locale} />}</Loaded>
    </section>
  );
}

function RecordDialog({ clientId, ask, onClose, onDone }: { clientId: string; ask: Ask | null; onClose: () => void; onDone: (r: 'recorded' | 'discarded', a: Ask, seconds?: number) => void }) {
  const dialog = useRef<HTMLDialogElement>(null);
  const form = useRef<HTMLFormElement>(null);
  const titleId = useId();
  const [minutes, setMinutes] = useState('');
  const [activity, setActivity] = useState<MonitoringActivity>('review');
  const [note, setNote] = useState('');
  const [error, setError] = useState<ApiError | null>(null);
  const [busy, setBusy] = useState(false);

  useEffect(() => {
    const el = dialog.current;
    if (!el) return;
    if (!ask) {
      if (el.open) el.close();
      return;
    }
    setMinutes(String(Math.max(1, Math.round(ask.seconds / 60))));
    setNote('');
    setError(null);
    if (!el.open) el.showModal();
    form.current?.querySelector<HTMLElement>('input')?.focus();
  }, [ask]);

  async function submit(e: FormEvent) {
    e.preventDefault();
    if (!ask) return;
    setBusy(true);
    setError(null);
    try {
      const seconds = Math.round(Number(minutes.replace(',', '.')) * 60);
      await api('POST', `/api/clients/${clientId}/monitoring`, { activity, seconds, startedAt: ask.startedAt, source: 'timer', ...(note.trim() ? { note: note.trim() } : {}) });
      const done = ask;
      dialog.current?.close();
      onDone('recorded', done, seconds);
    } catch (err) {
      setError(err as ApiError);
    } finally {
      setBusy(false);
    }
  }

  const leave = ask?.why === 'leave';
  return (
    <dialog
      ref={dialog}
      aria-labelledby={titleId}
      onClose={onClose}
      className="m-auto w-[min(34rem,calc(100vw-1.5rem))] max-h-[calc(100dvh-1.5rem)] overflow-y-auto rounded-xl border border-line bg-surface p-0 text-ink shadow-xl backdrop:bg-ink/60"
    >
      {ask && (
        <form ref={form} onSubmit={submit} className="space-y-4 p-5" noValidate>
          <h2 id={titleId} className="text-xl">
            {leave ? 'Record your time before you leave?' : 'Record monitoring time'}
          </h2>
          <p className="text-ink-soft">Timer: {minutesText(ask.seconds)}. Change the minutes if part of it was not spent on this client.</p>
          {error && !error.field('seconds') && (
            <Alert tone="danger" live>
              {error.message}
            </Alert>
          )}
          <TextField label="Minutes" inputMode="decimal" name="minutes" value={minutes} onChange={(e) => setMinutes(e.target.value)} error={error?.field('seconds')} />
          <SelectField label="Activity" name="activity" value={activity} onChange={(e) => setActivity(e.target.value as MonitoringActivity)} options={activityOptions} />
          <TextAreaField label="Note" optional name="note" maxLength={1000} value={note} onChange={(e) => setNote(e.target.value)} error={error?.field('note')} />
          <div className="flex flex-wrap justify-end gap-2">
            {leave ? (
              <>
                <Button variant="quiet" onClick={() => dialog.current?.close()}>
                  Stay on this page
                </Button>
                <Button variant="secondary" onClick={() => onDone('discarded', ask)}>
                  Discard and leave
                </Button>
              </>
            ) : (
              <Button variant="secondary" onClick={() => dialog.current?.close()}>
                Cancel
              </Button>
            )}
            {ask.why === 'earlier' && (
              <Button variant="secondary" onClick={() => { dialog.current?.close(); onDone('discarded', ask); }}>
                Discard
              </Button>
            )}
            <Button type="submit" busy={busy}>
              {leave ? 'Record and leave' : 'Record'}
            </Button>
          </div>
        </form>
      )}
    </dialog>
  );
}

/** "2026-12-02T09:30" in the browser's own zone, for a datetime-local field. */
function localInputValue(d: Date): string {
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())}T${pad(d.getHours())}:${pad(d.getMinutes())}`;
}

function ManualEntry({ clientId, onSaved }: { clientId: string; onSaved: (seconds: number) => void }) {
  const [when, setWhen] = useState(() => localInputValue(new Date(Date.now() - 30 * 60_000)));
  const [minutes, setMinutes] = useState('');
  const [activity, setActivity] = useState<MonitoringActivity>('phone_call');
  const [note, setNote] = useState('');
  const [error, setError] = useState<ApiError | null>(null);
  const [busy, setBusy] = useState(false);

  async function submit(e: FormEvent) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    try {
      const started = new Date(when);
      if (Number.isNaN(started.getTime())) throw new ApiError(400, { code: 'invalid_input', message: 'Started: choose a date and time.', fields: [{ path: 'startedAt', message: 'Choose a date and time.' }] });
      const seconds = Math.round(Number(minutes.replace(',', '.')) * 60);
      if (!Number.isFinite(seconds) || seconds < 1) throw new ApiError(400, { code: 'invalid_input', message: 'Minutes: enter how long it took.', fields: [{ path: 'seconds', message: 'Enter how long it took, in minutes.' }] });
      await api('POST', `/api/clients/${clientId}/monitoring`, { activity, seconds, startedAt: started.toISOString(), source: 'manual', ...(note.trim() ? { note: note.trim() } : {}) });
      setMinutes('');
      setNote('');
      onSaved(seconds);
    } catch (err) {
      setError(err as ApiError);
    } finally {
      setBusy(false);
    }
  }

  return (
    <details className="rounded-lg border border-line">
      <summary className="flex min-h-12 cursor-pointer items-center px-4 font-semibold text-lagoon-dark">Add time by hand</summary>
      <form onSubmit={submit} className="grid gap-4 p-4 sm:grid-cols-2" noValidate>
        {error && !error.field('seconds') && !error.field('startedAt') && (
          <div className="sm:col-span-2">
            <Alert tone="danger" live>
              {error.message}
            </Alert>
          </div>
        )}
        <TextField label="Started" type="datetime-local" value={when} onChange={(e) => setWhen(e.target.value)} error={error?.field('startedAt')} />
        <TextField label="Minutes" inputMode="decimal" value={minutes} onChange={(e) => setMinutes(e.target.value)} error={error?.field('seconds')} />
        <SelectField label="Activity" value={activity} onChange={(e) => setActivity(e.target.value as MonitoringActivity)} options={activityOptions} />
        <TextAreaField label="Note" optional maxLength={1000} value={note} onChange={(e) => setNote(e.target.value)} error={error?.field('note')} />
        <div className="sm:col-span-2">
          <Button type="submit" busy={busy}>
            Add the time
          </Button>
        </div>
      </form>
    </details>
  );
}

function ThisMonth({ data, locale }: { data: MonthData; locale: string }) {
  const at = new Intl.DateTimeFormat(locale, { day: 'numeric', month: 'short', hour: '2-digit', minute: '2-digit', timeZone: data.timeZone });
  const day = new Intl.DateTimeFormat(locale, { day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' });
  const monthName = new Intl.DateTimeFormat(locale, { month: 'long', year: 'numeric', timeZone: 'UTC' }).format(new Date(`${data.month}-01T00:00:00Z`));
  return (
    <div className="space-y-3">
      <h3 className="font-semibold">
        {monthName}: {minutesText(data.totals.seconds)} in {data.totals.entries === 1 ? '1 entry' : `${data.totals.entries} entries`}
      </h3>
      {data.entries.length > 0 && (
        <ul className="space-y-1 text-sm" aria-label={`Monitoring time in ${monthName}`}>
          {data.entries.map((e) => (
            <li key={e.id}>
              {at.format(new Date(e.startedAt))} · {ACTIVITY_WORDS[e.activity]} · {minutesText(e.seconds)} · {e.staff.name ?? 'staff'} ({e.source === 'timer' ? 'timer' : 'by hand'}){e.note ? `: ${e.note}` : ''}
            </li>
          ))}
        </ul>
      )}
      {data.dataPeriods.length > 0 && (
        <p className="text-sm">
          Days with ride data per 30-day period from the program start:{' '}
          {data.dataPeriods
            .map((p) => `${day.format(new Date(`${p.from}T00:00:00Z`))} to ${day.format(new Date(`${p.to}T00:00:00Z`))}: ${p.daysWithData}${p.complete ? '' : ' so far'}`)
            .join('; ')}
          .
        </p>
      )}
    </div>
  );
}
