import { orderedChannels } from './channel-order';
import { channelLabel, distance, duration, minutes, withUnit } from './format';
import type { SessionSummary } from './types';

const SOURCE_NOTES: Record<string, string> = {
  file_modified: 'The file has no start time; this is when the file was last changed.',
  upload_time: 'The file has no start time; this is when it was uploaded.',
};

function Figure({ term, value, note }: { term: string; value: string; note?: string }) {
  const missing = value === '—';
  return (
    <div className="rounded-lg border border-line bg-surface px-4 py-3">
      <dt className="text-sm text-ink-soft">{term}</dt>
      {missing ? <dd className="pt-1 text-ink-soft">Not in the ride file</dd> : <dd className="text-xl font-semibold tabular-nums">{value}</dd>}
      {note && !missing && <dd className="text-sm text-ink-soft">{note}</dd>}
    </div>
  );
}

/** The headline numbers of a session, each with its unit. */
export function SessionFigures({ summary: s, startedLabel, timeZone, startedAtSource }: { summary: SessionSummary; startedLabel: string; timeZone: string; startedAtSource: string }) {
  return (
    <dl className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-4">
      <div className="col-span-2 rounded-lg border border-line bg-surface px-4 py-3">
        <dt className="text-sm text-ink-soft">Started</dt>
        <dd className="text-xl font-semibold">{startedLabel}</dd>
        <dd className="text-sm text-ink-soft">{SOURCE_NOTES[startedAtSource] ?? `Local time of the client (${timeZone}).`}</dd>
      </div>
      <Figure term="Duration" value={duration(s.durationS)} />
      <Figure term="Active" value={minutes(s.activeS)} />
      <Figure term="Warm-up" value={minutes(s.passiveS)} />
      <Figure term="Cool-down" value={minutes(s.cooldownS)} />
      <Figure term="Mean power" value={withUnit(s.meanPowerW, 1, 'W')} note="while active" />
      <Figure term="Peak power over 5 s" value={withUnit(s.peakPower5sW, 1, 'W')} />
      <Figure term="Work" value={withUnit(s.workKj, 1, 'kJ')} />
      <Figure term="Distance" value={distance(s.distanceM)} />
      <Figure term="Mean cadence" value={withUnit(s.meanCadenceRpm, 0, 'rpm')} note="while active" />
      <Figure term="Current per watt" value={withUnit(s.currentPerWattMaPerW, 2, 'mA/W')} note="all channels’ mean current ÷ mean power" />
      <Figure term="Pulse width" value={withUnit(s.pulseWidthUs, 0, 'µs')} />
      <Figure term="Frequency" value={withUnit(s.frequencyHz, 0, 'Hz')} />
    </dl>
  );
}

/** Mean and highest current of each channel. */
export function ChannelTable({ channels }: { channels: SessionSummary['channels'] }) {
  const names = orderedChannels(Object.keys(channels)) as (keyof typeof channels)[];
  if (!names.length) return <p className="text-ink-soft">The ride file has no channel current columns.</p>;
  return (
    <div className="overflow-x-auto rounded-xl border border-line bg-surface" role="region" aria-label="Current per channel" tabIndex={0}>
      <table className="w-full border-collapse text-left">
        <caption className="sr-only">Current per channel</caption>
        <thead className="bg-paper">
          <tr>
            <th scope="col" className="px-3 py-2">Channel</th>
            <th scope="col" className="px-3 py-2 text-right">Mean current while active</th>
            <th scope="col" className="px-3 py-2 text-right">Highest current</th>
          </tr>
        </thead>
        <tbody>
          {names.map((n) => (
            <tr key={n} className="border-t border-line">
              <th scope="row" className="px-3 py-2 font-medium">{channelLabel(n)}</th>
              <td className="px-3 py-2 text-right tabular-nums">{withUnit(channels[n]?.meanCurrentMa, 1, 'mA')}</td>
              <td className="px-3 py-2 text-right tabular-nums">{withUnit(channels[n]?.maxCurrentMa, 1, 'mA')}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
