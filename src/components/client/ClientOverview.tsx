import { useApi } from '../api';
import { Loaded } from '../ui/Loading';
import { useOnProgramChange } from './changes';
import { formatDate } from '../../lib/time/format';
import { doseSummary, riding } from './prescription-wording';
import type { AdherenceData, PrescriptionData } from './types';

function Figure({ label, value, detail }: { label: string; value: string; detail: string }) {
  return (
    <div className="rounded-lg bg-paper px-4 py-3">
      <dt className="text-sm text-ink-soft">{label}</dt>
      <dd>
        <span className="block text-2xl font-semibold">{value}</span>
        <span className="block text-sm text-ink-soft">{detail}</span>
      </dd>
    </div>
  );
}

/** The program at a glance: the prescription in effect, the streak and the last four weeks' adherence. */
export default function ClientOverview({ clientId, locale, prescriptionHref }: { clientId: string; locale: string; prescriptionHref: string }) {
  const [prescription, reloadPrescription] = useApi<PrescriptionData>(`/api/clients/${clientId}/prescription`);
  const [adherence, reloadAdherence] = useApi<AdherenceData>(`/api/clients/${clientId}/adherence?weeks=12`);
  useOnProgramChange(reloadPrescription);
  useOnProgramChange(reloadAdherence);
  return (
    <div className="grid gap-3 lg:grid-cols-2">
      <div className="rounded-lg bg-lagoon-tint px-4 py-3">
        <p className="text-sm text-ink-soft">Prescription in effect</p>
        <div>
          <Loaded value={prescription} reload={reloadPrescription} label="the prescription">
            {({ current, upcoming }) => (
              <>
                {current ? (
                  <>
                    <span className="block font-semibold">{doseSummary(current)}</span>
                    {riding(current) && <span className="block">{riding(current)}</span>}
                    <span className="block text-sm text-ink-soft">
                      Version {current.version}, since {formatDate(current.effectiveFrom, locale, 'day')}
                    </span>
                  </>
                ) : (
                  <span className="block font-semibold">No prescription in effect yet</span>
                )}
                {upcoming.map((u) => (
                  <span key={u.id} className="mt-1 block text-sm">
                    From {formatDate(u.effectiveFrom, locale, 'day')}: {doseSummary(u)} (version {u.version})
                  </span>
                ))}
                <a href={prescriptionHref} className="mt-1 inline-flex min-h-12 items-center font-medium">
                  Prescription details
                </a>
              </>
            )}
          </Loaded>
        </div>
      </div>
      <Loaded value={adherence} reload={reloadAdherence} label="adherence">
        {({ streakWeeks, adherence4wPct }) => (
          <dl className="grid gap-3 sm:grid-cols-2">
            <Figure
              label="Streak"
              value={`${streakWeeks} ${streakWeeks === 1 ? 'week' : 'weeks'}`}
              detail="in a row with every prescribed session done; paused weeks do not break it"
            />
            <Figure
              label="Adherence, last 4 weeks"
              value={adherence4wPct === null ? '—' : `${adherence4wPct} %`}
              detail={adherence4wPct === null ? 'no finished, unpaused week with a prescription yet' : 'of prescribed sessions done in the last four finished, unpaused weeks'}
            />
          </dl>
        )}
      </Loaded>
    </div>
  );
}
