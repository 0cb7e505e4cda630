import type { ReactNode } from "react";
import { cx } from "./cx";

export type Outcome = "consistent" | "questionable" | "implausible" | "missing";

// Each outcome has its own shape as well as its colour, so it reads without colour vision too:
// a tick, a half-filled circle, a cross, an empty circle.
const outcomeStyle: Record<Outcome, { className: string; label: string; icon: ReactNode }> = {
  consistent: {
    label: "Consistent",
    className: "border-trace/30 bg-trace-wash text-trace",
    icon: (
      <path d="M4.5 8.3l2.2 2.2 4.8-5" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" strokeLinejoin="round" />
    ),
  },
  questionable: {
    label: "Questionable",
    className: "border-brass/50 bg-brass-wash text-brass-ink",
    icon: (
      <>
        <circle cx="8" cy="8" r="5" fill="none" stroke="currentColor" strokeWidth="1.6" />
        <path d="M8 3a5 5 0 0 1 0 10z" fill="currentColor" />
      </>
    ),
  },
  implausible: {
    label: "Implausible",
    className: "border-fault/35 bg-fault-wash text-fault",
    icon: <path d="M5 5l6 6M11 5l-6 6" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" />,
  },
  missing: {
    label: "Missing",
    className: "border-rule-strong bg-sunk text-ink-soft",
    icon: <circle cx="8" cy="8" r="4.5" fill="none" stroke="currentColor" strokeWidth="1.5" strokeDasharray="2.2 1.8" />,
  },
};

/** A bench rule's outcome in Loadline's words, with its shape. */
export function OutcomeBadge({ outcome, children, className }: { outcome: Outcome; children?: ReactNode; className?: string }) {
  const s = outcomeStyle[outcome];
  return (
    <span
      className={cx(
        "inline-flex items-center gap-1 rounded-full border px-2 py-0.5 text-xs font-semibold leading-5",
        s.className,
        className,
      )}
    >
      <svg aria-hidden="true" viewBox="0 0 16 16" className="size-3.5">
        {s.icon}
      </svg>
      {children ?? s.label}
    </span>
  );
}

export type Tone = "neutral" | "walnut" | "brass" | "trace" | "fault";

const tones: Record<Tone, string> = {
  neutral: "border-rule bg-sunk text-ink-soft",
  walnut: "border-walnut/25 bg-walnut-wash text-walnut-deep",
  brass: "border-brass/45 bg-brass-wash text-brass-ink",
  trace: "border-trace/30 bg-trace-wash text-trace",
  fault: "border-fault/35 bg-fault-wash text-fault",
};

/** A small label for states and conditions (e.g. "Lived-in", "Held for review"). */
export function Badge({ tone = "neutral", children, className }: { tone?: Tone; children: ReactNode; className?: string }) {
  return (
    <span className={cx("inline-flex items-center rounded-full border px-2 py-0.5 text-xs font-medium leading-5", tones[tone], className)}>
      {children}
    </span>
  );
}
