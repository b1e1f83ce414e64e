import { createColumnHelper } from '@tanstack/react-table';
import { DIAGNOSIS_LABELS, levelLabel } from '../../lib/clients/labels';
import type { ClientView } from '../../lib/clients/view';
import { useApi } from '../api';
import { DataTable } from '../ui/DataTable';
import { EmptyState } from '../ui/EmptyState';
import { Loaded } from '../ui/Loading';

const col = createColumnHelper<ClientView>();
const columns = [
  col.accessor('name', {
    header: 'Client',
    cell: (c) => (
      <a href={`/clients/${c.row.original.id}`} className="inline-flex min-h-11 items-center font-semibold">
        {c.getValue()}
      </a>
    ),
  }),
  col.accessor('diagnosis', { header: 'Diagnosis', cell: (c) => DIAGNOSIS_LABELS[c.getValue()] }),
  col.accessor((c) => levelLabel(c.injuryLevel, c.aisGrade) ?? '', { id: 'level', header: 'Level', cell: (c) => c.getValue() || '—' }),
  col.accessor('programStart', { header: 'Program start', cell: (c) => c.getValue() ?? '—' }),
  col.accessor('timeZone', { header: 'Time zone' }),
];

export default function ClientList() {
  const [clients, reload] = useApi<{ clients: ClientView[] }>('/api/clients?limit=200');
  return (
    <Loaded value={clients} reload={reload} label="clients">
      {({ clients }) => (
        <DataTable
          caption="Clients"
          columns={columns}
          data={clients}
          rowKey={(c) => c.id}
          initialSort={[{ id: 'name', desc: false }]}
          empty={<EmptyState title="No clients yet">Clients appear here once they are added to your clinic or linked to you.</EmptyState>}
        />
      )}
    </Loaded>
  );
}
