import { useEffect, useId, useRef, useState } from 'react';
import { api, ApiError, useApi } from '../api';
import { ClientSearch, useClientChoices, type ClientChoices } from '../clients/client-choices';
import { Button } from '../ui/Button';
import { EmptyState } from '../ui/EmptyState';
import { SelectField } from '../ui/Field';
import { Loaded } from '../ui/Loading';
import { DropZone } from './DropZone';
import { sendRideFile, type RideFileRequest } from './send-ride-file';
import { settleUpload } from './settle-upload';
import type { UploadOutcome, UploadStage } from './types';
import { outcomeSentence, UploadItem, type UploadEntry } from './UploadItem';
import { RecentUploads } from './RecentUploads';

interface ClientChoice {
  id: string;
  clinicId: string;
  name: string;
  timeZone: string;
}
interface ProfileChoice {
  id: string;
  clinicId: string;
  name: string;
  deviceName: string | null;
}

// Two files in flight keep a slow line busy without starving the other rows' progress.
const SENDING_AT_ONCE = 2;

export default function UploadRides({ initialClientId }: { initialClientId: string | null }) {
  const choices = useClientChoices<ClientChoice>(initialClientId);
  const [profiles] = useApi<{ profiles: ProfileChoice[] }>('/api/import-profiles');
  return (
    <Loaded value={choices.value} reload={choices.reload} label="your clients">
      {({ clients }) =>
        clients.length || choices.searchable ? (
          <Uploader clients={clients} choices={choices} profiles={profiles.state === 'ready' ? profiles.data.profiles : []} initialClientId={initialClientId} />
        ) : (
          <EmptyState title="No client to upload for">Ride files are uploaded for a client. Once a clinic links you to a client, you can upload their rides here.</EmptyState>
        )
      }
    </Loaded>
  );
}

function Uploader({ clients, choices, profiles, initialClientId }: { clients: ClientChoice[]; choices: ClientChoices<ClientChoice>; profiles: ProfileChoice[]; initialClientId: string | null }) {
  const [clientId, setClientId] = useState(() =>
    clients.length === 1 && !choices.searchable ? clients[0].id : clients.some((c) => c.id === initialClientId) ? initialClientId! : '',
  );
  // The chosen client stays chosen while a search lists others.
  const seen = useRef(new Map<string, ClientChoice>());
  for (const c of clients) seen.current.set(c.id, c);
  const [profileId, setProfileId] = useState('');
  const [entries, setEntries] = useState<UploadEntry[]>([]);
  const [messages, setMessages] = useState<string[]>([]);
  // Counts answers of this visit, so the list of recent files reloads after each.
  const [finished, setFinished] = useState(0);
  const jobs = useRef(new Map<string, RideFileRequest & { entry: UploadEntry }>());
  const queue = useRef<string[]>([]);
  const sending = useRef(0);
  const counter = useRef(0);
  const listHeading = useId();

  const client = seen.current.get(clientId) ?? null;
  const listed = client && !clients.some((c) => c.id === client.id) ? [client, ...clients] : clients;
  const clinicProfiles = client ? profiles.filter((p) => p.clinicId === client.clinicId) : [];

  // A file dropped beside the drop zone would otherwise make the browser leave the page to show it.
  useEffect(() => {
    const guard = (e: DragEvent) => {
      if (Array.from(e.dataTransfer?.types ?? []).includes('Files')) e.preventDefault();
    };
    window.addEventListener('dragover', guard);
    window.addEventListener('drop', guard);
    return () => {
      window.removeEventListener('dragover', guard);
      window.removeEventListener('drop', guard);
    };
  }, []);

  function setStage(key: string, stage: UploadStage) {
    setEntries((list) => list.map((e) => (e.key === key ? { ...e, stage } : e)));
  }

  function finish(key: string, outcome: UploadOutcome) {
    const job = jobs.current.get(key);
    if (!job) return;
    setStage(key, { stage: 'done', outcome });
    setMessages((m) => [...m, outcomeSentence(job.entry, outcome)]);
    setFinished((n) => n + 1);
  }

  async function send(key: string) {
    const job = jobs.current.get(key)!;
    setStage(key, { stage: 'sending', loaded: 0, total: job.file.size });
    const sent = await sendRideFile(job, (loaded, total) => setStage(key, { stage: 'sending', loaded, total }));
    if (!sent.ok) {
      finish(key, { kind: 'failed', message: sent.message });
      return;
    }
    setStage(key, { stage: 'reading' });
    // Reading may take a while; it does not hold a sending slot.
    void settleUpload(sent.result).then((outcome) => finish(key, outcome));
  }

  function pump() {
    while (sending.current < SENDING_AT_ONCE && queue.current.length) {
      const key = queue.current.shift()!;
      sending.current++;
      void send(key).finally(() => {
        sending.current--;
        pump();
      });
    }
  }

  function add(files: File[]) {
    if (!client) return;
    const added = files.map((file) => {
      const entry: UploadEntry = { key: `f${++counter.current}`, file, clientName: client.name, timeZone: client.timeZone, stage: { stage: 'waiting' } };
      jobs.current.set(entry.key, { clientId: client.id, importProfileId: profileId || null, file, entry });
      return entry;
    });
    setEntries((list) => [...list, ...added]);
    queue.current.push(...added.map((e) => e.key));
    setMessages((m) => [...m, `Sending ${files.length === 1 ? files[0].name : `${files.length} ride files`} for ${client.name}.`]);
    pump();
  }

  function retry(key: string) {
    setStage(key, { stage: 'waiting' });
    queue.current.push(key);
    pump();
  }

  // A stored file Kinloop could not read: ask for it to be read again, and follow it as before.
  async function tryAgain(key: string, uploadId: string) {
    const job = jobs.current.get(key);
    if (!job) return;
    setStage(key, { stage: 'reading' });
    try {
      await api('POST', `/api/uploads/${uploadId}/reprocess`);
    } catch (err) {
      finish(key, { kind: 'failed', message: err instanceof ApiError ? err.message : 'Kinloop could not be reached. Try again in a moment.' });
      return;
    }
    finish(key, await settleUpload({ name: job.file.name, uploadId, status: 'queued' }));
  }

  function clearFinished() {
    const done = entries.filter((e) => e.stage.stage === 'done').map((e) => e.key);
    for (const key of done) jobs.current.delete(key);
    setEntries((list) => list.filter((e) => !done.includes(e.key)));
  }

  const counts = { accepted: 0, duplicate: 0, refused: 0, unread: 0, failed: 0, open: 0 };
  for (const e of entries) {
    if (e.stage.stage === 'done') counts[e.stage.outcome.kind]++;
    else counts.open++;
  }
  const tally = [
    counts.accepted && `${counts.accepted} accepted`,
    counts.duplicate && `${counts.duplicate} already in Kinloop`,
    counts.refused && `${counts.refused} refused`,
    counts.unread && `${counts.unread} could not be read`,
    counts.failed && `${counts.failed} not uploaded`,
    counts.open && `${counts.open} in progress`,
  ].filter(Boolean);

  return (
    <div className="space-y-6">
      <div className="space-y-4">
        <ClientSearch choices={choices} shown={clients.length} />
        {listed.length > 1 || choices.searchable ? (
          <SelectField
            label="Client"
            value={clientId}
            onChange={(e) => {
              setClientId(e.target.value);
              setProfileId('');
            }}
            options={[{ value: '', label: 'Choose a client' }, ...listed.map((c) => ({ value: c.id, label: c.name }))]}
          />
        ) : (
          <p>
            Ride files for <strong>{clients[0].name}</strong>
          </p>
        )}
        {clinicProfiles.length > 0 && (
          <SelectField
            label="Import profile"
            optional
            value={profileId}
            onChange={(e) => setProfileId(e.target.value)}
            help="Leave this on automatic detection unless the clinic asked you to use a profile for your cycle."
            options={[
              { value: '', label: 'Detect the layout automatically' },
              ...clinicProfiles.map((p) => ({ value: p.id, label: p.deviceName ? `${p.name} (${p.deviceName})` : p.name })),
            ]}
          />
        )}
      </div>

      <DropZone
        disabled={!client}
        label={client ? 'Choose ride files, or drop them here' : 'Choose the client first'}
        hint={
          client
            ? `The CSV files the cycle exported, one per ride, for ${client.name}. Each file is sent as soon as you add it.`
            : 'Pick whose rides these are in the list above; then you can add their ride files.'
        }
        onFiles={add}
      />

      <div role="log" aria-live="polite" className="sr-only">
        {messages.map((m, i) => (
          <p key={i}>{m}</p>
        ))}
      </div>

      {entries.length > 0 && (
        <section aria-labelledby={listHeading} className="space-y-3">
          <div className="flex flex-wrap items-center justify-between gap-2">
            <h2 id={listHeading} className="text-xl">
              Files this visit
            </h2>
            {counts.open < entries.length && (
              <Button variant="quiet" onClick={clearFinished}>
                Clear finished files
              </Button>
            )}
          </div>
          <p className="text-ink-soft">{tally.join(' · ')}</p>
          <ul className="space-y-3">
            {entries.map((entry) => (
              <UploadItem key={entry.key} entry={entry} onRetry={retry} onTryAgain={(k, id) => void tryAgain(k, id)} />
            ))}
          </ul>
        </section>
      )}

      {client && <RecentUploads clientId={client.id} clientName={client.name} timeZone={client.timeZone} refresh={finished} />}
    </div>
  );
}
