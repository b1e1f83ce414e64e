import { useEffect, useRef, useState } from 'react';
import { useApi } from '../api';
import { orderedChannels } from '../rides/channel-order';
import { channelLabel } from '../../lib/format/words';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { EmptyState } from '../ui/EmptyState';
import { Loaded } from '../ui/Loading';
import { formatDate } from '../../lib/time/format';
import type { PrescriptionLimits } from './prescription-limits';
import { PrescriptionForm } from './PrescriptionForm';
import { PrescriptionHistory } from './PrescriptionHistory';
import type { PrescriptionData, PrescriptionVersionView } from './types';

const or = (v: number | null, unit: string) => (v === null ? 'Not set' : `${v}${unit ? ` ${unit}` : ''}`);

function Details({ p, locale }: { p: PrescriptionVersionView; locale: string }) {
  const channels = orderedChannels(Object.keys(p.channels)).map((name) => [name, p.channels[name]] as const);
  return (
    <div className="space-y-4">
      <dl className="grid gap-x-6 gap-y-3 sm:grid-cols-3">
        <div><dt className="text-sm text-ink-soft">Sessions per week</dt><dd className="font-medium">{p.sessionsPerWeek}</dd></div>
        <div><dt className="text-sm text-ink-soft">Minutes per session</dt><dd className="font-medium">{p.minutesPerSession} min</dd></div>
        <div><dt className="text-sm text-ink-soft">Warm-up</dt><dd className="font-medium">{or(p.warmupMinutes, 'min')}</dd></div>
        <div><dt className="text-sm text-ink-soft">Target cadence</dt><dd className="font-medium">{p.targetCadenceRpm === null ? 'Not set' : `${p.targetCadenceRpm}${p.cadenceToleranceRpm !== null ? ` ± ${p.cadenceToleranceRpm}` : ''} rpm`}</dd></div>
        <div><dt className="text-sm text-ink-soft">Resistance level</dt><dd className="font-medium">{or(p.resistance, '')}</dd></div>
        <div><dt className="text-sm text-ink-soft">Effective from</dt><dd className="font-medium">{formatDate(p.effectiveFrom, locale, 'day')} (version {p.version})</dd></div>
      </dl>
      {channels.length > 0 && (
        <div className="overflow-x-auto rounded-lg border border-line" role="region" aria-label="Stimulation limits per channel" tabIndex={0}>
          <table className="w-full border-collapse text-left">
            <caption className="sr-only">Stimulation limits per channel</caption>
            <thead className="bg-paper">
              <tr>
                {['Channel', 'Max current', 'Pulse width', 'Frequency'].map((h) => (
                  <th key={h} scope="col" className="border-b border-line px-3 py-2 text-sm font-semibold whitespace-nowrap">{h}</th>
                ))}
              </tr>
            </thead>
            <tbody>
              {channels.map(([name, l]) => (
                <tr key={name} className="border-b border-line last:border-b-0">
                  <th scope="row" className="px-3 py-2 text-left font-medium">{channelLabel(name)}</th>
                  <td className="px-3 py-2">{l.maxCurrentMa === undefined ? '—' : `${l.maxCurrentMa} mA`}</td>
                  <td className="px-3 py-2">{l.pulseWidthUs === undefined ? '—' : `${l.pulseWidthUs} µs`}</td>
                  <td className="px-3 py-2">{l.frequencyHz === undefined ? '—' : `${l.frequencyHz} Hz`}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {p.notes && (
        <div>
          <p className="text-sm text-ink-soft">Notes</p>
          <p className="whitespace-pre-line">{p.notes}</p>
        </div>
      )}
    </div>
  );
}

/** The prescription in effect, its later and earlier versions, and (for the clinic's staff) the form for a new version. */
export default function Prescription({ clientId, manage, limits, today, locale, timeZone }: { clientId: string; manage: boolean; limits: PrescriptionLimits; today: string; locale: string; timeZone: string }) {
  const [data, reload] = useApi<PrescriptionData>(`/api/clients/${clientId}/prescription`);
  const [editing, setEditing] = useState(false);
  const [saved, setSaved] = useState<PrescriptionVersionView | null>(null);
  const opener = useRef<HTMLDivElement>(null);
  const savedMessage = useRef<HTMLDivElement>(null);
  const closedOnce = useRef(false);
  // Once the form closes, focus goes to the success message after a save (so it is read and the
  // next step starts from there), else back to the button that opened it: keyboard users keep their place.
  useEffect(() => {
    if (editing) closedOnce.current = true;
    else if (closedOnce.current) (savedMessage.current ?? opener.current?.querySelector('button'))?.focus();
  }, [editing, saved]);
  return (
    <Loaded value={data} reload={reload} label="the prescription">
      {(d) => (
        <div className="space-y-4">
          {saved && (
            <div ref={savedMessage} tabIndex={-1} data-testid="rx-saved">
              <Alert tone="success" live>
                Version {saved.version} saved; it applies from {formatDate(saved.effectiveFrom, locale, 'day')}.
              </Alert>
            </div>
          )}
          {manage && !editing && (
            <div ref={opener}>
              <Button
                onClick={() => {
                  setSaved(null);
                  setEditing(true);
                }}
              >
                {d.history.length ? 'Change the prescription' : 'Set the prescription'}
              </Button>
            </div>
          )}
          {manage && editing && (
            <PrescriptionForm
              clientId={clientId}
              limits={limits}
              latest={d.history[0] ?? null}
              today={today}
              locale={locale}
              timeZone={timeZone}
              onCancel={() => setEditing(false)}
              onSaved={(created) => {
                setSaved(created);
                setEditing(false);
                reload();
              }}
            />
          )}
          <div className="card space-y-4">
            <h3 className="text-lg">{d.current ? 'In effect now' : 'No prescription in effect yet'}</h3>
            {d.current ? <Details p={d.current} locale={locale} /> : !d.upcoming.length && <EmptyState title="No prescription yet">{manage ? 'Set the first version with the button above.' : 'The clinic has not set a prescription yet.'}</EmptyState>}
            {d.upcoming.map((u) => (
              <div key={u.id} className="space-y-3 border-t border-line pt-4">
                <h3 className="text-lg">Starting {formatDate(u.effectiveFrom, locale, 'day')}</h3>
                <Details p={u} locale={locale} />
              </div>
            ))}
          </div>
          {d.history.length > 0 && (
            <details className="card" open={manage}>
              <summary className="inline-flex min-h-12 cursor-pointer items-center font-semibold">Version history ({d.history.length})</summary>
              <div className="mt-3">
                <PrescriptionHistory data={d} locale={locale} timeZone={timeZone} />
              </div>
            </details>
          )}
        </div>
      )}
    </Loaded>
  );
}
