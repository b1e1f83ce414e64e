import { useState, type FormEvent } from 'react';
import { api, ApiError } from '../api';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { SelectField, TextField } from '../ui/Field';

type Role = 'admin' | 'therapist' | 'client' | 'carer';
const ROLE_OPTIONS: Record<Role, string> = {
  therapist: 'Therapist',
  admin: 'Clinic administrator',
  client: 'The client themself',
  carer: 'A carer of the client',
};

/** Sends an invitation e-mail; the invitee chooses their password from its link. */
export default function InviteForm({ roles, clientId, onSent }: { roles: Role[]; clientId?: string; onSent?: () => void }) {
  const [role, setRole] = useState<Role>(roles[0]);
  const [email, setEmail] = useState('');
  const [name, setName] = useState('');
  const [relationship, setRelationship] = useState('');
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<ApiError | null>(null);
  const [sent, setSent] = useState<string | null>(null);

  async function submit(e: FormEvent) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    setSent(null);
    try {
      await api('POST', '/api/invitations', {
        email,
        role,
        ...(name.trim() ? { name } : {}),
        ...(clientId ? { clientId } : {}),
        ...(role === 'carer' && relationship.trim() ? { relationship } : {}),
      });
      setSent(`Invitation sent to ${email}. The link works for 7 days.`);
      setEmail('');
      setName('');
      setRelationship('');
      onSent?.();
    } catch (err) {
      setError(err as ApiError);
    } finally {
      setBusy(false);
    }
  }

  return (
    <form method="post" onSubmit={submit} className="card space-y-4" noValidate>
      {sent && (
        <Alert tone="success" live>
          {sent}
        </Alert>
      )}
      {error && (
        <Alert tone="danger" live>
          {error.message}
        </Alert>
      )}
      {roles.length > 1 && (
        <SelectField label="Invite as" value={role} onChange={(e) => setRole(e.target.value as Role)} options={roles.map((r) => ({ value: r, label: ROLE_OPTIONS[r] }))} />
      )}
      <TextField label="E-mail" type="email" autoComplete="off" value={email} onChange={(e) => setEmail(e.target.value)} error={error?.field('email')} />
      <TextField label="Name" optional autoComplete="off" value={name} onChange={(e) => setName(e.target.value)} help="Used to greet them in the e-mail; they can change it." />
      {role === 'carer' && (
        <TextField label="Relationship to the client" optional value={relationship} onChange={(e) => setRelationship(e.target.value)} help="For example: partner, parent, support worker." />
      )}
      <Button type="submit" busy={busy}>
        Send invitation
      </Button>
    </form>
  );
}
