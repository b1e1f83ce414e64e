import { useState, type FormEvent } from 'react';
import { AD_PLAN_TEXT } from '../../lib/checks/safety-text';
import { api, ApiError, useApi } from '../api';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { TextAreaField, TextField } from '../ui/Field';
import { Loaded } from '../ui/Loading';
import { AdPlanCard, type AdPlanData } from './AdPlanCard';

interface PlanData {
  current: (AdPlanData & { id: string }) | null;
  history: (AdPlanData & { id: string })[];
}
interface Contact {
  name: string;
  relationship: string;
  phone: string;
}

/** The clinic writes the rider's own dysreflexia plan; every save is a new version, the current one is shown as riders and carers see it. */
export default function AdPlanEditor({ clientId, atRisk }: { clientId: string; atRisk: boolean }) {
  const [data, reload] = useApi<PlanData>(`/api/clients/${clientId}/ad-plan`);
  // Kept here: a save reloads the data and the editor starts again from the new version, with the message still shown.
  const [saved, setSaved] = useState(false);
  return (
    <Loaded value={data} reload={reload} label="the dysreflexia plan">
      {(d) => <Editor key={d.current?.id ?? 'none'} data={d} clientId={clientId} atRisk={atRisk} saved={saved} onSaving={() => setSaved(false)} onSaved={() => { setSaved(true); reload(); }} />}
    </Loaded>
  );
}

const numberOrNull = (v: string) => (v.trim() === '' ? null : Number(v));

function Editor({ data, clientId, atRisk, saved, onSaving, onSaved }: { data: PlanData; clientId: string; atRisk: boolean; saved: boolean; onSaving: () => void; onSaved: () => void }) {
  const c = data.current;
  const [systolic, setSystolic] = useState(c?.restingSystolic?.toString() ?? '');
  const [diastolic, setDiastolic] = useState(c?.restingDiastolic?.toString() ?? '');
  const [signs, setSigns] = useState(c?.signs ?? '');
  const [firstSteps, setFirstSteps] = useState(c?.firstSteps ?? '');
  const [prescribed, setPrescribed] = useState(c?.physicianPrescribed ?? '');
  const [whoToCall, setWhoToCall] = useState(c?.whoToCall ?? '');
  const [contacts, setContacts] = useState<Contact[]>(c?.contacts.map((x) => ({ name: x.name, relationship: x.relationship ?? '', phone: x.phone })) ?? []);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<ApiError | null>(null);
  const f = (path: string) => error?.field(path);

  async function submit(e: FormEvent) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    onSaving();
    try {
      await api('PUT', `/api/clients/${clientId}/ad-plan`, {
        restingSystolic: numberOrNull(systolic),
        restingDiastolic: numberOrNull(diastolic),
        signs,
        firstSteps,
        physicianPrescribed: prescribed.trim() || null,
        whoToCall,
        contacts: contacts.map((x) => ({ name: x.name, relationship: x.relationship.trim() || null, phone: x.phone })),
      });
      onSaved();
    } catch (err) {
      setError(err as ApiError);
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="grid gap-4 lg:grid-cols-2">
      <form method="post" onSubmit={submit} noValidate className="card space-y-3 self-start" aria-label="Dysreflexia plan">
        {!c && atRisk && <Alert tone="caution">{AD_PLAN_TEXT.noPlanForStaff}</Alert>}
        {saved && (
          <Alert tone="success" live>
            Plan saved as a new version. Riders and carers see it in the safety panel, on the prescription and on the wallet card.
          </Alert>
        )}
        {error && !error.body.fields?.length && <Alert tone="danger" live>{error.message}</Alert>}
        <fieldset className="grid gap-3 sm:grid-cols-2">
          <legend className="mb-1 font-semibold">{AD_PLAN_TEXT.resting}</legend>
          <TextField label="Systolic (mmHg)" optional inputMode="numeric" value={systolic} onChange={(e) => setSystolic(e.target.value)} error={f('restingSystolic')} />
          <TextField label="Diastolic (mmHg)" optional inputMode="numeric" value={diastolic} onChange={(e) => setDiastolic(e.target.value)} error={f('restingDiastolic')} />
        </fieldset>
        <TextAreaField label={AD_PLAN_TEXT.signs} rows={3} value={signs} onChange={(e) => setSigns(e.target.value)} error={f('signs')} />
        <TextAreaField label={AD_PLAN_TEXT.firstSteps} rows={4} value={firstSteps} onChange={(e) => setFirstSteps(e.target.value)} error={f('firstSteps')} />
        <TextAreaField
          label={AD_PLAN_TEXT.physicianPrescribed}
          optional
          rows={3}
          help="Copy it from the physician’s instructions. Kinloop itself never suggests medication."
          value={prescribed}
          onChange={(e) => setPrescribed(e.target.value)}
          error={f('physicianPrescribed')}
        />
        <TextAreaField label={AD_PLAN_TEXT.whoToCall} rows={2} value={whoToCall} onChange={(e) => setWhoToCall(e.target.value)} error={f('whoToCall')} />
        <fieldset className="space-y-3">
          <legend className="font-semibold">{AD_PLAN_TEXT.contacts}</legend>
          {contacts.map((x, i) => (
            <div key={i} className="space-y-2 rounded-lg border border-line p-3">
              <TextField label={`Contact ${i + 1}: name`} value={x.name} onChange={(e) => setContacts((all) => all.map((y, j) => (j === i ? { ...y, name: e.target.value } : y)))} error={f(`contacts.${i}.name`)} />
              <TextField label={`Contact ${i + 1}: relationship`} optional value={x.relationship} onChange={(e) => setContacts((all) => all.map((y, j) => (j === i ? { ...y, relationship: e.target.value } : y)))} error={f(`contacts.${i}.relationship`)} />
              <TextField label={`Contact ${i + 1}: phone`} type="tel" value={x.phone} onChange={(e) => setContacts((all) => all.map((y, j) => (j === i ? { ...y, phone: e.target.value } : y)))} error={f(`contacts.${i}.phone`)} />
              <Button variant="quiet" onClick={() => setContacts((all) => all.filter((_, j) => j !== i))}>
                Remove contact {i + 1}
              </Button>
            </div>
          ))}
          {contacts.length < 6 && (
            <Button variant="secondary" onClick={() => setContacts((all) => [...all, { name: '', relationship: '', phone: '' }])}>
              Add an emergency contact
            </Button>
          )}
        </fieldset>
        <Button type="submit" busy={busy}>
          Save plan
        </Button>
      </form>
      <div className="space-y-3">
        {c ? <AdPlanCard plan={c} headingLevel={3} title="As riders and carers see it" /> : <p className="text-ink-soft">{AD_PLAN_TEXT.noPlan}.</p>}
        {c && (
          <a href={`/wallet-card?clientId=${clientId}`} className="inline-flex min-h-12 items-center font-semibold">
            Open the printable wallet card
          </a>
        )}
        {data.history.length > 1 && <p className="text-sm text-ink-soft">{data.history.length - 1} earlier version(s) are kept in the record.</p>}
      </div>
    </div>
  );
}
