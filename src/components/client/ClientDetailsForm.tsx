import { useState, type FormEvent } from 'react';
import type { AdRisk } from '../../lib/db/tables';
import { AD_RISK_LABELS } from '../../lib/clients/labels';
import { api, ApiError } from '../api';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { SelectField, TextField } from '../ui/Field';
import { formErrorText } from './form-errors';

export interface ClientDetails {
  clientId: string;
  injuryLevel: string | null;
  aisGrade: string | null;
  adRisk: AdRisk;
  bodyMassKg: number | null;
  programStart: string | null;
  baselineSystolic: number | null;
  volitionalControl: boolean | null;
}

const PATHS = ['injuryLevel', 'aisGrade', 'adRisk', 'bodyMassKg', 'programStart', 'baselineSystolic', 'volitionalControl'];
const orNull = (v: string) => (v.trim() === '' ? null : v.trim());
const numberOrNull = (v: string) => (v.trim() === '' ? null : Number(v.replace(',', '.')));

/**
 * The clinical details staff may change, above all the resting systolic
 * pressure that blood-pressure rises are judged against (without it, the
 * median of the client's pre-ride readings is used).
 */
export default function ClientDetailsForm(props: ClientDetails) {
  const [injuryLevel, setInjuryLevel] = useState(props.injuryLevel ?? '');
  const [aisGrade, setAisGrade] = useState(props.aisGrade ?? '');
  const [adRisk, setAdRisk] = useState<AdRisk>(props.adRisk);
  const [bodyMassKg, setBodyMassKg] = useState(props.bodyMassKg?.toString() ?? '');
  const [programStart, setProgramStart] = useState(props.programStart ?? '');
  const [baseline, setBaseline] = useState(props.baselineSystolic?.toString() ?? '');
  const [volitional, setVolitional] = useState(props.volitionalControl === null ? '' : String(props.volitionalControl));
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<ApiError | null>(null);

  async function submit(e: FormEvent) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    try {
      await api('PATCH', `/api/clients/${props.clientId}`, {
        injuryLevel: orNull(injuryLevel),
        aisGrade: orNull(aisGrade),
        adRisk,
        bodyMassKg: numberOrNull(bodyMassKg),
        programStart: orNull(programStart),
        baselineSystolic: numberOrNull(baseline),
        volitionalControl: volitional === '' ? null : volitional === 'true',
      });
      // The header above is rendered on the server; show it with the new values.
      window.location.reload();
    } catch (err) {
      setError(err as ApiError);
      setBusy(false);
    }
  }

  return (
    <details className="rounded-lg border border-line">
      <summary className="flex min-h-12 cursor-pointer items-center px-4 font-semibold text-lagoon-dark">Edit clinical details</summary>
      <form method="post" onSubmit={submit} className="grid gap-4 p-4 sm:grid-cols-2" noValidate>
        {error && (
          <div className="sm:col-span-2">
            <Alert tone="danger" live>
              {formErrorText(error, (p) => PATHS.includes(p))}
            </Alert>
          </div>
        )}
        <TextField label="Neurological level" optional help="For example C6, T4 or L1." value={injuryLevel} onChange={(e) => setInjuryLevel(e.target.value)} error={error?.field('injuryLevel')} />
        <SelectField
          label="AIS grade"
          optional
          value={aisGrade}
          onChange={(e) => setAisGrade(e.target.value)}
          options={[{ value: '', label: 'Not recorded' }, ...['A', 'B', 'C', 'D', 'E'].map((g) => ({ value: g, label: `AIS ${g}` }))]}
          error={error?.field('aisGrade')}
        />
        <SelectField
          label="Autonomic dysreflexia risk"
          value={adRisk}
          onChange={(e) => setAdRisk(e.target.value as AdRisk)}
          options={(Object.keys(AD_RISK_LABELS) as AdRisk[]).map((r) => ({ value: r, label: AD_RISK_LABELS[r] }))}
          help="A level at or above T6 counts as at risk whatever is chosen here."
          error={error?.field('adRisk')}
        />
        <TextField
          label="Baseline resting systolic pressure (mmHg)"
          optional
          inputMode="numeric"
          value={baseline}
          onChange={(e) => setBaseline(e.target.value)}
          help="Readings more than 20 mmHg above this are flagged. Leave empty to use the median of the client’s pre-ride readings."
          error={error?.field('baselineSystolic')}
        />
        <TextField label="Body mass (kg)" optional inputMode="decimal" value={bodyMassKg} onChange={(e) => setBodyMassKg(e.target.value)} error={error?.field('bodyMassKg')} />
        <SelectField
          label="Pedals by own effort too"
          optional
          value={volitional}
          onChange={(e) => setVolitional(e.target.value)}
          options={[
            { value: '', label: 'Not recorded' },
            { value: 'true', label: 'Yes: some volitional control of the legs' },
            { value: 'false', label: 'No' },
          ]}
          help="With yes and a body mass, reports show the volitional-cycling energy figure beside Kinloop’s FES estimate, for comparison."
          error={error?.field('volitionalControl')}
        />
        <TextField label="Program start" optional type="date" value={programStart} onChange={(e) => setProgramStart(e.target.value)} error={error?.field('programStart')} />
        <div className="sm:col-span-2">
          <Button type="submit" busy={busy}>
            Save clinical details
          </Button>
        </div>
      </form>
    </details>
  );
}
