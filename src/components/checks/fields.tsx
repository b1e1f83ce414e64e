// The check form's inputs: numbers with their unit in the label, large
// checkboxes, and the effort scale as radio buttons. Every control has a
// visible label that is also its accessible name, for voice control.
import { useRef, type ReactNode } from 'react';
import type { NumberKey } from './check-draft';
import { NUMBER_FIELDS } from './check-draft';

export const fieldId = (key: string) => `check-${key.replace(/\./g, '-')}`;

export function NumberInput({ field, value, error, onChange }: { field: NumberKey; value: string; error?: string; onChange: (key: NumberKey, value: string) => void }) {
  const spec = NUMBER_FIELDS[field];
  const id = fieldId(field);
  return (
    <div className="space-y-1">
      <label htmlFor={id} className="block font-medium">
        {spec.unit ? `${spec.label} (${spec.unit})` : spec.label}
      </label>
      <input
        id={id}
        type="text"
        inputMode="numeric"
        autoComplete="off"
        className="field-input text-xl sm:w-44"
        value={value}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${id}-error` : undefined}
        onChange={(e) => onChange(field, e.target.value)}
      />
      {error && (
        <p id={`${id}-error`} className="text-sm font-medium text-brick">
          {error}
        </p>
      )}
    </div>
  );
}

/** A group of fields under a heading-styled legend (the legend holds a real heading, for heading navigation). */
export function Group({ title, hint, id, children }: { title: string; hint?: ReactNode; id: string; children: ReactNode }) {
  return (
    <fieldset className="space-y-3" aria-describedby={hint ? `${id}-hint` : undefined} id={id}>
      <legend className="mb-1">
        <h2 className="text-xl">{title}</h2>
      </legend>
      {hint && (
        <p id={`${id}-hint`} className="text-ink-soft">
          {hint}
        </p>
      )}
      {children}
    </fieldset>
  );
}

export function CheckboxList<T extends string>({ name, options, labels, chosen, onChange }: { name: string; options: readonly T[]; labels: Record<T, string>; chosen: T[]; onChange: (list: T[]) => void }) {
  return (
    <div className="grid gap-2 sm:grid-cols-2">
      {options.map((o) => (
        <label
          key={o}
          className="flex min-h-14 cursor-pointer items-center gap-3 rounded-lg border-2 border-line bg-surface px-4 py-2 font-medium has-[:checked]:border-lagoon has-[:checked]:bg-lagoon-tint"
        >
          <input
            type="checkbox"
            name={name}
            value={o}
            checked={chosen.includes(o)}
            onChange={(e) => onChange(e.target.checked ? [...chosen, o] : chosen.filter((c) => c !== o))}
            className="h-7 w-7 shrink-0 accent-lagoon"
          />
          {labels[o]}
        </label>
      ))}
    </div>
  );
}

const EFFORT = Array.from({ length: 10 }, (_, i) => i + 1);

export function EffortScale({ value, onChange, self }: { value: number | null; onChange: (v: number | null) => void; self: boolean }) {
  const scale = useRef<HTMLDivElement>(null);
  // The button goes away once pressed; focus goes back to the scale rather than to the page.
  const clear = () => {
    onChange(null);
    scale.current?.querySelector('input')?.focus();
  };
  return (
    <Group id="check-effort" title={self ? 'How hard did the ride feel?' : 'How hard the ride felt'} hint="1 is very easy and 10 is as hard as it gets.">
      <div ref={scale} className="flex flex-wrap gap-2">
        {EFFORT.map((n) => (
          <label
            key={n}
            className="relative flex h-14 w-14 cursor-pointer items-center justify-center rounded-lg border-2 border-lagoon bg-surface text-xl font-semibold text-lagoon-dark has-[:checked]:bg-lagoon has-[:checked]:text-white has-[:focus-visible]:shadow-[0_0_0_5px_#1d2a2f] has-[:focus-visible]:outline-[3px] has-[:focus-visible]:outline-offset-2 has-[:focus-visible]:outline-focus has-[:focus-visible]:outline-solid"
          >
            <input type="radio" name="effort" value={n} checked={value === n} onChange={() => onChange(n)} className="sr-only" />
            {n}
          </label>
        ))}
      </div>
      {value !== null && (
        <button type="button" className="btn btn-quiet" onClick={clear}>
          Leave the effort out
        </button>
      )}
    </Group>
  );
}
