import { useEffect, useRef, useState, type FormEvent, type ReactNode } from 'react';
import { channelLabel } from '../../lib/format/words';
import { NAMED_CHANNELS } from '../../lib/rides/types';
import { formatDate } from '../../lib/time/format';
import { api, ApiError } from '../api';
import { orderedChannels } from '../rides/channel-order';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { FieldLink } from '../ui/FieldLink';
import { SelectField, TextAreaField, TextField } from '../ui/Field';
import { announceProgramChange } from './changes';
import type { CHANNEL_FIELDS, LIMITED_FIELDS, PrescriptionLimits } from './prescription-limits';
import { channelLimitsText } from './prescription-wording';
import type { PrescriptionVersionView } from './types';

type Scalar = (typeof LIMITED_FIELDS)[number];
type ChannelField = (typeof CHANNEL_FIELDS)[number];
type ChannelRow = { key: number; channel: string } & Record<ChannelField, string>;

const text = (v: number | null | undefined) => (v === null || v === undefined ? '' : String(v));

/** A typed number as the API takes it; anything else goes as typed, so the server's message names the field. */
function numberOf(typed: string, required: boolean): number | string | null | undefined {
  const t = typed.trim().replace(',', '.');
  if (t === '') return required ? null : undefined;
  return /^-?\d+(\.\d+)?$/.test(t) ? Number(t) : typed;
}

let nextKey = 0;
function rowsOf(channels: PrescriptionVersionView['channels']): ChannelRow[] {
  return orderedChannels(Object.keys(channels)).map((channel) => {
    const l = channels[channel];
    return { key: nextKey++, channel, maxCurrentMa: text(l.maxCurrentMa), pulseWidthUs: text(l.pulseWidthUs), frequencyHz: text(l.frequencyHz) };
  });
}

const fieldId = (path: string) => `rx-${path.replace(/\./g, '-')}`;

/**
 * The form for a new prescription version, filled in with the latest one.
 * Saving never edits a version: it adds the next one from its effective date.
 * Short paths for keyboard and switch users: the channel limits stay folded
 * while unchanged, the effective date is one choice ("today") unless another
 * is wanted, and a refused save puts a summary with links to each field at
 * the top and moves focus to it. The notes of the version before are shown,
 * never carried over unless asked for.
 */
export function PrescriptionForm({
  clientId,
  limits,
  latest,
  today,
  locale,
  timeZone,
  onSaved,
  onCancel,
}: {
  clientId: string;
  limits: PrescriptionLimits;
  latest: PrescriptionVersionView | null;
  today: string;
  locale: string;
  timeZone: string;
  onSaved: (created: PrescriptionVersionView) => void;
  onCancel: () => void;
}) {
  const [values, setValues] = useState<Record<Scalar, string>>({
    sessionsPerWeek: text(latest?.sessionsPerWeek ?? 3),
    minutesPerSession: text(latest?.minutesPerSession ?? 30),
    warmupMinutes: text(latest?.warmupMinutes),
    targetCadenceRpm: text(latest?.targetCadenceRpm),
    cadenceToleranceRpm: text(latest?.cadenceToleranceRpm),
    resistance: text(latest?.resistance),
  });
  const [channels, setChannels] = useState<ChannelRow[]>(() => rowsOf(latest?.channels ?? {}));
  const [channelsOpen, setChannelsOpen] = useState(!latest || Object.keys(latest.channels).length === 0);
  const [keepNotes, setKeepNotes] = useState(false);
  const [notes, setNotes] = useState('');
  const earliest = latest && latest.effectiveFrom > today ? latest.effectiveFrom : today;
  const [startsToday, setStartsToday] = useState(earliest === today);
  const [effectiveFrom, setEffectiveFrom] = useState(earliest);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<ApiError | null>(null);
  const heading = useRef<HTMLHeadingElement>(null);
  const summary = useRef<HTMLDivElement>(null);
  const firstChannelField = useRef<HTMLDivElement>(null);
  useEffect(() => heading.current?.focus(), []);
  useEffect(() => {
    if (error) summary.current?.focus();
  }, [error]);

  const range = (f: keyof PrescriptionLimits, unit: string) => `${limits[f].min}–${limits[f].max}${unit ? ` ${unit}` : ''}`;
  const set = (f: Scalar) => (e: { target: { value: string } }) => setValues((v) => ({ ...v, [f]: e.target.value }));
  const setRow = (key: number, change: Partial<ChannelRow>) => setChannels((rows) => rows.map((r) => (r.key === key ? { ...r, ...change } : r)));
  const unused = NAMED_CHANNELS.filter((c) => !channels.some((r) => r.channel === c));
  const previousNotes = latest?.notes?.trim() ? latest.notes : null;

  function addChannel() {
    setChannels((rows) => [...rows, { key: nextKey++, channel: unused[0], maxCurrentMa: '', pulseWidthUs: '', frequencyHz: '' }]);
  }

  async function submit(e: FormEvent) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    const chosenNotes = keepNotes && previousNotes ? previousNotes : notes;
    const body = {
      sessionsPerWeek: numberOf(values.sessionsPerWeek, true),
      minutesPerSession: numberOf(values.minutesPerSession, true),
      warmupMinutes: numberOf(values.warmupMinutes, false),
      targetCadenceRpm: numberOf(values.targetCadenceRpm, false),
      cadenceToleranceRpm: numberOf(values.cadenceToleranceRpm, false),
      resistance: numberOf(values.resistance, false),
      channels: Object.fromEntries(
        channels.map((r) => [r.channel, { maxCurrentMa: numberOf(r.maxCurrentMa, false), pulseWidthUs: numberOf(r.pulseWidthUs, false), frequencyHz: numberOf(r.frequencyHz, false) }]),
      ),
      ...(chosenNotes.trim() ? { notes: chosenNotes } : {}),
      effectiveFrom: startsToday ? today : effectiveFrom,
    };
    try {
      const created = await api<PrescriptionVersionView>('PUT', `/api/clients/${clientId}/prescription`, body);
      announceProgramChange();
      onSaved(created);
    } catch (err) {
      const apiError = err as ApiError;
      if (apiError.body.fields?.some((f) => f.path.startsWith('channels.'))) setChannelsOpen(true);
      if (apiError.field('effectiveFrom')) setStartsToday(false);
      setError(apiError);
      setBusy(false);
    }
  }

  const number = { inputMode: 'decimal' as const, autoComplete: 'off', className: 'field-input max-w-40' };
  const idOf = (path: string) => ({ id: fieldId(path) });
  const fields = error?.body.fields ?? [];

  return (
    <form method="post" onSubmit={submit} noValidate className="card space-y-6" aria-labelledby="rx-form-h">
      <div>
        <h3 id="rx-form-h" ref={heading} tabIndex={-1} className="text-lg">
          New prescription version
        </h3>
        <p className="text-sm text-ink-soft">Saving adds version {(latest?.version ?? 0) + 1}; earlier versions stay as they were. The ranges in the help text are those reported for FES cycling programmes, or Kinloop’s own plausibility limits.</p>
      </div>
      {error && (
        <div ref={summary} tabIndex={-1} data-testid="rx-error-summary">
          <Alert tone="danger" title="The new version is not saved yet." live>
            {fields.length ? (
              <ul className="list-disc space-y-1 pl-6">
                {fields.map((f) => (
                  <li key={f.path}>
                    <FieldLink target={fieldId(f.path)}>{f.message}</FieldLink>
                  </li>
                ))}
              </ul>
            ) : (
              <p>{error.message}</p>
            )}
          </Alert>
        </div>
      )}

      <fieldset className="space-y-4">
        <legend className="mb-2 font-semibold">Sessions</legend>
        <div className="grid gap-4 sm:grid-cols-2">
          <TextField label="Sessions per week" {...number} {...idOf('sessionsPerWeek')} value={values.sessionsPerWeek} onChange={set('sessionsPerWeek')} help={`${range('sessionsPerWeek', '')}; 3 is usual.`} error={error?.field('sessionsPerWeek')} />
          <TextField label="Minutes per session" {...number} {...idOf('minutesPerSession')} value={values.minutesPerSession} onChange={set('minutesPerSession')} help={`${range('minutesPerSession', 'minutes')}, warm-up included; about 30 is usual.`} error={error?.field('minutesPerSession')} />
          <TextField label="Warm-up minutes" optional {...number} {...idOf('warmupMinutes')} value={values.warmupMinutes} onChange={set('warmupMinutes')} help={`Motor-driven pedalling before stimulation, ${range('warmupMinutes', 'minutes')}, shorter than the session.`} error={error?.field('warmupMinutes')} />
        </div>
      </fieldset>

      <fieldset className="space-y-4">
        <legend className="mb-2 font-semibold">Pedalling</legend>
        <div className="grid gap-4 sm:grid-cols-3">
          <TextField label="Target cadence (rpm)" optional {...number} {...idOf('targetCadenceRpm')} value={values.targetCadenceRpm} onChange={set('targetCadenceRpm')} help={range('targetCadenceRpm', 'rpm')} error={error?.field('targetCadenceRpm')} />
          <TextField label="Cadence tolerance (± rpm)" optional {...number} {...idOf('cadenceToleranceRpm')} value={values.cadenceToleranceRpm} onChange={set('cadenceToleranceRpm')} help={`How far either side of the target, ${range('cadenceToleranceRpm', 'rpm')}`} error={error?.field('cadenceToleranceRpm')} />
          <TextField label="Resistance level" optional {...number} {...idOf('resistance')} value={values.resistance} onChange={set('resistance')} help={`The cycle’s setting, ${range('resistance', '')}`} error={error?.field('resistance')} />
        </div>
      </fieldset>

      <fieldset className="space-y-3">
        <legend className="mb-1 font-semibold">Stimulation limits per channel</legend>
        {!channelsOpen ? (
          <div className="space-y-2">
            <p className="text-ink-soft">As in version {latest?.version}:</p>
            <ul className="list-disc pl-6">
              {channels.map((r) => (
                <li key={r.key}>
                  {channelLabel(r.channel)}: {channelLimitsText({ maxCurrentMa: numberOf(r.maxCurrentMa, false) as number | undefined, pulseWidthUs: numberOf(r.pulseWidthUs, false) as number | undefined, frequencyHz: numberOf(r.frequencyHz, false) as number | undefined })}
                </li>
              ))}
            </ul>
            <Button
              variant="secondary"
              onClick={() => {
                setChannelsOpen(true);
                requestAnimationFrame(() => firstChannelField.current?.querySelector<HTMLElement>('select, input')?.focus());
              }}
            >
              Change the channel limits
            </Button>
          </div>
        ) : (
          <div ref={firstChannelField} className="space-y-3">
            <p className="text-sm text-ink-soft">
              Max current {range('maxCurrentMa', 'mA')} (up to 140 mA is usual), pulse width {range('pulseWidthUs', 'µs')} (300 µs is usual), frequency {range('frequencyHz', 'Hz')} (35 Hz is usual). Leave a value empty when there is no limit to set.
            </p>
            {channels.length === 0 && <p className="text-ink-soft">No channel limits in this version.</p>}
            {channels.map((r, i) => {
              const path = (f: ChannelField) => `channels.${r.channel}.${f}`;
              const options = [r.channel, ...unused].filter((c, j, all) => all.indexOf(c) === j);
              return (
                <div key={r.key} role="group" aria-label={`Channel row ${i + 1}: ${channelLabel(r.channel)}`} className="grid items-end gap-3 rounded-lg border border-line bg-paper p-3 sm:grid-cols-2 lg:grid-cols-[1.4fr_1fr_1fr_1fr_auto]">
                  <SelectField label="Channel" value={r.channel} onChange={(e) => setRow(r.key, { channel: e.target.value })} options={options.map((c) => ({ value: c, label: channelLabel(c) }))} />
                  <TextField label="Max current (mA)" required={false} {...number} {...idOf(path('maxCurrentMa'))} value={r.maxCurrentMa} onChange={(e) => setRow(r.key, { maxCurrentMa: e.target.value })} error={error?.field(path('maxCurrentMa'))} />
                  <TextField label="Pulse width (µs)" required={false} {...number} {...idOf(path('pulseWidthUs'))} value={r.pulseWidthUs} onChange={(e) => setRow(r.key, { pulseWidthUs: e.target.value })} error={error?.field(path('pulseWidthUs'))} />
                  <TextField label="Frequency (Hz)" required={false} {...number} {...idOf(path('frequencyHz'))} value={r.frequencyHz} onChange={(e) => setRow(r.key, { frequencyHz: e.target.value })} error={error?.field(path('frequencyHz'))} />
                  <Button variant="quiet" onClick={() => setChannels((rows) => rows.filter((x) => x.key !== r.key))}>
                    Remove<span className="sr-only"> {channelLabel(r.channel)}</span>
                  </Button>
                </div>
              );
            })}
            {unused.length > 0 && (
              <Button variant="secondary" onClick={addChannel}>
                Add a channel
              </Button>
            )}
          </div>
        )}
      </fieldset>

      <div className="space-y-3">
        {previousNotes && (
          <div className="rounded-lg border border-line bg-paper p-3">
            <p className="text-sm text-ink-soft">Notes of version {latest!.version}</p>
            <p className="whitespace-pre-line">{previousNotes}</p>
            <label className="mt-2 flex min-h-12 cursor-pointer items-center gap-3 font-medium">
              <input type="checkbox" checked={keepNotes} onChange={(e) => setKeepNotes(e.target.checked)} className="h-6 w-6 accent-lagoon" />
              Keep these notes for version {latest!.version + 1}
            </label>
          </div>
        )}
        {!(keepNotes && previousNotes) && (
          <TextAreaField
            label={`Notes for version ${(latest?.version ?? 0) + 1}`}
            optional
            {...idOf('notes')}
            value={notes}
            maxLength={2000}
            onChange={(e) => setNotes(e.target.value)}
            help="Shown with the prescription to the client and carers, for example electrode placement or when to stop."
            error={error?.field('notes')}
          />
        )}
      </div>

      <fieldset className="space-y-2" id={fieldId('effectiveFrom')}>
        <legend className="font-semibold">Effective from</legend>
        <p className="text-sm text-ink-soft">The first day it applies, in the client’s time zone ({timeZone}).</p>
        <div className="flex flex-wrap gap-2">
          <Choice name="rx-starts" checked={startsToday} disabled={earliest !== today} onChange={() => setStartsToday(true)}>
            Today, {formatDate(today, locale, 'day')}
          </Choice>
          <Choice name="rx-starts" checked={!startsToday} onChange={() => setStartsToday(false)}>
            A later date
          </Choice>
        </div>
        {!startsToday && (
          <div className="max-w-xs">
            <TextField label="First day" type="date" min={earliest} value={effectiveFrom} onChange={(e) => setEffectiveFrom(e.target.value)} error={error?.field('effectiveFrom')} />
          </div>
        )}
      </fieldset>
      <div className="flex flex-wrap gap-3">
        <Button type="submit" busy={busy}>
          Save as version {(latest?.version ?? 0) + 1}
        </Button>
        <Button variant="quiet" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

function Choice({ name, checked, disabled, onChange, children }: { name: string; checked: boolean; disabled?: boolean; onChange: () => void; children: ReactNode }) {
  return (
    <label className="flex min-h-12 cursor-pointer items-center gap-2 rounded-lg border-2 border-line px-3 has-[:checked]:border-lagoon has-[:checked]:bg-lagoon-tint has-[:disabled]:cursor-not-allowed has-[:disabled]:opacity-60">
      <input type="radio" name={name} checked={checked} disabled={disabled} onChange={onChange} className="h-5 w-5 accent-lagoon" />
      {children}
    </label>
  );
}
