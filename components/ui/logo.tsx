/** Stokeline's mark: a channel that narrows into a laminar stream, drawn in ink and stream teal. */
export function Logo({ className = "h-7 w-7" }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={className} aria-hidden="true" focusable="false">
      <rect x="1" y="1" width="30" height="30" rx="7" className="fill-ink-800" />
      <path d="M5 11h8c4 0 5 5 9 5h5" className="stroke-stream-300" strokeWidth="2.4" fill="none" strokeLinecap="round" />
      <path d="M5 21h8c4 0 5-5 9-5" className="stroke-white" strokeWidth="2.4" fill="none" strokeLinecap="round" />
      <circle cx="27" cy="16" r="2" className="fill-stream-300" />
    </svg>
  );
}

export function Wordmark() {
  return (
    <span className="inline-flex items-center gap-2 font-semibold tracking-tight text-ink-900">
      <Logo />
      <span className="text-lg">Stokeline</span>
    </span>
  );
}
