import { useState, type FormEvent } from 'react';
import type { FlagThresholds } from '../../lib/flags/thresholds';
import { api, ApiError, useApi } from '../api';
import { formErrorText } from '../client/form-errors';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import CautionBanner from '../ui/CautionBanner';
import { SelectField, TextField } from '../ui/Field';
import { formatDateTime } from '../../lib/time/format';
import { Loaded } from '../ui/Loading';

interface Settings {
  clinicId: string;
  name: string;
  timeZone: string;
  locale: string | null;
  defaultLocale: string;
  flagThresholds: FlagThresholds;
  defaults: FlagThresholds;
}

type Key = keyof FlagThresholds;
interface Threshold {
  key: Key;
  label: string;
  unit: string;
  explain: string;
}

const GROUPS: { title: string; intro: string; items: Threshold[] }[] = [
  {
    title: 'When a session counts',
    intro: 'Adherence, the streak and the missed-sessions flag only count sessions that last long enough.',
    items: [
      { key: 'countThresholdPct', label: 'A session counts from', unit: '% of the prescribed minutes', explain: 'A session shorter than this share of the prescribed minutes is “too short” and does not count towards the week.' },
      { key: 'shortSessionsOfLast3', label: 'How many of the last three sessions were short', unit: '', explain: 'When this many of the last three sessions were too short to count, a short-sessions flag (for information) is raised.' },
    ],
  },
  {
    title: 'Missed sessions',
    intro: 'A finished week with fewer counted sessions than prescribed raises a flag for review; a long stretch with no session at all is urgent.',
    items: [{ key: 'missedNoSessionDays', label: 'Days without a session before it is urgent', unit: 'days', explain: 'Program days with no session at all, counted from the last session. Paused days and days without a prescription are left out.' }],
  },
  {
    title: 'The usual level',
    intro: 'Power and current per watt are compared with the client’s usual level: the median of their recent counted sessions, leaving out the latest two.',
    items: [
      { key: 'baselineSessions', label: 'Sessions that make up the usual level', unit: 'sessions', explain: 'How many counted sessions before the latest two the median is taken over.' },
      { key: 'baselineMinSessions', label: 'Fewest sessions before comparing', unit: 'sessions', explain: 'Until a client has this many such sessions, power and current are not compared at all. It cannot be more than the number above.' },
    ],
  },
  {
    title: 'Power and current',
    intro: 'Both of the latest two counted sessions have to cross a line before a flag is raised, so one off day does not.',
    items: [
      { key: 'powerDropReviewPct', label: 'Power drop for review', unit: '% below the usual level', explain: 'Mean power this far below the usual level raises a power-drop flag for review.' },
      { key: 'powerDropUrgentPct', label: 'Power drop that is urgent', unit: '% below the usual level', explain: 'This far below, the power-drop flag is urgent. It must be at least the review drop.' },
      { key: 'currentRiseReviewPct', label: 'Current rise for review', unit: '% above the usual level', explain: 'Stimulation current per watt this far above the usual level raises a current-rise flag for review: the muscles may be tiring or the electrodes may need a look.' },
    ],
  },
];
const KEYS = GROUPS.flatMap((g) => g.items.map((i) => i.key));

const asText = (t: FlagThresholds) => Object.fromEntries(KEYS.map((k) => [k, String(t[k])])) as Record<Key, string>;

function ThresholdsForm({ settings }: { settings: Settings }) {
  const [values, setValues] = useState(() => asText(settings.flagThresholds));
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<ApiError | null>(null);
  const [saved, setSaved] = useState(false);

  async function submit(e: FormEvent) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    setSaved(false);
    const body = Object.fromEntries(KEYS.map((k) => {
      const t = values[k].trim().replace(',', '.');
      return [k, /^-?\d+(\.\d+)?$/.test(t) ? Number(t) : t === '' ? null : t];
    }));
    try {
      const next = await api<Settings>('PUT', `/api/clinic/settings?clinicId=${settings.clinicId}`, body);
      setValues(asText(next.flagThresholds));
      setSaved(true);
    } catch (err) {
      setError(err as ApiError);
    } finally {
      setBusy(false);
    }
  }

  return (
    <form method="post" onSubmit={submit} noValidate className="space-y-6">
      {saved && (
        <Alert tone="success" live>
          Thresholds saved. Every client of {settings.name} is being judged again with them; triage updates within a minute or so.
        </Alert>
      )}
      {error && (
        <Alert tone="danger" live>
          {formErrorText(error, (p) => (KEYS as string[]).includes(p))}
        </Alert>
      )}
      {GROUPS.map((g) => (
        <div key={g.title} className="card">
          <fieldset className="space-y-4">
          <legend className="text-lg font-semibold">{g.title}</legend>
          <p className="text-ink-soft">{g.intro}</p>
          <div className="grid gap-5 md:grid-cols-2">
            {g.items.map((i) => (
              <TextField
                key={i.key}
                label={i.unit ? `${i.label} (${i.unit})` : i.label}
                inputMode="decimal"
                autoComplete="off"
                className="field-input max-w-40"
                value={values[i.key]}
                onChange={(e) => setValues((v) => ({ ...v, [i.key]: e.target.value }))}
                help={`${i.explain} Kinloop’s default: ${settings.defaults[i.key]}.`}
                error={error?.field(i.key)}
              />
            ))}
          </div>
          </fieldset>
        </div>
      ))}
      <div className="flex flex-wrap gap-3">
        <Button type="submit" busy={busy}>
          Save thresholds
        </Button>
        <Button variant="secondary" onClick={() => setValues(asText(settings.defaults))}>
          Fill in Kinloop’s defaults
        </Button>
      </div>
    </form>
  );
}

// English as written in these places: the words stay English, the order of day
// and month and the clock follow the choice.
const LOCALES: { tag: string; name: string }[] = [
  { tag: 'en-GB', name: 'United Kingdom' },
  { tag: 'en-IE', name: 'Ireland' },
  { tag: 'en-US', name: 'United States' },
  { tag: 'en-CA', name: 'Canada' },
  { tag: 'en-AU', name: 'Australia' },
  { tag: 'en-NZ', name: 'New Zealand' },
  { tag: 'en-ZA', name: 'South Africa' },
  { tag: 'en-IN', name: 'India' },
  { tag: 'en-DE', name: 'Germany' },
  { tag: 'en-NL', name: 'Netherlands' },
  { tag: 'en-SE', name: 'Sweden' },
];
const SAMPLE = '2026-11-23T14:05:00Z';

function DateFormatForm({ settings }: { settings: Settings }) {
  const [choice, setChoice] = useState(settings.locale ?? '');
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<ApiError | null>(null);
  const [saved, setSaved] = useState(false);
  const sample = (tag: string) => formatDateTime(SAMPLE, tag, settings.timeZone, 'day');
  const known = LOCALES.find((l) => l.tag === settings.defaultLocale);

  async function submit(e: FormEvent) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    setSaved(false);
    try {
      await api<Settings>('PATCH', `/api/clinic/settings?clinicId=${settings.clinicId}`, { locale: choice || null });
      setSaved(true);
    } catch (err) {
      setError(err as ApiError);
    } finally {
      setBusy(false);
    }
  }

  return (
    <form method="post" onSubmit={submit} noValidate className="card space-y-4">
      <h2 className="text-lg font-semibold">How dates and times are written</h2>
      {saved && (
        <Alert tone="success" live>
          Saved. Pages show dates this way from the next one you open.
        </Alert>
      )}
      {error && (
        <Alert tone="danger" live>
          {error.message}
        </Alert>
      )}
      <div className="max-w-md">
        <SelectField
          label="Date format"
          value={choice}
          onChange={(e) => setChoice(e.target.value)}
          help="For every page, report and e-mail of the clinic. The words stay English."
          options={[
            { value: '', label: `From the clinic’s time zone: ${known?.name ?? settings.defaultLocale} (${sample(settings.defaultLocale)})` },
            ...LOCALES.map((l) => ({ value: l.tag, label: `${l.name} (${sample(l.tag)})` })),
          ]}
        />
      </div>
      <Button type="submit" busy={busy}>
        Save the date format
      </Button>
    </form>
  );
}

/** The clinic's flag thresholds, explained, with Kinloop's defaults beside them. */
export default function ClinicSettings({ clinicId }: { clinicId: string }) {
  const [settings, reload] = useApi<Settings>(`/api/clinic/settings?clinicId=${clinicId}`);
  return (
    <div className="space-y-6">
      <CautionBanner compact />
      <Loaded value={settings} reload={reload} label="the clinic settings">
        {(s) => (
          <div className="space-y-6">
            <div className="card">
              <p className="text-lg font-semibold">{s.name}</p>
              <p className="text-ink-soft">Clinic time zone: {s.timeZone}</p>
            </div>
            <p className="max-w-prose">
              Flags point the clinic’s therapists to clients who may need a look. These thresholds decide when each flag is raised; they apply to every client of the clinic. Flags help with supervision; they do not replace clinical judgement.
            </p>
            <DateFormatForm settings={s} />
            <ThresholdsForm settings={s} />
          </div>
        )}
      </Loaded>
    </div>
  );
}
