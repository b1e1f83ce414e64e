import type { ReactNode } from 'react';

/**
 * A link in a form's error summary that moves focus to the field it names (or
 * to the first control of the group with that id), where the message is.
 */
export function FieldLink({ target, children }: { target: string; children: ReactNode }) {
  return (
    <a
      href={`#${target}`}
      className="font-medium"
      onClick={(e) => {
        e.preventDefault();
        const el = document.getElementById(target);
        const focusable = el && (el.matches('input, textarea, select') ? el : el.querySelector<HTMLElement>('input:not([disabled]), textarea, select, button'));
        focusable?.focus();
      }}
    >
      {children}
    </a>
  );
}
