import { useState, type FormEvent } from 'react';
import { api, ApiError, useApi } from '../api';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { TextField } from '../ui/Field';
import { Loaded } from '../ui/Loading';

interface Care {
  clearanceReviewMonths: number;
  adAbsoluteSystolic: number;
  defaults: { clearanceReviewMonths: number; adAbsoluteSystolic: number };
}

/** How long a clearance holds, and the systolic level that counts as an episode for a client at risk whatever the baseline. */
export default function CareSettings({ clinicId }: { clinicId: string }) {
  const url = `/api/clinic/care?clinicId=${clinicId}`;
  const [loaded, reload] = useApi<Care>(url);
  return (
    <section aria-labelledby="care-h" className="card max-w-3xl space-y-3">
      <h2 id="care-h" className="text-xl">
        Clearance and blood pressure
      </h2>
      <Loaded value={loaded} reload={reload} label="the clearance and blood-pressure settings">
        {(data) => <CareForm key={`${data.clearanceReviewMonths}-${data.adAbsoluteSystolic}`} url={url} data={data} onSaved={reload} />}
      </Loaded>
    </section>
  );
}

function CareForm({ url, data, onSaved }: { url: string; data: Care; onSaved: () => void }) {
  const [months, setMonths] = useState(String(data.clearanceReviewMonths));
  const [systolic, setSystolic] = useState(String(data.adAbsoluteSystolic));
  const [error, setError] = useState<ApiError | null>(null);
  const [saved, setSaved] = useState(false);
  const [busy, setBusy] = useState(false);

  async function save(e: FormEvent) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    setSaved(false);
    try {
      await api('PUT', url, { clearanceReviewMonths: Number(months), adAbsoluteSystolic: Number(systolic) });
      setSaved(true);
      onSaved();
    } catch (err) {
      setError(err as ApiError);
    } finally {
      setBusy(false);
    }
  }

  return (
    <form onSubmit={save} className="space-y-3" noValidate>
      {saved && (
        <Alert tone="success" live>
          Saved.
        </Alert>
      )}
      {error && !error.body.fields?.length && <Alert tone="danger">{error.message}</Alert>}
      <TextField
        label="Clearance review after (months)"
        inputMode="numeric"
        value={months}
        onChange={(e) => setMonths(e.target.value)}
        help={`The review date a new clearance gets unless one is entered; Kinloop’s default is ${data.defaults.clearanceReviewMonths}. A clearance is “due for review” in its last 30 days.`}
        error={error?.field('clearanceReviewMonths')}
      />
      <TextField
        label="Systolic level for a client at risk (mmHg)"
        inputMode="numeric"
        value={systolic}
        onChange={(e) => setSystolic(e.target.value)}
        help={`A check with a systolic at or above it, for a client at risk of autonomic dysreflexia, shows the safety panel and raises an urgent flag whatever the baseline. Kinloop’s default is ${data.defaults.adAbsoluteSystolic} mmHg, the level at which the Consortium for Spinal Cord Medicine’s guideline on acute management of autonomic dysreflexia has adults considered for drug treatment. Follow your clinic’s protocols.`}
        error={error?.field('adAbsoluteSystolic')}
      />
      <Button type="submit" busy={busy}>
        Save these settings
      </Button>
    </form>
  );
}
