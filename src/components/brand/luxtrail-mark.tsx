/** The Luxtrail word mark: a trail of survey points rising to a lamp. */
export function LuxtrailMark({ className }: { className?: string }) {
  return (
    <span className={`inline-flex items-center gap-2 ${className ?? ''}`}>
      <svg viewBox="0 0 32 32" className="h-full w-auto" aria-hidden>
        <rect width="32" height="32" rx="7" fill="#141b2d" />
        <path d="M6 24 C 11 22, 15 15, 17 8" stroke="#f5b53d" strokeWidth="3" fill="none" strokeLinecap="round" />
        <circle cx="17" cy="8" r="3.2" fill="#ffd98a" />
        <circle cx="9" cy="22.6" r="1.6" fill="#f5b53d" />
        <circle cx="13.5" cy="18" r="1.6" fill="#f5b53d" />
      </svg>
      <span className="text-[1.15em] font-semibold tracking-tight">Luxtrail</span>
    </span>
  );
}
