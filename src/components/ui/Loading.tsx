import type { Loadable } from '../api';
import type { ReactNode } from 'react';
import { Alert } from './Alert';
import { Button } from './Button';

/** Shows the loading and error states of a `useApi` value, and its content once ready. */
export function Loaded<T>({
  value,
  reload,
  label,
  children,
}: {
  value: Loadable<T>;
  reload: () => void;
  label: string;
  children: (data: T) => ReactNode;
}) {
  if (value.state === 'loading') {
    return (
      <p role="status" className="py-6 text-ink-soft">
        Loading {label}…
      </p>
    );
  }
  if (value.state === 'error') {
    return (
      <Alert tone="danger" title={`Could not load ${label}`} live>
        <p>{value.error.message}</p>
        <Button variant="secondary" className="mt-2" onClick={reload}>
          Try again
        </Button>
      </Alert>
    );
  }
  return <>{children(value.data)}</>;
}
