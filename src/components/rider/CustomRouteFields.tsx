import { useEffect, useRef, useState } from 'react';
import { TextField } from '../ui/Field';
import { MIN_POINTS, type PointRow, type RouteDraft } from './route-draft';

/**
 * The rider's own route: a name and an ordered list of named points. Rows are
 * added and removed with buttons, never by dragging; focus follows the change
 * so a keyboard or switch user stays in place.
 */
export function CustomRouteFields({
  draft,
  errors,
  onChange,
  newKey,
}: {
  draft: RouteDraft;
  errors: Record<string, string>;
  onChange: (draft: RouteDraft) => void;
  newKey: () => string;
}) {
  const rowItems = useRef(new Map<string, HTMLLIElement>());
  const addButton = useRef<HTMLButtonElement>(null);
  const [focusKey, setFocusKey] = useState<string | null>(null);
  const [announcement, setAnnouncement] = useState('');

  useEffect(() => {
    if (focusKey === null) return;
    (focusKey === 'add' ? addButton.current : rowItems.current.get(focusKey)?.querySelector('input'))?.focus();
    setFocusKey(null);
  }, [focusKey]);

  const setRow = (key: string, change: Partial<PointRow>) => onChange({ ...draft, rows: draft.rows.map((r) => (r.key === key ? { ...r, ...change } : r)) });

  function add() {
    const row: PointRow = { key: newKey(), name: '', lat: '', lon: '', milestone: true };
    onChange({ ...draft, rows: [...draft.rows, row] });
    setAnnouncement(`Point ${draft.rows.length + 1} added at the end.`);
    setFocusKey(row.key);
  }

  function remove(index: number) {
    const rows = draft.rows.filter((_, i) => i !== index);
    onChange({ ...draft, rows });
    setAnnouncement(`Point ${index + 1} removed.`);
    setFocusKey(rows[index]?.key ?? 'add');
  }

  const last = draft.rows.length - 1;
  return (
    <div className="space-y-4">
      <TextField label="Route name" value={draft.name} error={errors.name} maxLength={80} onChange={(e) => onChange({ ...draft, name: e.target.value })} />
      <p className="text-ink-soft">
        List the places in the order you pass them, with their latitude and longitude in degrees (a map app shows them, for example 50.82 and -0.14). The first point is the start and the last one the finish.
      </p>
      {errors.points && <p className="font-medium text-brick">{errors.points}</p>}
      <ol className="space-y-3">
        {draft.rows.map((row, i) => (
          <li
            key={row.key}
            ref={(el) => {
              if (el) rowItems.current.set(row.key, el);
              else rowItems.current.delete(row.key);
            }}
          >
            <fieldset className="rounded-lg border-2 border-line p-3">
              <legend className="px-1 font-semibold">
                Point {i + 1}
                {i === 0 ? ' (start)' : i === last ? ' (finish)' : ''}
              </legend>
              <div className="grid gap-3 sm:grid-cols-[2fr_1fr_1fr]">
                <TextField
                  label="Name"
                  value={row.name}
                  maxLength={80}
                  optional={!row.milestone && i !== last}
                  error={errors[`points.${i}.name`]}
                  onChange={(e) => setRow(row.key, { name: e.target.value })}
                />
                <TextField label="Latitude" inputMode="decimal" autoComplete="off" value={row.lat} error={errors[`points.${i}.lat`]} onChange={(e) => setRow(row.key, { lat: e.target.value })} />
                <TextField label="Longitude" inputMode="decimal" autoComplete="off" value={row.lon} error={errors[`points.${i}.lon`]} onChange={(e) => setRow(row.key, { lon: e.target.value })} />
              </div>
              <div className="mt-3 flex flex-wrap items-center justify-between gap-3">
                {i === last ? (
                  <p className="text-sm text-ink-soft">The finish always counts as a milestone.</p>
                ) : (
                  <label className="inline-flex min-h-12 cursor-pointer items-center gap-3 font-medium">
                    <input type="checkbox" className="h-6 w-6 accent-lagoon" checked={row.milestone} onChange={(e) => setRow(row.key, { milestone: e.target.checked })} />
                    Milestone
                  </label>
                )}
                {draft.rows.length > MIN_POINTS && (
                  <button type="button" className="btn btn-secondary" onClick={() => remove(i)}>
                    Remove point {i + 1}
                  </button>
                )}
              </div>
            </fieldset>
          </li>
        ))}
      </ol>
      <button type="button" ref={addButton} className="btn btn-secondary min-h-14" onClick={add}>
        Add a point
      </button>
      <p className="sr-only" aria-live="polite">
        {announcement}
      </p>
    </div>
  );
}
