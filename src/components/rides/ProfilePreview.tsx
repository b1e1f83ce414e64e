import type { CanonicalField } from '../../lib/rides/types';
import { Alert } from '../ui/Alert';
import { channelLabel, number, PHASE_LABELS } from './format';
import { FIELD_LABELS } from './profile-draft';
import type { RideError } from './types';

export type PreviewAnswer =
  | {
      ok: true;
      encoding: string;
      delimiter: string;
      decimalComma: boolean;
      headerLine: number;
      columns: { header: string; field: CanonicalField | null; unit: string | null; problem: string | null }[];
      deviceSerial: string | null;
      startedAt: string | null;
      fields: string[];
      rows: (number | string | null)[][];
      warnings: string[];
    }
  | { ok: false; error: RideError };

const DELIMITERS: Record<string, string> = { ',': 'comma', ';': 'semicolon', '\t': 'tab', '|': 'vertical bar' };

const SERIES_LABELS: Record<string, string> = {
  't (s)': 'Time (s)',
  phase: 'Phase',
  cadenceRpm: 'Cadence (rpm)',
  powerW: 'Power (W)',
  distanceM: 'Distance (m)',
  heartRateBpm: 'Heart rate (bpm)',
  pulseWidthUs: 'Pulse width (µs)',
  frequencyHz: 'Frequency (Hz)',
};

function seriesLabel(key: string): string {
  const channel = /^(\w+) \(mA\)$/.exec(key);
  return SERIES_LABELS[key] ?? (channel ? `${channelLabel(channel[1])} (mA)` : key);
}

function cell(v: number | string | null): string {
  if (typeof v === 'number') return number(v, Number.isInteger(v) ? 0 : 2);
  if (v === null) return '—';
  return PHASE_LABELS[v] ?? v;
}

/** How a sample ride file reads with the draft profile: each header, the first rows, or the refusal. */
export function ProfilePreview({ answer }: { answer: PreviewAnswer }) {
  if (!answer.ok) {
    return (
      <Alert tone="danger" title={`This file would be refused${answer.error.line ? ` (line ${answer.error.line})` : ''}`}>
        <p>{answer.error.message}</p>
      </Alert>
    );
  }
  return (
    <div className="space-y-4">
      <p>
        Read as {answer.encoding}, {DELIMITERS[answer.delimiter] ?? `“${answer.delimiter}”`}-separated{answer.decimalComma ? ' with decimal commas' : ''}; the header row is line{' '}
        {answer.headerLine}.
        {answer.deviceSerial && (
          <>
            {' '}
            Device serial <strong>{answer.deviceSerial}</strong>.
          </>
        )}
        {answer.startedAt && <> Starts {new Date(answer.startedAt).toLocaleString()}.</>}
      </p>
      <div className="overflow-x-auto rounded-lg border border-line" role="region" aria-label="How each header was read" tabIndex={0}>
        <table className="w-full border-collapse text-left text-sm">
          <caption className="px-3 py-2 text-left font-semibold">How each header was read</caption>
          <thead className="bg-paper">
            <tr>
              <th scope="col" className="px-3 py-2">Header in the file</th>
              <th scope="col" className="px-3 py-2">Read as</th>
            </tr>
          </thead>
          <tbody>
            {answer.columns.map((c, i) => (
              <tr key={i} className="border-t border-line">
                <th scope="row" className="px-3 py-1.5 font-mono font-normal break-all">
                  {c.header}
                </th>
                <td className={`px-3 py-1.5 ${c.field ? '' : 'text-ink-soft italic'}`}>
                  {c.field ? `${FIELD_LABELS[c.field]}${c.unit ? ` in ${c.unit}` : ''}` : c.problem ? `Ignored: ${c.problem}` : 'Ignored'}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <div className="overflow-x-auto rounded-lg border border-line" role="region" aria-label="First rows as Kinloop reads them" tabIndex={0}>
        <table className="w-full border-collapse text-left text-sm">
          <caption className="px-3 py-2 text-left font-semibold">First rows as Kinloop reads them</caption>
          <thead className="bg-paper">
            <tr>
              {answer.fields.map((f) => (
                <th key={f} scope="col" className="px-3 py-2 whitespace-nowrap">
                  {seriesLabel(f)}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {answer.rows.map((r, i) => (
              <tr key={i} className="border-t border-line">
                {r.map((v, j) => (
                  <td key={j} className="px-3 py-1 tabular-nums whitespace-nowrap">
                    {cell(v)}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {answer.warnings.length > 0 && (
        <div>
          <p className="font-semibold">Warnings</p>
          <ul className="list-disc space-y-1 pl-6">
            {answer.warnings.map((w, i) => (
              <li key={i}>{w}</li>
            ))}
          </ul>
        </div>
      )}
    </div>
  );
}
