import { useId, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes, type TextareaHTMLAttributes } from 'react';

interface FieldShell {
  label: string;
  help?: ReactNode;
  error?: string;
  optional?: boolean;
}

function Shell({ id, label, help, error, optional, children }: FieldShell & { id: string; children: ReactNode }) {
  return (
    <div className="space-y-1">
      <label htmlFor={id} className="block font-medium">
        {label}
        {optional && <span className="font-normal text-ink-soft"> (optional)</span>}
      </label>
      {help && (
        <p id={`${id}-help`} className="text-sm text-ink-soft">
          {help}
        </p>
      )}
      {children}
      {error && (
        <p id={`${id}-error`} className="text-sm font-medium text-brick">
          {error}
        </p>
      )}
    </div>
  );
}

function describedBy(id: string, help: unknown, error: unknown): string | undefined {
  return [help ? `${id}-help` : '', error ? `${id}-error` : ''].filter(Boolean).join(' ') || undefined;
}

export function TextField({ label, help, error, optional, ...input }: FieldShell & InputHTMLAttributes<HTMLInputElement>) {
  const generated = useId();
  const id = input.id ?? generated;
  return (
    <Shell id={id} label={label} help={help} error={error} optional={optional}>
      <input
        id={id}
        className="field-input"
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(id, help, error)}
        required={!optional}
        {...input}
      />
    </Shell>
  );
}

export function SelectField({
  label,
  help,
  error,
  optional,
  options,
  ...select
}: FieldShell & SelectHTMLAttributes<HTMLSelectElement> & { options: { value: string; label: string }[] }) {
  const generated = useId();
  const id = select.id ?? generated;
  return (
    <Shell id={id} label={label} help={help} error={error} optional={optional}>
      <select
        id={id}
        className="field-input"
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(id, help, error)}
        required={!optional}
        {...select}
      >
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
    </Shell>
  );
}

export function TextAreaField({ label, help, error, optional, ...area }: FieldShell & TextareaHTMLAttributes<HTMLTextAreaElement>) {
  const generated = useId();
  const id = area.id ?? generated;
  return (
    <Shell id={id} label={label} help={help} error={error} optional={optional}>
      <textarea
        id={id}
        className="field-input min-h-28"
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(id, help, error)}
        required={!optional}
        {...area}
      />
    </Shell>
  );
}
