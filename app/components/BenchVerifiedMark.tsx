import { cx } from "./cx";

/**
 * The bench-verified mark: a trace line crossing a small square graticule, in trace green.
 * `compact` shows the glyph and a short word for cards; the full form names what it means.
 */
export function BenchVerifiedMark({ compact = false, className }: { compact?: boolean; className?: string }) {
  return (
    <span
      className={cx(
        "inline-flex items-center gap-1.5 rounded-md border border-trace/35 bg-trace-wash font-semibold text-trace",
        compact ? "px-1.5 py-0.5 text-xs" : "px-2.5 py-1 text-sm",
        className,
      )}
      title="The bench sheet passed Loadline's checks against physics and the trade's standards"
    >
      <BenchGlyph className={compact ? "size-3.5" : "size-4"} />
      <span>Bench-verified</span>
    </span>
  );
}

export function BenchGlyph({ className }: { className?: string }) {
  return (
    <svg aria-hidden="true" viewBox="0 0 20 20" className={className}>
      <rect x="1.5" y="1.5" width="17" height="17" rx="3" fill="none" stroke="currentColor" strokeWidth="1.4" />
      <path d="M1.5 10h17M10 1.5v17" stroke="currentColor" strokeOpacity="0.3" strokeWidth="1" />
      <path
        d="M3 12.5c1.6 0 2-6 3.6-6s2 7 3.6 7 2-7 3.6-7 1.6 3 3.2 3"
        fill="none"
        stroke="currentColor"
        strokeWidth="1.7"
        strokeLinecap="round"
        strokeLinejoin="round"
      />
    </svg>
  );
}
