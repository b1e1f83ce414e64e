import { useState, type FormEvent } from 'react';
import { safeNext } from '../../lib/ui/safe-next';
import { api, ApiError } from '../api';
import { Alert } from '../ui/Alert';
import { TextField } from '../ui/Field';

/**
 * Works before (and without) JavaScript too: the form then posts to the
 * sign-in page itself, which signs in on the server.
 */
export default function SignInForm({ next, initialEmail = '', initialError = null }: { next: string | null; initialEmail?: string; initialError?: string | null }) {
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<ApiError | null>(initialError ? new ApiError(401, { code: 'bad_credentials', message: initialError }) : null);

  async function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    // Read from the form itself: the fields are uncontrolled, so what was typed before hydration is kept.
    const form = new FormData(e.currentTarget);
    const email = String(form.get('email') ?? '');
    const password = String(form.get('password') ?? '');
    setBusy(true);
    setError(null);
    try {
      const res = await api<{ home: string }>('POST', '/api/auth/sign-in', { email, password });
      window.location.assign(safeNext(next, window.location.origin) ?? res.home);
    } catch (err) {
      setError(err as ApiError);
      setBusy(false);
    }
  }

  return (
    <form method="post" action={next ? `/sign-in?next=${encodeURIComponent(next)}` : '/sign-in'} onSubmit={submit} className="card space-y-5" noValidate>
      {error && (
        <Alert tone="danger" title="Not signed in" live>
          {error.message}
        </Alert>
      )}
      <TextField label="E-mail" type="email" name="email" autoComplete="username" defaultValue={initialEmail} error={error?.field('email')} />
      <TextField label="Password" type="password" name="password" autoComplete="current-password" error={error?.field('password')} />
      <div className="flex flex-wrap items-center justify-between gap-3">
        <button type="submit" className="btn btn-primary" disabled={busy} aria-busy={busy || undefined}>
          {busy ? 'Signing in…' : 'Sign in'}
        </button>
        <a href="/forgot-password" className="inline-flex min-h-12 items-center">
          Forgot your password?
        </a>
      </div>
    </form>
  );
}
