import { useEffect, useRef, useState, type FormEvent, type ReactNode } from 'react';
import { AD_SYMPTOMS, OTHER_EVENTS } from '../../lib/checks/check-input';
import { AD_SYMPTOM_LABELS, OTHER_EVENT_LABELS } from '../../lib/checks/labels';
import { api, ApiError, useApi } from '../api';
import { ClientSearch, useClientChoices, type ClientChoices } from '../clients/client-choices';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { FieldLink } from '../ui/FieldLink';
import CautionBanner from '../ui/CautionBanner';
import { EmptyState } from '../ui/EmptyState';
import { SelectField, TextAreaField } from '../ui/Field';
import { NAMED_CHANNELS } from '../../lib/rides/types';
import { Loaded } from '../ui/Loading';
import { bodyFromDraft, emptyDraft, FORM_ERROR, NUMBER_FIELDS, type CheckDraft, type DraftErrors, type NumberKey } from './check-draft';
import { CheckOutcome, type Outcome } from './CheckOutcome';
import { CheckboxList, EffortScale, fieldId, Group, NumberInput } from './fields';
import { RecentChecks } from './RecentChecks';
import { SkinSites } from './SkinSites';
import type { CheckClient, SavedCheck } from './types';
import { capitalise } from '../../lib/format/words';
import { formatDateTime } from '../../lib/time/format';
import type { SessionsPage } from '../client/types';

const COMMENT_ID = 'check-comment';
const BP_KEYS = Object.keys(NUMBER_FIELDS) as NumberKey[];

/**
 * Recording a check before and after a ride. Carers and staff see every part
 * open; a rider recording their own ride starts with how it went, with blood
 * pressure and skin folded away but one press from open.
 */
export default function CheckForm({ initialClientId, viewerClientId, locale }: { initialClientId: string | null; viewerClientId: string | null; locale: string }) {
  const choices = useClientChoices<CheckClient>(initialClientId ?? viewerClientId);
  return (
    <Loaded value={choices.value} reload={choices.reload} label="your clients">
      {({ clients }) =>
        clients.length || choices.searchable ? (
          <ChecksForClients clients={clients} choices={choices} initialClientId={initialClientId} viewerClientId={viewerClientId} locale={locale} />
        ) : (
          <EmptyState title="No client to record a check for">Once a clinic links you to a client, you can record their checks here.</EmptyState>
        )
      }
    </Loaded>
  );
}

function ChecksForClients({
  clients,
  choices,
  initialClientId,
  viewerClientId,
  locale,
}: {
  clients: CheckClient[];
  choices: ClientChoices<CheckClient>;
  initialClientId: string | null;
  viewerClientId: string | null;
  locale: string;
}) {
  const [clientId, setClientId] = useState(() =>
    clients.length === 1 && !choices.searchable ? clients[0].id : clients.some((c) => c.id === initialClientId) ? (initialClientId as string) : clients.some((c) => c.id === viewerClientId) ? (viewerClientId as string) : '',
  );
  const [version, setVersion] = useState(0);
  // The chosen client stays chosen while a search lists others.
  const seen = useRef(new Map<string, CheckClient>());
  for (const c of clients) seen.current.set(c.id, c);
  const client = seen.current.get(clientId) ?? null;
  const listed = client && !clients.some((c) => c.id === client.id) ? [client, ...clients] : clients;
  const self = client !== null && client.id === viewerClientId;
  return (
    <div className="space-y-8">
      {(listed.length > 1 || choices.searchable) && (
        <div className="card max-w-md space-y-4">
          <ClientSearch choices={choices} shown={clients.length} />
          <SelectField
            label="Client"
            value={clientId}
            onChange={(e) => setClientId(e.target.value)}
            options={[...(client ? [] : [{ value: '', label: 'Choose a client' }]), ...listed.map((c) => ({ value: c.id, label: c.name }))]}
          />
        </div>
      )}
      {client ? (
        <>
          <CheckEntry key={client.id} client={client} self={self} locale={locale} onSaved={() => setVersion((v) => v + 1)} />
          {/* Right under the form rather than above it: the caution's disclosure would be one more stop before the first reading. */}
          <CautionBanner compact />
          <section aria-labelledby="recent-h" className="space-y-3">
            <h2 id="recent-h" className="text-xl">
              {self ? 'Your recent checks' : `Recent checks for ${client.name}`}
            </h2>
            <RecentChecks clientId={client.id} clientName={client.name} self={self} timeZone={client.timeZone} locale={locale} version={version} />
          </section>
        </>
      ) : (
        <p className="text-lg">Choose the client the check is for.</p>
      )}
    </div>
  );
}

function CheckEntry({ client, self, locale, onSaved }: { client: CheckClient; self: boolean; locale: string; onSaved: () => void }) {
  const [draft, setDraft] = useState<CheckDraft>(emptyDraft);
  // "Nothing of these" as one choice that folds each list away: the short path for the usual, uneventful ride.
  const [noSigns, setNoSigns] = useState(false);
  const [skinNormal, setSkinNormal] = useState(false);
  const [sessions] = useApi<SessionsPage>(`/api/clients/${client.id}/sessions?limit=5`);
  const [errors, setErrors] = useState<DraftErrors>({});
  const [outcome, setOutcome] = useState<Outcome | null>(null);
  const [busy, setBusy] = useState(false);
  const [bpOpen, setBpOpen] = useState(!self);
  const [skinOpen, setSkinOpen] = useState(!self);
  const outcomeHeading = useRef<HTMLHeadingElement>(null);
  const errorSummary = useRef<HTMLDivElement>(null);
  const [focusTarget, setFocusTarget] = useState<'outcome' | 'errors' | null>(null);

  useEffect(() => {
    if (!focusTarget) return;
    const el = focusTarget === 'outcome' ? outcomeHeading.current : errorSummary.current;
    el?.scrollIntoView({ block: 'start' });
    el?.focus({ preventScroll: true });
    setFocusTarget(null);
  }, [focusTarget]);

  const setNumber = (key: NumberKey, value: string) => setDraft((d) => ({ ...d, numbers: { ...d.numbers, [key]: value } }));

  function showErrors(found: DraftErrors) {
    setErrors(found);
    if (Object.keys(found).some((k) => BP_KEYS.includes(k as NumberKey) || k.startsWith('bp'))) setBpOpen(true);
    if (Object.keys(found).some((k) => k.startsWith('skin'))) {
      setSkinOpen(true);
      setSkinNormal(false);
    }
    if (Object.keys(found).some((k) => k.startsWith('adSymptoms') || k.startsWith('otherEvents'))) setNoSigns(false);
    setFocusTarget('errors');
  }

  async function submit(e: FormEvent) {
    e.preventDefault();
    const { body, errors: found } = bodyFromDraft(draft);
    if (!body) return showErrors(found);
    setBusy(true);
    setErrors({});
    try {
      const saved = await api<SavedCheck>('POST', `/api/clients/${client.id}/checks`, body);
      setOutcome({ clientName: client.name, self, evaluation: saved.evaluation, adPlan: saved.adPlan ?? null });
      setDraft(emptyDraft());
      setNoSigns(false);
      setSkinNormal(false);
      setFocusTarget('outcome');
      onSaved();
    } catch (err) {
      const apiError = err as ApiError;
      const fields = apiError.body?.fields ?? [];
      showErrors(fields.length ? Object.fromEntries(fields.map((f) => [f.path || FORM_ERROR, f.message])) : { [FORM_ERROR]: apiError.message });
    } finally {
      setBusy(false);
    }
  }

  // Blood pressure before and after is the heart of a check; the other readings come after the first Save.
  const bloodPressure = (
    <div className="space-y-6">
      <Group id="check-before" title="Before the ride" hint="The top (systolic) and bottom (diastolic) numbers from the blood pressure monitor.">
        <div className="grid grid-cols-2 items-end gap-4 sm:flex sm:flex-wrap">
          <NumberInput field="bpBefore.systolic" value={draft.numbers['bpBefore.systolic']} error={errors['bpBefore.systolic']} onChange={setNumber} />
          <NumberInput field="bpBefore.diastolic" value={draft.numbers['bpBefore.diastolic']} error={errors['bpBefore.diastolic'] ?? errors.bpBefore} onChange={setNumber} />
        </div>
      </Group>
      <Group id="check-after" title="After the ride">
        <div className="grid grid-cols-2 items-end gap-4 sm:flex sm:flex-wrap">
          <NumberInput field="bpAfter.systolic" value={draft.numbers['bpAfter.systolic']} error={errors['bpAfter.systolic']} onChange={setNumber} />
          <NumberInput field="bpAfter.diastolic" value={draft.numbers['bpAfter.diastolic']} error={errors['bpAfter.diastolic'] ?? errors.bpAfter} onChange={setNumber} />
        </div>
      </Group>
    </div>
  );
  const moreReadings = (
    <Group id="check-more" title="More readings, if taken">
      <div className="grid grid-cols-2 items-end gap-4 sm:flex sm:flex-wrap">
        <NumberInput field="heartRateBefore" value={draft.numbers.heartRateBefore} error={errors.heartRateBefore} onChange={setNumber} />
        <NumberInput field="heartRateAfter" value={draft.numbers.heartRateAfter} error={errors.heartRateAfter} onChange={setNumber} />
        <NumberInput field="bpAfterMinutes" value={draft.numbers.bpAfterMinutes} error={errors.bpAfterMinutes} onChange={setNumber} />
      </div>
      <div id="check-during" className="grid grid-cols-2 items-end gap-4 sm:flex sm:flex-wrap">
        <NumberInput field="bpDuring.systolic" value={draft.numbers['bpDuring.systolic']} error={errors['bpDuring.systolic']} onChange={setNumber} />
        <NumberInput field="bpDuring.diastolic" value={draft.numbers['bpDuring.diastolic']} error={errors['bpDuring.diastolic'] ?? errors.bpDuring} onChange={setNumber} />
      </div>
    </Group>
  );
  const symptoms = (
    <Group
      id="check-symptoms"
      title={self ? 'Did you notice any warning signs, or did anything else happen?' : 'Warning signs of autonomic dysreflexia, and anything else that happened'}
      hint={self ? 'Tick any you have now or had during the ride.' : 'Tick any the rider has now or had during the ride.'}
    >
      <OneChoice
        checked={noSigns}
        onChange={(on) => {
          setNoSigns(on);
          if (on) setDraft((d) => ({ ...d, adSymptoms: [], otherEvents: [] }));
        }}
      >
        {self ? 'None: no warning signs and nothing else happened' : 'None: no warning signs and nothing else happened'}
      </OneChoice>
      {!noSigns && (
        <div className="space-y-4">
          <CheckboxList name="adSymptoms" options={AD_SYMPTOMS} labels={capitalised(AD_SYMPTOM_LABELS)} chosen={draft.adSymptoms} onChange={(adSymptoms) => setDraft((d) => ({ ...d, adSymptoms }))} />
          <div id="check-events" className="space-y-2">
            <p className="font-semibold">{self ? 'Anything else?' : 'Anything else'}</p>
            <CheckboxList name="otherEvents" options={OTHER_EVENTS} labels={capitalised(OTHER_EVENT_LABELS)} chosen={draft.otherEvents} onChange={(otherEvents) => setDraft((d) => ({ ...d, otherEvents }))} />
          </div>
        </div>
      )}
    </Group>
  );
  const skin = (
    <Group id="check-skin" title="Skin at the electrode sites" hint="Look at the skin under each electrode after the ride.">
      <OneChoice
        checked={skinNormal}
        onChange={(on) => {
          setSkinNormal(on);
          setDraft((d) => ({ ...d, skin: on ? Object.fromEntries(NAMED_CHANNELS.map((site) => [site, 'normal'])) : {} }));
        }}
      >
        Skin normal at every site
      </OneChoice>
      {!skinNormal && <SkinSites value={draft.skin} onChange={(s) => setDraft((d) => ({ ...d, skin: s }))} />}
    </Group>
  );
  const sessionChoice = (
    <div className="max-w-md">
      <SelectField
        id="check-session"
        label={self ? 'Which session was this?' : 'The session this check belongs to'}
        optional
        value={draft.sessionId}
        onChange={(e) => setDraft((d) => ({ ...d, sessionId: e.target.value }))}
        error={errors.sessionId}
        options={[
          { value: '', label: 'Not tied to a session' },
          ...(sessions.state === 'ready' ? sessions.data.sessions.map((s) => ({ value: s.id, label: formatDateTime(s.startedAt, locale, client.timeZone) })) : []),
        ]}
      />
    </div>
  );
  const effort = <EffortScale value={draft.effort} onChange={(v) => setDraft((d) => ({ ...d, effort: v }))} self={self} />;
  const comment = (
    <div id={COMMENT_ID}>
      <TextAreaField
        label={self ? 'Anything you would like the clinic to know' : 'Anything else for the clinic'}
        optional
        maxLength={2000}
        value={draft.comment}
        error={errors.comment}
        onChange={(e) => setDraft((d) => ({ ...d, comment: e.target.value }))}
      />
    </div>
  );

  const errorList = Object.entries(errors);
  const save = (
    <Button type="submit" busy={busy} className="min-h-14 px-8 text-lg">
      {busy ? 'Saving…' : 'Save check'}
    </Button>
  );
  return (
    <div className="space-y-6">
      {outcome && <CheckOutcome ref={outcomeHeading} outcome={outcome} />}
      <form onSubmit={submit} noValidate className="card space-y-8" aria-labelledby="check-form-h">
        <h2 id="check-form-h" className="text-2xl">
          {self ? 'How your ride went' : `A check for ${client.name}`}
        </h2>
        {errorList.length > 0 && (
          <div ref={errorSummary} tabIndex={-1}>
            <Alert tone="danger" title="The check is not saved yet. Please look at:">
              <ul className="list-disc space-y-1 pl-6">
                {errorList.map(([key, message]) => (
                  <li key={key}>
                    {key === FORM_ERROR ? message : <FieldLink target={fieldTarget(key)}>{message}</FieldLink>}
                  </li>
                ))}
              </ul>
            </Alert>
          </div>
        )}
        {self ? (
          <>
            {effort}
            {symptoms}
            {comment}
            <Fold title="Blood pressure and heart rate" open={bpOpen} onToggle={setBpOpen}>
              <div className="space-y-6">
                {bloodPressure}
                {moreReadings}
              </div>
            </Fold>
            <Fold title="Skin at the electrode sites" open={skinOpen} onToggle={setSkinOpen}>
              {skin}
            </Fold>
            {sessionChoice}
          </>
        ) : (
          <>
            {bloodPressure}
            {symptoms}
            {skin}
            {/* A save before the optional extras, so an uneventful check ends here. */}
            <div className="flex flex-wrap items-center gap-x-4 gap-y-2 border-t border-line pt-4">
              {save}
              <span className="text-ink-soft">or add more readings, the effort, a comment and the session below.</span>
            </div>
            {moreReadings}
            {effort}
            {comment}
            {sessionChoice}
          </>
        )}
        <p className="text-ink-soft">Kinloop keeps the time you save this as the time of the check.</p>
        {save}
      </form>
    </div>
  );
}

function capitalised<T extends string>(labels: Record<T, string>): Record<T, string> {
  return Object.fromEntries(Object.entries(labels).map(([k, v]) => [k, capitalise(v as string)])) as Record<T, string>;
}

/** The element an error's link should focus: the field, or the first control of its group. */
function fieldTarget(key: string): string {
  if (key in NUMBER_FIELDS) return fieldId(key);
  if (key === 'comment') return COMMENT_ID;
  if (key === 'bpBefore') return fieldId('bpBefore.diastolic');
  if (key === 'bpDuring') return fieldId('bpDuring.diastolic');
  if (key === 'bpAfter') return fieldId('bpAfter.diastolic');
  if (key.startsWith('skin')) return 'check-skin';
  if (key.startsWith('adSymptoms')) return 'check-symptoms';
  if (key.startsWith('otherEvents')) return 'check-events';
  if (key.startsWith('effort')) return 'check-effort';
  if (key === 'sessionId') return 'check-session';
  return 'check-form-h';
}

/** One large checkbox that stands for "none of the list" or "all normal", and folds the details away when ticked. */
function OneChoice({ checked, onChange, children }: { checked: boolean; onChange: (checked: boolean) => void; children: ReactNode }) {
  return (
    <label className="flex min-h-14 cursor-pointer items-center gap-3 rounded-lg border-2 border-lagoon bg-surface px-4 py-2 font-semibold has-[:checked]:bg-lagoon-tint">
      <input type="checkbox" checked={checked} onChange={(e) => onChange(e.target.checked)} className="h-7 w-7 shrink-0 accent-lagoon" />
      {children}
    </label>
  );
}

function Fold({ title, open, onToggle, children }: { title: string; open: boolean; onToggle: (open: boolean) => void; children: ReactNode }) {
  return (
    <details open={open} onToggle={(e) => onToggle(e.currentTarget.open)} className="group rounded-lg border-2 border-line">
      <summary className="flex min-h-14 cursor-pointer list-none items-center gap-3 px-4 text-lg font-semibold text-lagoon-dark [&::-webkit-details-marker]:hidden">
        <svg aria-hidden="true" width="20" height="20" viewBox="0 0 20 20" className="shrink-0 transition-transform group-open:rotate-90">
          <path d="M7 4l6 6-6 6" fill="none" stroke="currentColor" strokeWidth="2.5" strokeLinecap="round" strokeLinejoin="round" />
        </svg>
        {title}
      </summary>
      <div className="border-t border-line p-4">{children}</div>
    </details>
  );
}
