import type { ReactNode } from 'react';

const TONES = {
  info: 'border-slate bg-slate-tint',
  success: 'border-moss bg-moss-tint',
  caution: 'border-ochre bg-ochre-tint',
  danger: 'border-brick bg-brick-tint',
} as const;

export function Alert({
  tone = 'info',
  title,
  children,
  live = false,
}: {
  tone?: keyof typeof TONES;
  title?: string;
  children?: ReactNode;
  /** Announce to screen readers when it appears (for results of an action). */
  live?: boolean;
}) {
  return (
    <div
      className={`rounded-lg border-l-4 px-4 py-3 ${TONES[tone]}`}
      role={live ? (tone === 'danger' ? 'alert' : 'status') : undefined}
    >
      {title && <p className="font-semibold">{title}</p>}
      {children && <div className={title ? 'mt-1' : ''}>{children}</div>}
    </div>
  );
}
