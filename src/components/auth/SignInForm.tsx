import { useState, type FormEvent } from 'react';
import { api, ApiError } from '../api';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { TextField } from '../ui/Field';

/** Only same-site paths are followed after sign-in, never another site. */
function safeNext(next: string | null): string | null {
  return next && next.startsWith('/') && !next.startsWith('//') ? next : null;
}

export default function SignInForm({ next }: { next: string | null }) {
  const [email, setEmail] = useState('');
  const [password, setPassword] = useState('');
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<ApiError | null>(null);

  async function submit(e: FormEvent) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    try {
      const res = await api<{ home: string }>('POST', '/api/auth/sign-in', { email, password });
      window.location.assign(safeNext(next) ?? res.home);
    } catch (err) {
      setError(err as ApiError);
      setBusy(false);
    }
  }

  return (
    <form onSubmit={submit} className="card space-y-5" noValidate>
      {error && (
        <Alert tone="danger" title="Not signed in" live>
          {error.message}
        </Alert>
      )}
      <TextField label="E-mail" type="email" name="email" autoComplete="username" value={email} onChange={(e) => setEmail(e.target.value)} error={error?.field('email')} />
      <TextField label="Password" type="password" name="password" autoComplete="current-password" value={password} onChange={(e) => setPassword(e.target.value)} error={error?.field('password')} />
      <div className="flex flex-wrap items-center justify-between gap-3">
        <Button type="submit" busy={busy}>
          {busy ? 'Signing in…' : 'Sign in'}
        </Button>
        <a href="/forgot-password" className="inline-flex min-h-12 items-center">
          Forgot your password?
        </a>
      </div>
    </form>
  );
}
