import { useEffect, useMemo, useRef, useState, type FormEvent, type RefObject } from 'react';
import { NAMED_CHANNELS, NUMBERED_CHANNELS, type CanonicalField } from '../../lib/rides/types';
import { api, ApiError, useApi } from '../api';
import {
  base64Of,
  draftOf,
  draftProblems,
  emptyDraft,
  FIELD_LABELS,
  mappingOf,
  PROFILES_CHANGED,
  TIME_FORMAT_LABELS,
  type DraftRow,
  type ProfileDraft,
  type SavedProfile,
  type TimeFormat,
} from '../rides/profile-draft';
import { ProfilePreview, type PreviewAnswer } from '../rides/ProfilePreview';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { EmptyState } from '../ui/EmptyState';
import { SelectField, TextField } from '../ui/Field';
import { Loaded } from '../ui/Loading';

const SAMPLE_BYTES = 64 * 1024;
const PREVIEW_DELAY_MS = 400;

const FIELD_ORDER: CanonicalField[] = ['time', 'phase', 'cadence', 'power', 'distance', 'pulse_width', 'frequency', 'heart_rate', ...NAMED_CHANNELS, ...NUMBERED_CHANNELS];
const FIELD_OPTIONS = [{ value: '', label: 'Choose a field' }, ...FIELD_ORDER.map((f) => ({ value: f, label: FIELD_LABELS[f] }))];
const TIME_FORMAT_OPTIONS = (Object.keys(TIME_FORMAT_LABELS) as (TimeFormat | '')[]).map((v) => ({ value: v, label: TIME_FORMAT_LABELS[v] }));

type Preview = { state: 'idle' } | { state: 'loading' } | { state: 'ready'; answer: PreviewAnswer } | { state: 'error'; message: string };

export default function ImportProfiles({ clinicId }: { clinicId: string }) {
  const [list, reload] = useApi<{ profiles: SavedProfile[] }>('/api/import-profiles');
  const keys = useRef(0);
  const nextKey = () => `row${++keys.current}`;
  const [editing, setEditing] = useState<SavedProfile | null>(null);
  const [draft, setDraft] = useState<ProfileDraft>(() => emptyDraft(nextKey));
  const [saving, setSaving] = useState(false);
  const [error, setError] = useState<ApiError | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const [confirming, setConfirming] = useState<string | null>(null);
  const [archiveError, setArchiveError] = useState<string | null>(null);
  const [checked, setChecked] = useState(false);
  const [started, setStarted] = useState(0);
  const formHeading = useRef<HTMLHeadingElement>(null);

  // Choosing "Edit" or "New" moves focus to the form, so keyboard users land where they work next.
  useEffect(() => {
    if (started) formHeading.current?.focus();
  }, [started]);

  function start(profile: SavedProfile | null) {
    setEditing(profile);
    setDraft(profile ? draftOf(profile, nextKey) : emptyDraft(nextKey));
    setError(null);
    setNotice(null);
    setChecked(false);
    setStarted((n) => n + 1);
  }

  function changed() {
    reload();
    window.dispatchEvent(new Event(PROFILES_CHANGED));
  }

  async function archive(p: SavedProfile) {
    setArchiveError(null);
    try {
      await api('DELETE', `/api/import-profiles/${p.id}`);
      setConfirming(null);
      if (editing?.id === p.id) start(null);
      setNotice(`Archived “${p.name}”.`);
      changed();
    } catch (err) {
      setArchiveError((err as ApiError).message);
    }
  }

  const profiles = list.state === 'ready' ? list.data.profiles.filter((p) => p.clinicId === clinicId) : [];

  return (
    <div className="space-y-8">
      <section aria-labelledby="profiles-h" className="space-y-3">
        <div className="flex flex-wrap items-center justify-between gap-2">
          <h2 id="profiles-h" className="text-xl">
            Import profiles
          </h2>
          <Button variant="secondary" onClick={() => start(null)}>
            New import profile
          </Button>
        </div>
        <p className="max-w-prose text-ink-soft">
          Most ride files are read without help. When a cycle names its columns in words Kinloop does not know, an import profile says which column is which.
        </p>
        {archiveError && (
          <Alert tone="danger" live>
            {archiveError}
          </Alert>
        )}
        <Loaded value={list} reload={reload} label="import profiles">
          {() =>
            profiles.length ? (
              <ul className="space-y-2">
                {profiles.map((p) => (
                  <li key={p.id} className="card space-y-3">
                    <div className="flex flex-wrap items-center justify-between gap-3">
                      <div>
                        <p className="font-semibold">{p.name}</p>
                        <p className="text-sm text-ink-soft">
                          {p.deviceName ? `${p.deviceName} · ` : ''}
                          {Object.keys(p.columns).length === 1 ? '1 mapped column' : `${Object.keys(p.columns).length} mapped columns`}
                        </p>
                      </div>
                      <div className="flex flex-wrap gap-2">
                        <Button variant="secondary" onClick={() => start(p)}>
                          Edit<span className="sr-only"> {p.name}</span>
                        </Button>
                        <Button variant="quiet" onClick={() => setConfirming(p.id)} aria-expanded={confirming === p.id}>
                          Archive<span className="sr-only"> {p.name}</span>
                        </Button>
                      </div>
                    </div>
                    {confirming === p.id && <ArchiveConfirm profile={p} onArchive={() => archive(p)} onKeep={() => setConfirming(null)} />}
                  </li>
                ))}
              </ul>
            ) : (
              <EmptyState title="No import profiles yet">Create one when a cycle’s ride files are refused because Kinloop does not recognise their columns.</EmptyState>
            )
          }
        </Loaded>
      </section>

      <ProfileEditor
        editing={editing}
        checked={checked}
        onChecked={() => setChecked(true)}
        draft={draft}
        setDraft={setDraft}
        nextKey={nextKey}
        headingRef={formHeading}
        saving={saving}
        error={error}
        notice={notice}
        onSubmit={async () => {
          setSaving(true);
          setError(null);
          setNotice(null);
          const mapping = mappingOf(draft);
          const body = { name: draft.name, ...(draft.deviceName.trim() ? { deviceName: draft.deviceName } : {}), ...mapping };
          try {
            const saved = editing ? await api<SavedProfile>('PUT', `/api/import-profiles/${editing.id}`, body) : await api<SavedProfile>('POST', '/api/import-profiles', body);
            setEditing(saved);
            setNotice(`Saved “${saved.name}”. Files uploaded with it, or from a device it is attached to, are read this way.`);
            changed();
          } catch (err) {
            setError(err as ApiError);
          } finally {
            setSaving(false);
          }
        }}
      />
    </div>
  );
}

function ArchiveConfirm({ profile, onArchive, onKeep }: { profile: SavedProfile; onArchive: () => void; onKeep: () => void }) {
  const keep = useRef<HTMLButtonElement>(null);
  useEffect(() => keep.current?.focus(), []);
  return (
    <div className="rounded-lg border-l-4 border-ochre bg-ochre-tint px-4 py-3" role="group" aria-label={`Archive ${profile.name}?`}>
      <p className="font-semibold">Archive “{profile.name}”?</p>
      <p>Sessions already read with it stay as they are. Devices attached to it go back to automatic detection, and it is no longer offered at upload.</p>
      <div className="mt-3 flex flex-wrap gap-2">
        <Button variant="danger" onClick={onArchive}>
          Archive {profile.name}
        </Button>
        <button ref={keep} type="button" className="btn btn-secondary" onClick={onKeep}>
          Keep it
        </button>
      </div>
    </div>
  );
}

function ProfileEditor({
  editing,
  checked,
  onChecked,
  draft,
  setDraft,
  nextKey,
  headingRef,
  saving,
  error,
  notice,
  onSubmit,
}: {
  editing: SavedProfile | null;
  /** Whether saving was tried: only then do half-filled columns show what they lack. */
  checked: boolean;
  onChecked: () => void;
  draft: ProfileDraft;
  setDraft: (update: (d: ProfileDraft) => ProfileDraft) => void;
  nextKey: () => string;
  headingRef: RefObject<HTMLHeadingElement | null>;
  saving: boolean;
  error: ApiError | null;
  notice: string | null;
  onSubmit: () => void;
}) {
  const problems = useMemo(() => draftProblems(draft), [draft]);
  const nameMissing = draft.name.trim() === '';
  const blocked = nameMissing || Object.keys(problems.rows).length > 0 || problems.metresPerRev !== undefined;

  function setRow(key: string, change: Partial<DraftRow>) {
    setDraft((d) => ({ ...d, rows: d.rows.map((r) => (r.key === key ? { ...r, ...change } : r)) }));
  }
  function submit(e: FormEvent) {
    e.preventDefault();
    onChecked();
    if (!blocked) onSubmit();
  }

  return (
    <section aria-labelledby="profile-form-h" className="grid items-start gap-6 lg:grid-cols-2">
      <form method="post" onSubmit={submit} noValidate className="card space-y-5">
        <h2 id="profile-form-h" ref={headingRef} tabIndex={-1} className="text-xl">
          {editing ? `Edit “${editing.name}”` : 'New import profile'}
        </h2>
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
        {checked && blocked && (
          <Alert tone="danger" live>
            The profile is not complete yet; see the messages below.
          </Alert>
        )}
        <TextField label="Name" value={draft.name} onChange={(e) => setDraft((d) => ({ ...d, name: e.target.value }))} error={checked && nameMissing ? 'Give the profile a name, such as the cycle model.' : error?.field('name')} autoComplete="off" />
        <TextField
          label="Device name"
          optional
          value={draft.deviceName}
          onChange={(e) => setDraft((d) => ({ ...d, deviceName: e.target.value }))}
          help="The cycle model as people at the clinic call it, so carers can pick the right profile."
          autoComplete="off"
        />
        <fieldset className="space-y-3">
          <legend className="font-semibold">Columns of the ride file</legend>
          <p className="text-sm text-ink-soft">
            Write each header exactly as the file shows it and choose what it holds. Leave the unit empty for the usual one (s, rpm, W, m, mA, µs, Hz, bpm), or write another, such as ms, kW, km, mi or A.
            Headers Kinloop already knows need no row.
          </p>
          {draft.rows.map((r, i) => {
            const found = problems.rows[r.key];
            const problem = found && (checked || !found.incomplete) ? found : undefined;
            return (
              <fieldset key={r.key} className="space-y-3 rounded-lg border border-line p-3">
                <legend className="px-1 text-sm font-semibold text-ink-soft">Column {i + 1}</legend>
                <div className="grid gap-3 sm:grid-cols-2">
                  <TextField
                    label="Header in the file"
                    required={false}
                    value={r.header}
                    onChange={(e) => setRow(r.key, { header: e.target.value })}
                    error={problem?.on === 'header' ? problem.message : error?.field(`columns.${r.header.trim()}`)}
                    autoComplete="off"
                    spellCheck={false}
                  />
                  <SelectField
                    label="Kinloop field"
                    required={false}
                    value={r.field}
                    onChange={(e) => setRow(r.key, { field: e.target.value as CanonicalField | '' })}
                    options={FIELD_OPTIONS}
                    error={problem?.on === 'field' ? problem.message : undefined}
                  />
                </div>
                <div className="flex flex-wrap items-end gap-3">
                  <div className="w-32">
                    <TextField label="Unit" required={false} value={r.unit} onChange={(e) => setRow(r.key, { unit: e.target.value })} autoComplete="off" spellCheck={false} />
                  </div>
                  <Button
                    variant="quiet"
                    aria-label={`Remove column ${i + 1}${r.header.trim() ? ` (${r.header.trim()})` : ''}`}
                    onClick={() => setDraft((d) => ({ ...d, rows: d.rows.length > 1 ? d.rows.filter((x) => x.key !== r.key) : [{ key: nextKey(), header: '', field: '', unit: '' }] }))}
                  >
                    Remove
                  </Button>
                </div>
              </fieldset>
            );
          })}
          <Button variant="secondary" onClick={() => setDraft((d) => ({ ...d, rows: [...d.rows, { key: nextKey(), header: '', field: '', unit: '' }] }))}>
            Add a column
          </Button>
        </fieldset>
        <div className="grid gap-4 sm:grid-cols-2">
          <TextField
            label="Metres per revolution"
            optional
            inputMode="decimal"
            value={draft.metresPerRev}
            onChange={(e) => setDraft((d) => ({ ...d, metresPerRev: e.target.value }))}
            help="For the distance of files without a distance column; Kinloop uses 2.0 otherwise."
            error={problems.metresPerRev ?? error?.field('metresPerRev')}
          />
          <SelectField
            label="Time format"
            optional
            value={draft.timeFormat}
            onChange={(e) => setDraft((d) => ({ ...d, timeFormat: e.target.value as TimeFormat | '' }))}
            options={TIME_FORMAT_OPTIONS}
            help="How the time column is written."
          />
        </div>
        <Button type="submit" busy={saving}>
          {editing ? 'Save changes' : 'Save import profile'}
        </Button>
      </form>
      <LivePreview draft={draft} metresValid={problems.metresPerRev === undefined} />
    </section>
  );
}

function LivePreview({ draft, metresValid }: { draft: ProfileDraft; metresValid: boolean }) {
  const [sample, setSample] = useState<{ name: string; base64: string; partial: boolean } | null>(null);
  const [sampleError, setSampleError] = useState<string | null>(null);
  const [preview, setPreview] = useState<Preview>({ state: 'idle' });
  const asked = useRef(0);

  const mapping = mappingOf(draft);
  if (!metresValid) delete mapping.metresPerRev;
  const mappingKey = JSON.stringify(mapping);

  useEffect(() => {
    if (!sample) return;
    const ask = ++asked.current;
    setPreview((p) => (p.state === 'ready' ? p : { state: 'loading' }));
    const timer = setTimeout(() => {
      api<PreviewAnswer>('POST', '/api/import-profiles/preview', { sampleBase64: sample.base64, profile: JSON.parse(mappingKey) }).then(
        (answer) => ask === asked.current && setPreview({ state: 'ready', answer }),
        (err: ApiError) => ask === asked.current && setPreview({ state: 'error', message: err.message }),
      );
    }, PREVIEW_DELAY_MS);
    return () => clearTimeout(timer);
  }, [sample, mappingKey]);

  async function choose(file: File | undefined) {
    setSampleError(null);
    if (!file) {
      setSample(null);
      setPreview({ state: 'idle' });
      return;
    }
    try {
      const bytes = new Uint8Array(await file.slice(0, SAMPLE_BYTES).arrayBuffer());
      setSample({ name: file.name, base64: base64Of(bytes), partial: file.size > SAMPLE_BYTES });
    } catch {
      setSampleError('The browser could not read that file. Choose it again, or another ride file.');
    }
  }

  const answer = preview.state === 'ready' ? preview.answer : null;
  const status = !answer
    ? ''
    : answer.ok
      ? `Preview updated: ${answer.columns.filter((c) => c.field).length} of ${answer.columns.length} headers read, ${answer.rows.length} rows shown.`
      : 'Preview updated: this file would be refused.';

  return (
    <div className="card space-y-4" aria-labelledby="preview-h" role="region">
      <h3 id="preview-h" className="text-lg">
        Live preview
      </h3>
      <TextField
        label="Sample ride file"
        required={false}
        type="file"
        accept=".csv,.txt,text/csv"
        onChange={(e) => void choose(e.currentTarget.files?.[0])}
        help="Only the first 64 KB are read, here in the browser; the file is not saved. The preview follows every change to the profile."
        error={sampleError ?? undefined}
      />
      <p role="status" className="sr-only">
        {status}
      </p>
      {!sample && <p className="text-ink-soft">Choose a ride file from the cycle to see how Kinloop reads it with this profile.</p>}
      {sample && (
        <p className="text-sm text-ink-soft">
          {sample.name}
          {sample.partial ? ' (first 64 KB)' : ''}
          {preview.state === 'loading' && ' · reading…'}
        </p>
      )}
      {preview.state === 'error' && (
        <Alert tone="danger" title="The preview could not be made">
          <p>{preview.message}</p>
        </Alert>
      )}
      {answer && <ProfilePreview answer={answer} />}
    </div>
  );
}
