import { createColumnHelper } from '@tanstack/react-table';
import { useEffect, useRef, useState, type FormEvent } from 'react';
import { api, ApiError, useApi } from '../api';
import { PROFILES_CHANGED, type SavedProfile } from '../rides/profile-draft';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { DataTable } from '../ui/DataTable';
import { EmptyState } from '../ui/EmptyState';
import { SelectField, TextField } from '../ui/Field';
import { Loaded } from '../ui/Loading';

interface Device {
  id: string;
  clinicId: string;
  serial: string;
  name: string | null;
  importProfileId: string | null;
}

/** The clinic's cycles by serial, each optionally read with an import profile. */
export default function Devices({ clinicId }: { clinicId: string }) {
  const [devices, reloadDevices] = useApi<{ devices: Device[] }>('/api/devices');
  const [profiles, reloadProfiles] = useApi<{ profiles: SavedProfile[] }>('/api/import-profiles');
  const [serial, setSerial] = useState('');
  const [name, setName] = useState('');
  const [profileId, setProfileId] = useState('');
  const [saving, setSaving] = useState(false);
  const [error, setError] = useState<ApiError | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const serialBox = useRef<HTMLDivElement>(null);

  // Archiving a profile detaches it from devices, so both lists change.
  useEffect(() => {
    const refresh = () => {
      reloadProfiles();
      reloadDevices();
    };
    window.addEventListener(PROFILES_CHANGED, refresh);
    return () => window.removeEventListener(PROFILES_CHANGED, refresh);
  }, [reloadProfiles, reloadDevices]);

  const clinicProfiles = profiles.state === 'ready' ? profiles.data.profiles.filter((p) => p.clinicId === clinicId) : [];
  const profileName = (id: string | null) => (id ? (clinicProfiles.find((p) => p.id === id)?.name ?? 'A profile no longer offered') : 'Detect automatically');

  function edit(d: Device) {
    setSerial(d.serial);
    setName(d.name ?? '');
    setProfileId(d.importProfileId ?? '');
    setError(null);
    setNotice(null);
    serialBox.current?.querySelector('input')?.focus();
  }

  async function save(e: FormEvent) {
    e.preventDefault();
    setSaving(true);
    setError(null);
    setNotice(null);
    try {
      const saved = await api<Device>('POST', '/api/devices', { serial, ...(name.trim() ? { name } : {}), importProfileId: profileId || null });
      setNotice(`Saved device ${saved.serial}. Its ride files are read ${saved.importProfileId ? `with “${profileName(saved.importProfileId)}”` : 'with automatic detection'} unless the uploader chooses a profile.`);
      setSerial('');
      setName('');
      setProfileId('');
      reloadDevices();
    } catch (err) {
      setError(err as ApiError);
    } finally {
      setSaving(false);
    }
  }

  const col = createColumnHelper<Device>();
  const columns = [
    col.accessor('serial', { header: 'Serial', cell: (c) => <span className="font-mono font-semibold">{c.getValue()}</span> }),
    col.accessor((d) => d.name ?? '', { id: 'name', header: 'Name', cell: (c) => c.getValue() || '—' }),
    col.accessor((d) => profileName(d.importProfileId), { id: 'profile', header: 'Import profile' }),
    col.display({
      id: 'actions',
      header: 'Actions',
      cell: (c) => (
        <Button variant="secondary" onClick={() => edit(c.row.original)}>
          Change<span className="sr-only"> device {c.row.original.serial}</span>
        </Button>
      ),
    }),
  ];

  return (
    <section aria-labelledby="devices-h" className="space-y-4">
      <h2 id="devices-h" className="text-xl">
        Device serials
      </h2>
      <p className="max-w-prose text-ink-soft">
        A ride file that names its device serial is read with the profile attached to that serial, unless the person uploading chooses another.
      </p>
      <div className="grid items-start gap-6 lg:grid-cols-2">
        <Loaded value={devices} reload={reloadDevices} label="devices">
          {({ devices }) => (
            <DataTable
              caption="Devices"
              columns={columns}
              data={devices.filter((d) => d.clinicId === clinicId)}
              rowKey={(d) => d.id}
              initialSort={[{ id: 'serial', desc: false }]}
              empty={<EmptyState title="No devices registered">Register a cycle by its serial to read its files with an import profile.</EmptyState>}
            />
          )}
        </Loaded>
        <form method="post" onSubmit={save} noValidate className="card space-y-4">
          <h3 className="text-lg">Register or change a device</h3>
          {notice && (
            <Alert tone="success" live>
              {notice}
            </Alert>
          )}
          {error && (
            <Alert tone="danger" live>
              {error.message}
            </Alert>
          )}
          <div ref={serialBox}>
            <TextField
              label="Serial"
              value={serial}
              onChange={(e) => setSerial(e.target.value)}
              help="As the ride files write it. Saving a serial that is already registered changes that device."
              error={error?.field('serial')}
              autoComplete="off"
              spellCheck={false}
            />
          </div>
          <TextField label="Name" optional value={name} onChange={(e) => setName(e.target.value)} help="For example the room or the client it is lent to." autoComplete="off" />
          <SelectField
            label="Import profile"
            optional
            value={profileId}
            onChange={(e) => setProfileId(e.target.value)}
            error={error?.field('importProfileId')}
            options={[{ value: '', label: 'Detect the layout automatically' }, ...clinicProfiles.map((p) => ({ value: p.id, label: p.deviceName ? `${p.name} (${p.deviceName})` : p.name }))]}
          />
          <Button type="submit" busy={saving}>
            Save device
          </Button>
        </form>
      </div>
    </section>
  );
}
