/** Ballast's mark: a keel weight under a waterline, drawn in ink with the brass accent. */
export function Logo({ className = "", withWord = true }: { className?: string; withWord?: boolean }) {
  return (
    <span className={`inline-flex items-center gap-2 ${className}`}>
      <svg viewBox="0 0 32 32" width="28" height="28" aria-hidden="true" focusable="false">
        <rect x="1" y="1" width="30" height="30" rx="7" fill="#1c2733" />
        <path d="M6 12h20" stroke="#f7f5f0" strokeWidth="2" strokeLinecap="round" />
        <path d="M9 16h14l-3 9h-8z" fill="#a8671c" />
      </svg>
      {withWord ? <span className="text-lg font-semibold tracking-tight">Ballast</span> : null}
    </span>
  );
}
