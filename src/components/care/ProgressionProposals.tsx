import { useRef, useState } from 'react';
import { NOT_CLEARED_CAUTION } from '../../lib/checks/safety-text';
import { api, ApiError, useApi } from '../api';
import { formatDate } from '../../lib/time/format';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { TextField } from '../ui/Field';
import { Loaded } from '../ui/Loading';

interface Proposal {
  id: string;
  clientId: string;
  clientName?: string;
  isoWeek: string;
  proposed: { minutesPerSession?: number; resistance?: number };
  evidence: {
    counted: number;
    prescribed: number;
    openUrgentFlags: number;
    currentPerWatt: { lastWeekMedian: number | null; beforeMedian: number | null; risePct: number | null; limitPct: number };
    kind: 'minutes' | 'resistance';
    from: number;
    to: number;
  };
  state: string;
  decidedBy: { name: string | null } | null;
  proposedAt: string;
}

const what = (p: Proposal) => (p.evidence.kind === 'minutes' ? `${p.evidence.from} → ${p.evidence.to} minutes per session` : `resistance ${p.evidence.from} → ${p.evidence.to}`);

function Evidence({ p }: { p: Proposal }) {
  const c = p.evidence.currentPerWatt;
  return (
    <ul className="list-disc space-y-1 pl-6">
      <li>
        Week {p.isoWeek}: {p.evidence.counted} of {p.evidence.prescribed} prescribed sessions counted.
      </li>
      <li>No urgent flag open when it was proposed.</li>
      <li>
        {c.risePct === null
          ? 'Current per watt: not enough readings to compare.'
          : `Current per watt ${c.lastWeekMedian} mA/W against ${c.beforeMedian} mA/W before (${c.risePct > 0 ? '+' : ''}${c.risePct} %, within the clinic’s ${c.limitPct} %).`}
      </li>
    </ul>
  );
}

/**
 * Proposals to step a program up, with their evidence: the therapist accepts
 * (a new prescription version from the next Monday), edits the step, or
 * dismisses. With `clientId`, one client's open proposal; without, the
 * clinic's "ready to progress" list beside triage.
 */
export default function ProgressionProposals({ clientId, locale, startsOn }: { clientId?: string; locale: string; startsOn?: string }) {
  const url = clientId ? `/api/clients/${clientId}/progressions` : '/api/progressions';
  const [data, reload] = useApi<{ proposals: Proposal[]; startsOn?: string }>(url);
  const [message, setMessage] = useState('');
  const heading = useRef<HTMLParagraphElement>(null);
  return (
    <div className="space-y-3">
      <div role="status" aria-live="polite">
        {message && (
          <p ref={heading} tabIndex={-1} className="rounded-lg border-l-4 border-moss bg-moss-tint px-4 py-3" data-testid="progression-message">
            {message}
          </p>
        )}
      </div>
      <Loaded value={data} reload={reload} label="the progression proposals">
        {({ proposals, startsOn: from }) => {
          const open = proposals.filter((p) => p.state === 'open');
          if (!open.length) return <p className="text-ink-soft">{clientId ? 'No step is proposed: the progression criteria were not all met last week, or the prescription has no progression plan.' : 'No rider is ready for the next step today.'}</p>;
          return (
            <ul className="space-y-3" aria-label={clientId ? 'Proposed step' : 'Ready to progress'}>
              {open.map((p) => (
                <ProposalCard
                  key={p.id}
                  p={p}
                  locale={locale}
                  startsOn={from ?? startsOn}
                  onDone={(text) => {
                    setMessage(text);
                    reload();
                    setTimeout(() => heading.current?.focus(), 0);
                  }}
                />
              ))}
            </ul>
          );
        }}
      </Loaded>
    </div>
  );
}

function ProposalCard({ p, locale, startsOn, onDone }: { p: Proposal; locale: string; startsOn?: string; onDone: (text: string) => void }) {
  const [editing, setEditing] = useState(false);
  const [value, setValue] = useState(String(p.evidence.to));
  const [reason, setReason] = useState('');
  const [needsReason, setNeedsReason] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<ApiError | null>(null);
  const label = p.clientName ?? 'this client';

  async function decide(action: 'accept' | 'dismiss') {
    setBusy(true);
    setError(null);
    try {
      const edited = editing ? (p.evidence.kind === 'minutes' ? { minutesPerSession: Number(value) } : { resistance: Number(value) }) : {};
      await api('POST', `/api/progressions/${p.id}`, { action, ...(action === 'accept' ? edited : {}), ...(needsReason && reason ? { notClearedReason: reason } : {}) });
      onDone(action === 'accept' ? `Accepted for ${label}: the new version starts ${startsOn ? formatDate(startsOn, locale, 'day') : 'next Monday'}.` : `Dismissed the proposal for ${label}.`);
    } catch (err) {
      const e = err as ApiError;
      if (e.body.code === 'not_cleared') setNeedsReason(e.message);
      else setError(e);
    } finally {
      setBusy(false);
    }
  }

  return (
    <li className="card space-y-2" data-testid="progression-proposal">
      <p className="text-lg font-semibold">
        {p.clientName ? (
          <a href={`/clients/${p.clientId}/prescription#progression`} className="inline-flex min-h-12 items-center">
            {p.clientName}
          </a>
        ) : null}
        {p.clientName ? ': ' : ''}
        {what(p)}
      </p>
      <Evidence p={p} />
      {error && (
        <Alert tone="danger" live>
          {error.message}
        </Alert>
      )}
      {editing && (
        <div className="max-w-xs">
          <TextField label={p.evidence.kind === 'minutes' ? 'Minutes per session' : 'Resistance'} inputMode="decimal" value={value} onChange={(e) => setValue(e.target.value)} error={error?.field(p.evidence.kind === 'minutes' ? 'minutesPerSession' : 'resistance')} />
        </div>
      )}
      {needsReason && (
        <div className="space-y-2">
          <Alert tone="caution" title="Not cleared">
            {needsReason}
          </Alert>
          <TextField label="Reason for going on without a current clearance" value={reason} onChange={(e) => setReason(e.target.value)} />
          <p className="text-sm text-ink-soft">{NOT_CLEARED_CAUTION}</p>
        </div>
      )}
      <div className="flex flex-wrap gap-2">
        <Button busy={busy} onClick={() => decide('accept')}>
          {editing ? 'Accept with this value' : 'Accept'}
          <span className="sr-only"> the step for {label}</span>
        </Button>
        {!editing && (
          <Button variant="secondary" onClick={() => setEditing(true)}>
            Edit the step<span className="sr-only"> for {label}</span>
          </Button>
        )}
        <Button variant="secondary" busy={busy} onClick={() => decide('dismiss')}>
          Dismiss<span className="sr-only"> the step for {label}</span>
        </Button>
      </div>
    </li>
  );
}
