/**
 * This week's sessions as circles: filled with a tick for each one done, empty
 * for each still to do. Decoration only: the sentence beside it says the same
 * in words, so the circles are hidden from screen readers.
 */
export function WeekDots({ counted, prescribed, size = 'large' }: { counted: number; prescribed: number | null; size?: 'large' | 'small' }) {
  const total = Math.min(Math.max(counted, prescribed ?? 0), 10);
  if (!total) return null;
  const px = size === 'large' ? 44 : 28;
  return (
    <div aria-hidden="true" className="flex flex-wrap gap-2">
      {Array.from({ length: total }, (_, i) => {
        const done = i < counted;
        return (
          <svg key={i} width={px} height={px} viewBox="0 0 32 32" data-done={done}>
            {done ? (
              <>
                <circle cx="16" cy="16" r="14" fill="#1e5a5f" />
                <path d="M9.5 16.5l4.5 4.5 8.5-9" fill="none" stroke="#fff" strokeWidth="3" strokeLinecap="round" strokeLinejoin="round" />
              </>
            ) : (
              <circle cx="16" cy="16" r="13" fill="#fff" stroke="#8f8a7d" strokeWidth="3" strokeDasharray="4 3" />
            )}
          </svg>
        );
      })}
    </div>
  );
}
