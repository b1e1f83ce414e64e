import { useEffect, useState, type FormEvent } from 'react';
import { api, ApiError, useApi } from '../api';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { TextField } from '../ui/Field';
import { Loaded } from '../ui/Loading';

interface Energy {
  efficiencyPct: number;
  isDefault: boolean;
  defaultPct: number;
  range: { min: number; max: number };
}

/** The efficiency behind the energy estimates in reports and exports. */
export default function EnergySetting({ clinicId }: { clinicId: string }) {
  const url = `/api/clinic/energy?clinicId=${clinicId}`;
  const [loaded, reload] = useApi<Energy>(url);
  return (
    <section aria-labelledby="energy-h" className="card max-w-3xl space-y-3">
      <h2 id="energy-h" className="text-xl">
        Energy estimate
      </h2>
      <Loaded value={loaded} reload={reload} label="the energy setting">
        {(data) => <EnergyForm url={url} data={data} onSaved={reload} />}
      </Loaded>
    </section>
  );
}

function EnergyForm({ url, data, onSaved }: { url: string; data: Energy; onSaved: () => void }) {
  const [value, setValue] = useState(String(data.efficiencyPct));
  const [error, setError] = useState<ApiError | null>(null);
  const [saved, setSaved] = useState(false);
  const [busy, setBusy] = useState(false);
  useEffect(() => setValue(String(data.efficiencyPct)), [data.efficiencyPct]);

  async function save(e: FormEvent, reset = false) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    setSaved(false);
    try {
      await api('PUT', url, { efficiencyPct: reset ? null : Number(value.replace(',', '.')) });
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
      <p>
        Reports, the sessions CSV and the FHIR export estimate the energy a ride used from its crank work and an assumed efficiency of FES cycling. Studies of FES cycling report {data.range.min}–
        {data.range.max} % (gross), far below volitional cycling. Kinloop assumes {data.defaultPct} % unless you set another value; every estimate names the efficiency it used.
      </p>
      {saved && (
        <Alert tone="success" live>
          Saved: estimates now use {data.efficiencyPct} %.
        </Alert>
      )}
      <TextField label="FES-cycling efficiency (%)" inputMode="decimal" value={value} onChange={(e) => setValue(e.target.value)} error={error?.field('efficiencyPct') ?? error?.message} />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" busy={busy}>
          Save the efficiency
        </Button>
        {!data.isDefault && (
          <Button variant="secondary" onClick={(e) => save(e, true)}>
            Use Kinloop’s default ({data.defaultPct} %)
          </Button>
        )}
      </div>
    </form>
  );
}
