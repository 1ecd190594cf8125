/** Plotproof's mark: three planted rows on a plot, one plant ringed by its checkpoint. */
export function Mark({ size = 28, className = "" }: { size?: number; className?: string }) {
  return (
    <svg width={size} height={size} viewBox="0 0 32 32" aria-hidden="true" className={className}>
      <rect x="1.5" y="1.5" width="29" height="29" rx="3" fill="#214d31" />
      <path d="M8 5v22M16 5v22M24 5v22" stroke="#dcebdf" strokeWidth="1.2" strokeDasharray="1.5 3" />
      <circle cx="8" cy="10" r="1.6" fill="#dcebdf" />
      <circle cx="24" cy="22" r="1.6" fill="#dcebdf" />
      <circle cx="16" cy="16" r="2.2" fill="#d99a1e" />
      <circle cx="16" cy="16" r="5.5" fill="none" stroke="#d99a1e" strokeWidth="1.4" />
    </svg>
  );
}

export function Wordmark() {
  return (
    <span className="inline-flex items-center gap-2 font-semibold tracking-tight text-ink">
      <Mark />
      <span className="text-lg">Plotproof</span>
    </span>
  );
}
