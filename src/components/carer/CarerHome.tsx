import { useApi } from '../api';
import { formatDateTime } from '../../lib/time/format';
import { localDate } from '../../lib/time/local-date';
import type { ClientChoice, WeekData } from '../rider/types';
import { WeekDots } from '../rider/WeekDots';
import { nextDueWords, shortNote, weekHeadline } from '../rider/week-words';
import { EmptyState } from '../ui/EmptyState';
import { Loaded } from '../ui/Loading';

/** The carer's home: each linked client's week, with the two things a carer does for them. */
export default function CarerHome({ clientIds, locale }: { clientIds: string[]; locale: string }) {
  const [clients, reload] = useApi<{ clients: ClientChoice[] }>('/api/clients?linked=1&limit=200');
  return (
    <Loaded value={clients} reload={reload} label="your clients">
      {({ clients }) => {
        const linked = clients.filter((c) => clientIds.includes(c.id));
        if (!linked.length) return <EmptyState title="No linked clients">Once a clinic links you to a client, their week shows here.</EmptyState>;
        return (
          <ul className="grid gap-6 lg:grid-cols-2">
            {linked.map((c) => (
              <ClientCard key={c.id} client={c} locale={locale} />
            ))}
          </ul>
        );
      }}
    </Loaded>
  );
}

function ClientCard({ client, locale }: { client: ClientChoice; locale: string }) {
  const [week, reload] = useApi<WeekData>(`/api/clients/${client.id}/week`);
  const headingId = `client-${client.id}-h`;
  return (
    <li className="card flex flex-col gap-4" aria-labelledby={headingId} data-testid="carer-client">
      <h2 id={headingId} className="text-2xl">
        {client.name}
      </h2>
      <Loaded value={week} reload={reload} label={`${client.name}’s week`}>
        {(w) => {
          const today = localDate(new Date(), w.timeZone);
          const due = nextDueWords(w, today, locale);
          const short = shortNote(w);
          return (
            <div className="space-y-3">
              <p className="text-xl font-semibold" data-testid="carer-week">
                {weekHeadline(w)}
              </p>
              <WeekDots counted={w.counted} prescribed={w.prescribed} size="small" />
              {short && <p className="text-ink-soft">{short}</p>}
              <p className="text-lg" data-testid="carer-next-due">
                {due.headline}
                {due.detail && <span className="block text-base text-ink-soft">{due.detail}</span>}
              </p>
              <p>{w.lastUploadAt ? `Ride files last uploaded ${formatDateTime(w.lastUploadAt, locale, w.timeZone, 'weekdayDayMonth')}.` : 'No ride files uploaded yet.'}</p>
            </div>
          );
        }}
      </Loaded>
      <div className="mt-auto flex flex-wrap gap-3">
        <a href={`/upload?clientId=${client.id}`} className="btn btn-primary min-h-14 w-full text-center sm:w-auto">
          Upload rides for {client.name}
        </a>
        <a href={`/checks?clientId=${client.id}`} className="btn btn-secondary min-h-14 w-full text-center sm:w-auto">
          Record a check for {client.name}
        </a>
      </div>
      <p className="flex flex-wrap gap-x-6">
        <a href={`/clients/${client.id}`} className="inline-flex min-h-12 items-center font-medium">
          {client.name}’s sessions and progress
        </a>
        <a href={`/my-prescription?clientId=${client.id}`} className="inline-flex min-h-12 items-center font-medium">
          {client.name}’s prescription
        </a>
      </p>
    </li>
  );
}
