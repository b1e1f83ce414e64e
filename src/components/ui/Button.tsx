import type { ButtonHTMLAttributes } from 'react';
import { useHydrated } from '../useHydrated';

type Variant = 'primary' | 'secondary' | 'quiet' | 'danger';

export function Button({
  variant = 'primary',
  busy = false,
  className = '',
  children,
  disabled,
  ...rest
}: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant; busy?: boolean }) {
  const hydrated = useHydrated();
  return (
    <button
      type="button"
      className={`btn btn-${variant} ${className}`}
      disabled={disabled || busy || !hydrated}
      aria-busy={busy || undefined}
      {...rest}
    >
      {children}
    </button>
  );
}
