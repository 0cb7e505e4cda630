import { cx } from "./cx";

/**
 * Loadline's mark: a resistor-style load (a zig-zag) drawn between two terminals, with a level line
 * running through it — the dummy load every amplifier is measured into. Drawn here, no outside logo.
 */
export function LoadlineMark({ className }: { className?: string }) {
  return (
    <svg aria-hidden="true" viewBox="0 0 32 32" className={className}>
      <rect x="1" y="1" width="30" height="30" rx="7" fill="var(--color-walnut)" />
      <path d="M5 21.5h22" stroke="var(--color-brass)" strokeWidth="1.6" strokeLinecap="round" />
      <path
        d="M5 14h4l1.6-4 3 8 3-8 3 8 1.8-4H27"
        fill="none"
        stroke="var(--color-card)"
        strokeWidth="2"
        strokeLinecap="round"
        strokeLinejoin="round"
      />
      <circle cx="5" cy="14" r="1.6" fill="var(--color-brass)" />
      <circle cx="27" cy="14" r="1.6" fill="var(--color-brass)" />
    </svg>
  );
}

export function Wordmark({ className }: { className?: string }) {
  return (
    <span className={cx("inline-flex items-center gap-2.5", className)}>
      <LoadlineMark className="size-8 shrink-0" />
      <span className="font-serif text-[1.375rem] font-semibold tracking-[-0.015em] text-ink">Loadline</span>
    </span>
  );
}
