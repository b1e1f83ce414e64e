import { useId, useRef, useState, type DragEvent } from 'react';
import { useHydrated } from '../useHydrated';

/**
 * A large target that takes dropped files and is also an ordinary button
 * opening the file chooser, so that nobody has to drag.
 */
export function DropZone({ label, hint, disabled, onFiles }: { label: string; hint: string; disabled: boolean; onFiles: (files: File[]) => void }) {
  const hydrated = useHydrated();
  const input = useRef<HTMLInputElement>(null);
  const inputId = useId();
  const labelId = useId();
  const hintId = useId();
  const [over, setOver] = useState(false);
  const off = disabled || !hydrated;

  function hasFiles(e: DragEvent) {
    return Array.from(e.dataTransfer?.types ?? []).includes('Files');
  }
  function enter(e: DragEvent) {
    if (!hasFiles(e)) return;
    e.preventDefault();
    if (!off) setOver(true);
  }
  function drop(e: DragEvent) {
    e.preventDefault();
    setOver(false);
    const files = Array.from(e.dataTransfer?.files ?? []);
    if (!off && files.length) onFiles(files);
  }

  return (
    <div>
      <button
        type="button"
        disabled={off}
        aria-labelledby={labelId}
        aria-describedby={hintId}
        onClick={() => input.current?.click()}
        onDragEnter={enter}
        onDragOver={(e) => {
          enter(e);
          if (hasFiles(e) && e.dataTransfer) e.dataTransfer.dropEffect = off ? 'none' : 'copy';
        }}
        onDragLeave={() => setOver(false)}
        onDrop={drop}
        data-dragging={over || undefined}
        className={`flex min-h-48 w-full cursor-pointer flex-col items-center justify-center gap-2 rounded-xl border-4 border-dashed px-4 py-8 text-center transition-colors disabled:cursor-not-allowed ${
          over ? 'border-lagoon bg-lagoon-tint' : 'border-line-strong bg-surface hover:bg-lagoon-tint'
        } ${off ? 'opacity-70' : ''}`}
      >
        <svg aria-hidden="true" width="44" height="44" viewBox="0 0 24 24" fill="none" stroke="currentColor" strokeWidth="1.8" className="pointer-events-none text-lagoon">
          <path d="M12 16V4m0 0-4.5 4.5M12 4l4.5 4.5" strokeLinecap="round" strokeLinejoin="round" />
          <path d="M4 15v3a2 2 0 0 0 2 2h12a2 2 0 0 0 2-2v-3" strokeLinecap="round" />
        </svg>
        <span id={labelId} className="pointer-events-none text-xl font-semibold text-lagoon-dark">{label}</span>
        <span id={hintId} className="pointer-events-none max-w-prose text-ink-soft">
          {hint}
        </span>
      </button>
      <label htmlFor={inputId} className="sr-only">
        Ride files
      </label>
      <input
        ref={input}
        id={inputId}
        type="file"
        multiple
        accept=".csv,.txt,text/csv"
        className="sr-only"
        tabIndex={-1}
        disabled={off}
        onChange={(e) => {
          const files = Array.from(e.currentTarget.files ?? []);
          e.currentTarget.value = '';
          if (files.length) onFiles(files);
        }}
      />
    </div>
  );
}
