/** A horizontal bar with its value in words beside it; the words are the bar's accessible value. */
export function ProgressBar({ id, label, percent, text }: { id: string; label: string; percent: number; text: string }) {
  return (
    <div className="space-y-1">
      <p id={`${id}-label`} className="font-medium">
        {label}
      </p>
      <div
        role="progressbar"
        aria-labelledby={`${id}-label`}
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={percent}
        aria-valuetext={text}
        className="h-6 overflow-hidden rounded-full border-2 border-lagoon bg-surface"
      >
        <div className="h-full rounded-full bg-lagoon" style={{ width: `${percent}%` }} />
      </div>
      <p className="text-lg font-semibold" data-testid="goal-travelled">
        {text}
      </p>
    </div>
  );
}
