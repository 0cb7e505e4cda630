import { cx } from "~/components/cx";

/** Marks a figure or plot that the bench computed from a raw capture rather than a typed number. */
export function CaptureTag({ title, className }: { title?: string; className?: string }) {
  return (
    <span
      className={cx(
        "inline-flex items-center gap-1 rounded border border-trace/30 bg-trace-wash px-1.5 py-px text-[0.6875rem] font-semibold uppercase tracking-[0.06em] text-trace",
        className,
      )}
      title={title ?? "Computed by the bench from the seller's raw capture file"}
    >
      <svg aria-hidden="true" viewBox="0 0 16 16" className="size-3">
        <path
          d="M1.5 8h2l1.5-4 2.5 8 2.5-8 1.5 4h3"
          fill="none"
          stroke="currentColor"
          strokeWidth="1.6"
          strokeLinecap="round"
          strokeLinejoin="round"
        />
      </svg>
      Capture
    </span>
  );
}
