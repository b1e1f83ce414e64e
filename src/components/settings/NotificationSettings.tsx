import { useState, type FormEvent } from 'react';
import { api, ApiError, useApi } from '../api';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { Loaded } from '../ui/Loading';

type Kind = 'reminders' | 'weeklySummary' | 'dailyDigest' | 'urgentAlerts' | 'messages';
type Settings = Record<Kind, boolean>;
interface SettingsData extends Settings {
  applicable: Settings;
}

const KINDS: { kind: Kind; label: string; help: string }[] = [
  { kind: 'reminders', label: 'Session reminders', help: 'An e-mail in the evening of a day a ride is due, when no ride has arrived that day.' },
  { kind: 'weeklySummary', label: 'Weekly summary', help: 'Each Monday morning: the past week’s rides against the prescription.' },
  { kind: 'dailyDigest', label: 'Therapists’ daily digest', help: 'Each morning: the clients with open flags.' },
  { kind: 'urgentAlerts', label: 'Immediate alerts for urgent flags', help: 'An e-mail as soon as a check or a session raises an urgent flag. E-mail can be delayed; it is not an alarm.' },
  { kind: 'messages', label: 'New messages', help: 'An e-mail saying a message is waiting in Kinloop. It never contains the message itself.' },
];

/** Which e-mails Kinloop sends this person; only the kinds that fit their roles are offered. */
export default function NotificationSettings({ email }: { email: string }) {
  const [loaded, reload] = useApi<SettingsData>('/api/me/notifications');
  return (
    <Loaded value={loaded} reload={reload} label="your e-mail settings">
      {(data) => <SettingsForm data={data} email={email} />}
    </Loaded>
  );
}

function SettingsForm({ data, email }: { data: SettingsData; email: string }) {
  const offered = KINDS.filter((k) => data.applicable[k.kind]);
  const [values, setValues] = useState<Settings>({ reminders: data.reminders, weeklySummary: data.weeklySummary, dailyDigest: data.dailyDigest, urgentAlerts: data.urgentAlerts, messages: data.messages });
  const [busy, setBusy] = useState(false);
  const [status, setStatus] = useState('');
  const [error, setError] = useState<string | null>(null);

  async function submit(e: FormEvent) {
    e.preventDefault();
    setBusy(true);
    setStatus('');
    setError(null);
    try {
      const saved = await api<SettingsData>('PUT', '/api/me/notifications', values);
      setValues({ reminders: saved.reminders, weeklySummary: saved.weeklySummary, dailyDigest: saved.dailyDigest, urgentAlerts: saved.urgentAlerts, messages: saved.messages });
      const on = KINDS.filter((k) => saved.applicable[k.kind] && saved[k.kind]).map((k) => k.label.toLowerCase());
      setStatus(on.length ? `Saved. Kinloop will send: ${on.join(', ')}.` : 'Saved. Kinloop will not send you these e-mails.');
    } catch (err) {
      setError((err as ApiError).message);
    } finally {
      setBusy(false);
    }
  }

  if (!offered.length) return <p className="card">None of Kinloop’s e-mails apply to your account, so there is nothing to set here.</p>;
  return (
    <form onSubmit={submit} className="card space-y-5">
      <fieldset className="space-y-3">
        <legend className="text-lg font-semibold">E-mails to {email}</legend>
        {offered.map((k) => (
          <label key={k.kind} className="flex min-h-14 cursor-pointer items-start gap-3 rounded-lg border-2 border-line px-4 py-3 has-[:checked]:border-lagoon has-[:checked]:bg-lagoon-tint">
            <input
              type="checkbox"
              className="mt-0.5 h-7 w-7 shrink-0 accent-lagoon"
              checked={values[k.kind]}
              onChange={(e) => setValues((v) => ({ ...v, [k.kind]: e.target.checked }))}
            />
            <span>
              <span className="block font-semibold">{k.label}</span>
              <span className="block text-ink-soft">
                {k.help}
              </span>
            </span>
          </label>
        ))}
      </fieldset>
      {error && (
        <Alert tone="danger" title="Not saved" live>
          <p>{error}</p>
        </Alert>
      )}
      <div className="flex flex-wrap items-center gap-4">
        <Button type="submit" busy={busy} className="min-h-14 px-8 text-lg">
          Save e-mail settings
        </Button>
        <p role="status" className="font-medium text-moss">
          {status}
        </p>
      </div>
    </form>
  );
}
