import { useRef, useState, type FormEvent } from 'react';
import { ApiError, useApi, type ApiErrorBody } from '../api';
import { formatDate } from '../../lib/time/format';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { TextField } from '../ui/Field';
import { Loaded } from '../ui/Loading';

interface Clearance {
  id: string;
  name: string;
  contentType: string;
  byteSize: number;
  clearedOn: string;
  clinician: string;
  reviewOn: string;
  uploadedBy: { name: string | null };
  downloadUrl: string;
}

const KIND: Record<string, string> = { 'application/pdf': 'PDF', 'image/jpeg': 'JPEG', 'image/png': 'PNG' };
const size = (bytes: number) => (bytes >= 1024 * 1024 ? `${(bytes / 1024 / 1024).toFixed(1)} MB` : `${Math.max(1, Math.round(bytes / 1024))} kB`);

/** Medical clearance documents with their dates; upload a new one, download any. Staff only. */
export default function Clearances({ clientId, locale, today, reviewMonths }: { clientId: string; locale: string; today: string; reviewMonths: number }) {
  const [list, reload] = useApi<{ clearances: Clearance[] }>(`/api/clients/${clientId}/clearances`);
  const [clearedOn, setClearedOn] = useState(today);
  const [clinician, setClinician] = useState('');
  const [reviewOn, setReviewOn] = useState('');
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<ApiError | null>(null);
  const [saved, setSaved] = useState<string | null>(null);
  const file = useRef<HTMLInputElement>(null);

  async function submit(e: FormEvent) {
    e.preventDefault();
    setError(null);
    setSaved(null);
    const chosen = file.current?.files?.[0];
    if (!chosen) {
      setError(new ApiError(400, { code: 'invalid_input', message: 'Choose the clearance document to upload.', fields: [{ path: 'document', message: 'Choose a PDF, JPEG or PNG file of at most 10 MB.' }] }));
      return;
    }
    // The details go before the document, so that the server can check them before storing a byte.
    const form = new FormData();
    form.append('clearedOn', clearedOn);
    form.append('clinician', clinician);
    if (reviewOn) form.append('reviewOn', reviewOn);
    form.append('document', chosen, chosen.name);
    setBusy(true);
    try {
      const res = await fetch(`/api/clients/${clientId}/clearances`, { method: 'POST', body: form, credentials: 'same-origin' });
      const body = await res.json().catch(() => null);
      if (!res.ok) throw new ApiError(res.status, (body?.error as ApiErrorBody) ?? { code: `http_${res.status}`, message: `The server answered ${res.status}. Try again in a moment.` });
      setSaved(`Clearance saved: ${(body as Clearance).name}, review on ${formatDate((body as Clearance).reviewOn, locale, 'day')}.`);
      setClinician('');
      setReviewOn('');
      if (file.current) file.current.value = '';
      reload();
    } catch (err) {
      setError(err instanceof ApiError ? err : new ApiError(0, { code: 'network', message: 'Kinloop could not be reached. Check your connection and try again.' }));
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="grid gap-4 lg:grid-cols-[2fr_3fr]">
      <form method="post" onSubmit={submit} noValidate className="card space-y-3 self-start" aria-label="Upload a clearance">
        {saved && (
          <Alert tone="success" live>
            {saved}
          </Alert>
        )}
        {error && (
          <Alert tone="danger" live>
            {error.message}
          </Alert>
        )}
        <div className="space-y-1">
          <label htmlFor="clearance-file" className="block font-medium">
            Clearance document
          </label>
          <p id="clearance-file-help" className="text-sm text-ink-soft">
            A PDF, JPEG or PNG of the physician’s clearance, at most 10 MB.
          </p>
          <input id="clearance-file" ref={file} type="file" accept="application/pdf,image/jpeg,image/png" aria-describedby="clearance-file-help" className="field-input" />
        </div>
        <TextField label="Cleared on" type="date" max={today} value={clearedOn} onChange={(e) => setClearedOn(e.target.value)} error={error?.field('clearedOn')} />
        <TextField label="Clearing clinician" value={clinician} onChange={(e) => setClinician(e.target.value)} error={error?.field('clinician')} autoComplete="off" />
        <TextField label="Review on" optional help={`Left empty: ${reviewMonths} months after the clearance (the clinic’s setting).`} type="date" value={reviewOn} onChange={(e) => setReviewOn(e.target.value)} error={error?.field('reviewOn')} />
        <Button type="submit" busy={busy}>
          Upload clearance
        </Button>
      </form>
      <Loaded value={list} reload={reload} label="the clearances">
        {({ clearances }) =>
          clearances.length ? (
            <ol className="space-y-3" aria-label="Clearances, newest first">
              {clearances.map((c) => (
                <li key={c.id} className="card space-y-1" data-testid="clearance">
                  <p className="font-semibold">
                    Cleared on {formatDate(c.clearedOn, locale, 'day')} by {c.clinician}
                  </p>
                  <p>Review on {formatDate(c.reviewOn, locale, 'day')}</p>
                  <p className="text-sm text-ink-soft">
                    Uploaded by {c.uploadedBy.name ?? 'the clinic'} · {KIND[c.contentType] ?? c.contentType}, {size(c.byteSize)}
                  </p>
                  <a href={c.downloadUrl} className="inline-flex min-h-12 items-center font-semibold" download>
                    Download {c.name}
                  </a>
                </li>
              ))}
            </ol>
          ) : (
            <p className="text-ink-soft">No clearance on file.</p>
          )
        }
      </Loaded>
    </div>
  );
}
