import { createColumnHelper } from '@tanstack/react-table';
import { useState } from 'react';
import { api, ApiError, useApi } from '../api';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { DataTable } from '../ui/DataTable';
import { EmptyState } from '../ui/EmptyState';
import { Loaded } from '../ui/Loading';
import InviteForm from './InviteForm';
import { formatDateTime } from '../../lib/time/format';

interface Staff {
  userId: string;
  name: string;
  email: string;
  role: 'admin' | 'therapist';
  disabled: boolean;
  since: string;
}
interface Invitation {
  id: string;
  email: string;
  role: string;
  clientName: string | null;
  expiresAt: string;
}

const ROLE_WORDS = { admin: 'Administrator', therapist: 'Therapist', client: 'Client', carer: 'Carer' } as Record<string, string>;

export default function StaffManager({ selfId, locale, timeZone }: { selfId: string; locale: string; timeZone: string }) {
  const [staff, reloadStaff] = useApi<{ staff: Staff[] }>('/api/staff');
  const [invites, reloadInvites] = useApi<{ invitations: Invitation[] }>('/api/invitations');
  const [error, setError] = useState<ApiError | null>(null);
  const [busyId, setBusyId] = useState<string | null>(null);

  async function change(userId: string, body: object) {
    setBusyId(userId);
    setError(null);
    try {
      await api('PATCH', `/api/staff/${userId}`, body);
      reloadStaff();
    } catch (err) {
      setError(err as ApiError);
    } finally {
      setBusyId(null);
    }
  }
  async function revoke(id: string) {
    setError(null);
    try {
      await api('POST', `/api/invitations/${id}/revoke`);
      reloadInvites();
    } catch (err) {
      setError(err as ApiError);
    }
  }

  const col = createColumnHelper<Staff>();
  const columns = [
    col.accessor('name', { header: 'Name', cell: (c) => <span className="font-semibold">{c.getValue()}</span> }),
    col.accessor('email', { header: 'E-mail' }),
    col.accessor('role', { header: 'Role', cell: (c) => ROLE_WORDS[c.getValue()] }),
    col.accessor('disabled', { header: 'Account', cell: (c) => (c.getValue() ? 'Disabled' : 'Active') }),
    col.display({
      id: 'actions',
      header: 'Actions',
      cell: (c) => {
        const s = c.row.original;
        if (s.userId === selfId) return <span className="text-sm text-ink-soft">You</span>;
        return (
          <div className="flex flex-wrap gap-2">
            <Button
              variant="secondary"
              busy={busyId === s.userId}
              onClick={() => change(s.userId, { role: s.role === 'admin' ? 'therapist' : 'admin' })}
            >
              {/* The visible words start the accessible name, so a voice user can say them. */}
              {s.role === 'admin' ? 'Make therapist' : 'Make administrator'}
              <span className="sr-only">: {s.name}</span>
            </Button>
            <Button
              variant={s.disabled ? 'secondary' : 'danger'}
              busy={busyId === s.userId}
              onClick={() => change(s.userId, { disabled: !s.disabled })}
            >
              {s.disabled ? 'Enable account' : 'Disable account'}
              <span className="sr-only">: {s.name}</span>
            </Button>
          </div>
        );
      },
    }),
  ];

  return (
    <div className="space-y-8">
      {error && (
        <Alert tone="danger" live>
          {error.message}
        </Alert>
      )}
      <section aria-labelledby="staff-h" className="space-y-3">
        <h2 id="staff-h" className="text-xl">Staff of the clinic</h2>
        <Loaded value={staff} reload={reloadStaff} label="staff">
          {({ staff }) => <DataTable caption="Staff" columns={columns} data={staff} rowKey={(s) => s.userId} empty={<EmptyState title="No staff yet" />} />}
        </Loaded>
      </section>
      <section aria-labelledby="invite-h" className="grid gap-6 lg:grid-cols-2">
        <div className="space-y-3">
          <h2 id="invite-h" className="text-xl">Invite a colleague</h2>
          <InviteForm roles={['therapist', 'admin']} onSent={reloadInvites} />
        </div>
        <div className="space-y-3">
          <h2 className="text-xl">Invitations waiting for an answer</h2>
          <Loaded value={invites} reload={reloadInvites} label="invitations">
            {({ invitations }) =>
              invitations.length ? (
                <ul className="space-y-2">
                  {invitations.map((i) => (
                    <li key={i.id} className="card flex flex-wrap items-center justify-between gap-2">
                      <span>
                        <strong>{i.email}</strong> as {ROLE_WORDS[i.role]?.toLowerCase()}
                        {i.clientName ? ` of ${i.clientName}` : ''}
                        <span className="block text-sm text-ink-soft">Expires {formatDateTime(i.expiresAt, locale, timeZone)}</span>
                      </span>
                      <Button variant="quiet" onClick={() => revoke(i.id)}>
                        Withdraw invitation to {i.email}
                      </Button>
                    </li>
                  ))}
                </ul>
              ) : (
                <EmptyState title="No open invitations" />
              )
            }
          </Loaded>
        </div>
      </section>
    </div>
  );
}
