import { useState, type FormEvent } from 'react';
import { api, ApiError } from '../api';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { TextField } from '../ui/Field';

export default function ForgotPasswordForm() {
  const [email, setEmail] = useState('');
  const [busy, setBusy] = useState(false);
  const [done, setDone] = useState<string | null>(null);
  const [error, setError] = useState<ApiError | null>(null);

  async function submit(e: FormEvent) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    try {
      const res = await api<{ message: string }>('POST', '/api/auth/reset-request', { email });
      setDone(res.message);
    } catch (err) {
      setError(err as ApiError);
    } finally {
      setBusy(false);
    }
  }

  if (done) {
    return (
      <Alert tone="success" title="Check your e-mail" live>
        <p>{done}</p>
        <p className="mt-2">
          <a href="/sign-in">Back to sign-in</a>
        </p>
      </Alert>
    );
  }
  return (
    <form method="post" onSubmit={submit} className="card space-y-5" noValidate>
      {error && (
        <Alert tone="danger" live>
          {error.message}
        </Alert>
      )}
      <TextField label="E-mail" type="email" autoComplete="email" value={email} onChange={(e) => setEmail(e.target.value)} error={error?.field('email')} />
      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" busy={busy}>
          Send me a reset link
        </Button>
        <a href="/sign-in" className="inline-flex min-h-12 items-center">
          Back to sign-in
        </a>
      </div>
    </form>
  );
}
