import { useState, type FormEvent } from 'react';
import { api, ApiError } from '../api';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { TextField } from '../ui/Field';

/**
 * Choosing a password from an e-mailed link: accepting an invitation (with a
 * name, unless the e-mail already has an account) or resetting a password.
 */
export default function NewPasswordForm({
  mode,
  token,
  defaultName,
  hasAccount = false,
}: {
  mode: 'invitation' | 'reset';
  token: string;
  defaultName?: string | null;
  hasAccount?: boolean;
}) {
  const [name, setName] = useState(defaultName ?? '');
  const [password, setPassword] = useState('');
  const [confirm, setConfirm] = useState('');
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<ApiError | null>(null);
  const [mismatch, setMismatch] = useState(false);
  const askName = mode === 'invitation' && !hasAccount;
  const choosing = !hasAccount;

  async function submit(e: FormEvent) {
    e.preventDefault();
    if (choosing && password !== confirm) {
      setMismatch(true);
      return;
    }
    setMismatch(false);
    setBusy(true);
    setError(null);
    try {
      const url = mode === 'invitation' ? '/api/invitations/accept' : '/api/auth/reset';
      const body = mode === 'invitation' ? { token, password, ...(askName ? { name } : {}) } : { token, password };
      const res = await api<{ home: string }>('POST', url, body);
      window.location.assign(res.home);
    } catch (err) {
      setError(err as ApiError);
      setBusy(false);
    }
  }

  return (
    <form method="post" onSubmit={submit} className="card space-y-5" noValidate>
      {error && (
        <Alert tone="danger" live>
          {error.message}
        </Alert>
      )}
      {askName && <TextField label="Your name" autoComplete="name" value={name} onChange={(e) => setName(e.target.value)} error={error?.field('name')} />}
      <TextField
        label={hasAccount ? 'Your current password' : 'New password'}
        type="password"
        autoComplete={hasAccount ? 'current-password' : 'new-password'}
        help={choosing ? 'At least 10 characters. A short sentence is easy to remember and hard to guess.' : undefined}
        value={password}
        onChange={(e) => setPassword(e.target.value)}
        error={error?.field('password')}
      />
      {choosing && (
        <TextField
          label="New password again"
          type="password"
          autoComplete="new-password"
          value={confirm}
          onChange={(e) => setConfirm(e.target.value)}
          error={mismatch ? 'The two passwords are not the same.' : undefined}
        />
      )}
      <Button type="submit" busy={busy}>
        {mode === 'invitation' ? 'Accept and sign in' : 'Save password and sign in'}
      </Button>
    </form>
  );
}
