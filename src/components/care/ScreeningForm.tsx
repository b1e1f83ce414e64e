import { useState, type FormEvent } from 'react';
import { SCREENING_STATUS_LABELS } from '../../lib/care/screening-labels';
import { api, ApiError, useApi } from '../api';
import { formatDate, formatDateTime } from '../../lib/time/format';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { TextAreaField, TextField } from '../ui/Field';
import { Loaded } from '../ui/Loading';

type Status = 'not_assessed' | 'no_concern' | 'concern';
interface Item {
  id: string;
  label: string;
  status: Status;
  note: string | null;
  lastScanOn: string | null;
}
interface Version {
  id: string;
  version: number;
  assessedOn: string;
  assessedBy: { name: string | null };
  recordedAt: string;
  items: Item[];
}
interface ScreeningData {
  current: Version | null;
  history: Version[];
  items: { id: string; label: string }[];
}

const STATUSES: Status[] = ['not_assessed', 'no_concern', 'concern'];

/** The clinic's screening before (and during) a home program: one status and note per item; every save is a new version. */
export default function ScreeningForm({ clientId, locale, timeZone, today }: { clientId: string; locale: string; timeZone: string; today: string }) {
  const [data, reload] = useApi<ScreeningData>(`/api/clients/${clientId}/screening`);
  // Kept here: a save reloads the data and the editor starts again from the new version, with the message still shown.
  const [saved, setSaved] = useState(false);
  return (
    <Loaded value={data} reload={reload} label="the screening">
      {(d) => <Editor key={d.current?.id ?? 'none'} data={d} clientId={clientId} locale={locale} timeZone={timeZone} today={today} saved={saved} onSaving={() => setSaved(false)} onSaved={() => { setSaved(true); reload(); }} />}
    </Loaded>
  );
}

function Editor({ data, clientId, locale, timeZone, today, saved, onSaving, onSaved }: { data: ScreeningData; clientId: string; locale: string; timeZone: string; today: string; saved: boolean; onSaving: () => void; onSaved: () => void }) {
  const start = (id: string) => data.current?.items.find((i) => i.id === id);
  const [items, setItems] = useState(() => data.items.map((i) => ({ id: i.id, label: i.label, status: start(i.id)?.status ?? 'not_assessed', note: start(i.id)?.note ?? '', lastScanOn: start(i.id)?.lastScanOn ?? '' })));
  const [assessedOn, setAssessedOn] = useState(today);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<ApiError | null>(null);
  const set = (id: string, patch: Partial<(typeof items)[number]>) => setItems((all) => all.map((i) => (i.id === id ? { ...i, ...patch } : i)));
  const fieldError = (path: string) => error?.field(path);

  async function submit(e: FormEvent) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    onSaving();
    try {
      await api('PUT', `/api/clients/${clientId}/screening`, {
        assessedOn,
        items: items.map((i) => ({ id: i.id, status: i.status, note: i.note.trim() || null, ...(i.id === 'bone_health' && i.lastScanOn ? { lastScanOn: i.lastScanOn } : {}) })),
      });
      onSaved();
    } catch (err) {
      setError(err as ApiError);
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="space-y-4">
      {data.current ? (
        <p className="text-ink-soft">
          Version {data.current.version}, assessed on {formatDate(data.current.assessedOn, locale, 'day')} by {data.current.assessedBy.name ?? 'the clinic'}.
        </p>
      ) : (
        <p className="text-ink-soft">No screening recorded yet.</p>
      )}
      <form method="post" onSubmit={submit} noValidate className="space-y-4" aria-label="Screening">
        {saved && (
          <Alert tone="success" live>
            Screening saved as a new version.
          </Alert>
        )}
        {error && !error.body.fields?.length && <Alert tone="danger" live>{error.message}</Alert>}
        <ol className="space-y-3">
          {items.map((item, index) => (
            <li key={item.id} className="card space-y-2" data-testid={`screening-${item.id}`}>
              <fieldset className="space-y-2">
                <legend className="font-semibold">{item.label}</legend>
                <div className="flex flex-wrap gap-2">
                  {STATUSES.map((s) => (
                    <label key={s} className={`inline-flex min-h-12 cursor-pointer items-center gap-2 rounded-lg border px-4 ${item.status === s ? 'border-lagoon bg-lagoon-tint font-semibold' : 'border-line'}`}>
                      <input type="radio" name={`status-${item.id}`} value={s} checked={item.status === s} onChange={() => set(item.id, { status: s })} className="h-5 w-5" />
                      {SCREENING_STATUS_LABELS[s]}
                    </label>
                  ))}
                </div>
                <TextAreaField
                  label={`Note on ${item.label.toLowerCase()}`}
                  optional={item.status !== 'concern'}
                  rows={2}
                  value={item.note}
                  onChange={(e) => set(item.id, { note: e.target.value })}
                  error={fieldError(`items.${index}.note`)}
                />
                {item.id === 'bone_health' && (
                  <TextField label="Date of the last bone-density scan" optional type="date" max={today} value={item.lastScanOn} onChange={(e) => set(item.id, { lastScanOn: e.target.value })} error={fieldError(`items.${index}.lastScanOn`)} />
                )}
              </fieldset>
            </li>
          ))}
        </ol>
        <div className="max-w-xs">
          <TextField label="Assessed on" type="date" max={today} value={assessedOn} onChange={(e) => setAssessedOn(e.target.value)} error={fieldError('assessedOn')} />
        </div>
        <Button type="submit" busy={busy}>
          Save screening
        </Button>
      </form>
      {data.history.length > 1 && (
        <details className="card">
          <summary className="inline-flex min-h-12 cursor-pointer items-center font-semibold">Earlier versions ({data.history.length - 1})</summary>
          <ol className="mt-2 space-y-2">
            {data.history.slice(1).map((v) => (
              <li key={v.id}>
                <p className="font-medium">
                  Version {v.version}, assessed {formatDate(v.assessedOn, locale, 'day')} by {v.assessedBy.name ?? 'the clinic'} (recorded {formatDateTime(v.recordedAt, locale, timeZone, 'dateShort')})
                </p>
                <ul className="list-disc pl-6 text-sm">
                  {v.items.map((i) => (
                    <li key={i.id}>
                      {i.label}: {SCREENING_STATUS_LABELS[i.status]}
                      {i.note ? ` — ${i.note}` : ''}
                    </li>
                  ))}
                </ul>
              </li>
            ))}
          </ol>
        </details>
      )}
    </div>
  );
}
