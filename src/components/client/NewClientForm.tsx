import { useEffect, useState, type FormEvent } from 'react';
import type { AdRisk, Diagnosis } from '../../lib/db/tables';
import { DIAGNOSIS_LABELS } from '../../lib/clients/labels';
import { api, ApiError } from '../api';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { SelectField, TextField } from '../ui/Field';
import { formErrorText } from './form-errors';

const PATHS = ['name', 'timezone', 'dateOfBirth', 'diagnosis', 'injuryLevel', 'aisGrade', 'adRisk', 'bodyMassKg', 'programStart'];

function zoneList(extra: string[]): string[] {
  const zones = new Set(Intl.supportedValuesOf('timeZone'));
  for (const z of extra) zones.add(z);
  return [...zones].sort();
}

/** Adds a client to the clinic and opens their page. */
export default function NewClientForm({ fallbackZone }: { fallbackZone: string }) {
  const [name, setName] = useState('');
  const [timezone, setTimezone] = useState(fallbackZone);
  const [zones, setZones] = useState<string[]>([fallbackZone]);
  const [dateOfBirth, setDateOfBirth] = useState('');
  const [diagnosis, setDiagnosis] = useState<Diagnosis | ''>('');
  const [injuryLevel, setInjuryLevel] = useState('');
  const [aisGrade, setAisGrade] = useState('');
  const [adRisk, setAdRisk] = useState<AdRisk>('unknown');
  const [bodyMassKg, setBodyMassKg] = useState('');
  const [programStart, setProgramStart] = useState('');
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<ApiError | null>(null);

  // The browser's own list and zone, once the page runs: the server's may differ, and the browser's zone is the likelier default.
  useEffect(() => {
    const zone = Intl.DateTimeFormat().resolvedOptions().timeZone;
    setZones(zoneList([fallbackZone, ...(zone ? [zone] : [])]));
    if (zone) setTimezone(zone);
  }, [fallbackZone]);

  async function submit(e: FormEvent) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    const mass = bodyMassKg.trim().replace(',', '.');
    try {
      const { id } = await api<{ id: string }>('POST', '/api/clients', {
        name,
        timezone,
        ...(dateOfBirth ? { dateOfBirth } : {}),
        ...(diagnosis ? { diagnosis } : {}),
        ...(diagnosis === 'sci' && injuryLevel.trim() ? { injuryLevel: injuryLevel.trim() } : {}),
        ...(diagnosis === 'sci' && aisGrade ? { aisGrade } : {}),
        adRisk,
        ...(mass ? { bodyMassKg: /^\d+(\.\d+)?$/.test(mass) ? Number(mass) : mass } : {}),
        ...(programStart ? { programStart } : {}),
      });
      window.location.assign(`/clients/${id}`);
    } catch (err) {
      setError(err as ApiError);
      setBusy(false);
    }
  }

  return (
    <form method="post" onSubmit={submit} noValidate className="card space-y-5">
      {error && (
        <Alert tone="danger" live>
          {formErrorText(error, (p) => PATHS.includes(p))}
        </Alert>
      )}
      <TextField label="Name" autoComplete="off" maxLength={120} value={name} onChange={(e) => setName(e.target.value)} help="As the clinic refers to them; the client sees it too." error={error?.field('name')} />
      <SelectField
        label="Time zone"
        value={timezone}
        onChange={(e) => setTimezone(e.target.value)}
        options={zones.map((z) => ({ value: z, label: z.replaceAll('_', ' ') }))}
        help="Where the client rides: weeks, streaks and session dates follow it. Type the first letters to jump through the list."
        error={error?.field('timezone')}
      />
      <div className="grid gap-5 sm:grid-cols-2 sm:items-end">
        <TextField label="Date of birth" optional type="date" value={dateOfBirth} onChange={(e) => setDateOfBirth(e.target.value)} error={error?.field('dateOfBirth')} />
        <TextField label="Program start" optional type="date" value={programStart} onChange={(e) => setProgramStart(e.target.value)} help="The first day of the home program." error={error?.field('programStart')} />
      </div>
      <SelectField
        label="Diagnosis"
        optional
        value={diagnosis}
        onChange={(e) => setDiagnosis(e.target.value as Diagnosis | '')}
        options={[{ value: '', label: 'Not recorded yet' }, ...Object.entries(DIAGNOSIS_LABELS).map(([value, label]) => ({ value, label }))]}
        help="Left as not recorded, it is saved as another neurological condition and can be changed later."
        error={error?.field('diagnosis')}
      />
      {diagnosis === 'sci' && (
        <div className="grid gap-5 sm:grid-cols-2">
          <TextField label="Neurological level" optional autoComplete="off" maxLength={3} value={injuryLevel} onChange={(e) => setInjuryLevel(e.target.value)} help="Written like C6, T4 or L1." error={error?.field('injuryLevel')} />
          <SelectField
            label="AIS grade"
            optional
            value={aisGrade}
            onChange={(e) => setAisGrade(e.target.value)}
            options={[{ value: '', label: 'Not recorded' }, ...['A', 'B', 'C', 'D', 'E'].map((g) => ({ value: g, label: `AIS ${g}` }))]}
            error={error?.field('aisGrade')}
          />
        </div>
      )}
      <SelectField
        label="Autonomic dysreflexia risk"
        value={adRisk}
        onChange={(e) => setAdRisk(e.target.value as AdRisk)}
        options={[{ value: 'at_risk', label: 'At risk' }, { value: 'not_at_risk', label: 'Not at risk' }, { value: 'unknown', label: 'Not recorded yet' }]}
        help="Mainly a concern with spinal cord injuries at T6 and above; record it from the screening before the program starts."
        error={error?.field('adRisk')}
      />
      <div className="max-w-xs">
        <TextField label="Body mass (kg)" optional inputMode="decimal" autoComplete="off" value={bodyMassKg} onChange={(e) => setBodyMassKg(e.target.value)} help="20–300 kg; used for energy estimates." error={error?.field('bodyMassKg')} />
      </div>
      <div className="flex flex-wrap gap-3">
        <Button type="submit" busy={busy}>
          Add client
        </Button>
        <a href="/clients" className="btn btn-quiet">
          Cancel
        </a>
      </div>
    </form>
  );
}
