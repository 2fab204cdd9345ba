/** The Tinctoria mark: three dyed strips (one bath, three mordants) beside the name. */
export function Wordmark({ compact = false }: { compact?: boolean }) {
  return (
    <span className="inline-flex items-center gap-2.5">
      <svg aria-hidden="true" width="22" height="22" viewBox="0 0 22 22">
        <rect x="1" y="2" width="5" height="18" fill="#9b2f2f" />
        <rect x="8.5" y="2" width="5" height="18" fill="#c9818a" />
        <rect x="16" y="2" width="5" height="18" fill="#4a3350" />
      </svg>
      <span className={`font-serif ${compact ? 'text-lg' : 'text-2xl'} font-semibold tracking-tight text-ink`}>
        Tinctoria
      </span>
    </span>
  );
}
