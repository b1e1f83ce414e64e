import { createColumnHelper } from '@tanstack/react-table';
import { useMemo, useState } from 'react';
import { useApi } from '../api';
import { DataTable } from '../ui/DataTable';
import { EmptyState } from '../ui/EmptyState';
import { TextField } from '../ui/Field';
import { Loaded } from '../ui/Loading';
import { formatDateTime } from '../../lib/time/format';

interface Entry {
  id: number;
  at: string;
  action: string;
  actor: { name: string; email: string } | null;
  clientName: string | null;
  recordType: string | null;
  ip: string | null;
}

const col = createColumnHelper<Entry>();
const columnsFor = (locale: string, timeZone: string) => [
  col.accessor('at', { header: 'When', cell: (c) => formatDateTime(c.getValue(), locale, timeZone) }),
  col.accessor((e) => e.actor?.name ?? 'Not signed in', { id: 'who', header: 'Who' }),
  col.accessor('action', { header: 'What', cell: (c) => <code className="text-sm">{c.getValue()}</code> }),
  col.accessor((e) => e.clientName ?? '', { id: 'client', header: 'Client', cell: (c) => c.getValue() || '—' }),
  col.accessor((e) => e.ip ?? '', { id: 'ip', header: 'From' }),
];

/** Times in the clinic's zone and locale. */
export default function AuditLog({ locale, timeZone }: { locale: string; timeZone: string }) {
  const columns = useMemo(() => columnsFor(locale, timeZone), [locale, timeZone]);
  const [action, setAction] = useState('');
  const url = `/api/audit?limit=200${action.trim() ? `&action=${encodeURIComponent(action.trim())}` : ''}`;
  const [entries, reload] = useApi<{ entries: Entry[] }>(url);
  return (
    <div className="space-y-4">
      <div className="max-w-sm">
        <TextField label="Filter by action" optional help="For example auth. or client.view" value={action} onChange={(e) => setAction(e.target.value)} />
      </div>
      <Loaded value={entries} reload={reload} label="the audit log">
        {({ entries }) => (
          <DataTable caption="Audit log" columns={columns} data={entries} rowKey={(e) => String(e.id)} empty={<EmptyState title="Nothing recorded yet" />} />
        )}
      </Loaded>
    </div>
  );
}
