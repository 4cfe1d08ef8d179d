/** Plateau's mark: a wire cross-section (metal over a dielectric step) next to the name. */
export function Wordmark({ className = "" }: { className?: string }) {
  return (
    <span className={`inline-flex items-center gap-2 font-semibold tracking-tight text-ink ${className}`}>
      <svg viewBox="0 0 24 24" width="20" height="20" aria-hidden="true" focusable="false">
        <rect x="1" y="17" width="22" height="5" rx="1" fill="#c4c0b6" />
        <rect x="4" y="8" width="6" height="9" rx="1" fill="#b4622d" />
        <rect x="14" y="8" width="6" height="9" rx="1" fill="#b4622d" />
        <path d="M1 6h22" stroke="#5f6368" strokeWidth="1.5" strokeLinecap="round" />
      </svg>
      Plateau
    </span>
  );
}
