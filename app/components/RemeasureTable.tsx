import type { ReactNode } from "react";
import {
  REMEASURE_OUTCOME_LABELS,
  REMEASURE_ROW_LABELS,
  type Remeasurement,
  type RemeasureRow,
  type RemeasureRowOutcome,
} from "@shared/bench/remeasure";
import { cx } from "./cx";

// The listing's bench-sheet figure and the buyer's own reading side by side, each pair with its outcome
// in words and a shape (tick, cross, dashed circle) so it reads without colour.

const MARK: Record<RemeasureRowOutcome, { className: string; icon: ReactNode }> = {
  within: {
    className: "border-trace/30 bg-trace-wash text-trace",
    icon: (
      <path d="M4.5 8.3l2.2 2.2 4.8-5" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" strokeLinejoin="round" />
    ),
  },
  outside: {
    className: "border-fault/35 bg-fault-wash text-fault",
    icon: <path d="M5 5l6 6M11 5l-6 6" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" />,
  },
  not_comparable: {
    className: "border-rule-strong bg-sunk text-ink-soft",
    icon: <circle cx="8" cy="8" r="4.5" fill="none" stroke="currentColor" strokeWidth="1.5" strokeDasharray="2.2 1.8" />,
  },
};

export function RemeasureMark({ outcome, children }: { outcome: RemeasureRowOutcome; children?: ReactNode }) {
  const m = MARK[outcome];
  return (
    <span className={cx("inline-flex items-center gap-1 rounded-full border px-2 py-0.5 text-xs font-semibold leading-5", m.className)}>
      <svg aria-hidden="true" viewBox="0 0 16 16" className="size-3.5">
        {m.icon}
      </svg>
      {children ?? REMEASURE_ROW_LABELS[outcome]}
    </span>
  );
}

function directionWords(row: RemeasureRow): string | null {
  if (!row.direction || row.direction === "same" || row.outcome === "not_comparable") return null;
  return row.direction === "better" ? "better than listed" : "worse than listed";
}

function Side({ heading, display, conditions, extra }: { heading: string; display?: string; conditions?: string; extra?: string }) {
  return (
    <div className="min-w-0 space-y-0.5">
      <p className="text-xs font-medium uppercase tracking-wide text-ink-faint">{heading}</p>
      <p className="figures text-base text-ink">{display ?? "—"}</p>
      {conditions ? <p className="text-[0.8125rem] text-ink-soft">{conditions}</p> : null}
      {extra ? <p className="text-xs text-ink-faint">{extra}</p> : null}
    </div>
  );
}

function Row({ row }: { row: RemeasureRow }) {
  const dir = directionWords(row);
  return (
    <li className="space-y-2 rounded-md border border-rule bg-card px-3 py-3" data-outcome={row.outcome}>
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h3 className="font-sans text-sm font-semibold text-ink">{row.label}</h3>
        <RemeasureMark outcome={row.outcome} />
      </div>
      <div className="grid grid-cols-2 gap-3">
        <Side
          heading="Listing"
          display={row.listed?.display}
          conditions={row.listed?.conditionsText}
          extra={row.listed?.basis === "rated" ? "maker's rating" : undefined}
        />
        <Side heading="Buyer" display={row.measured.display} conditions={row.conditionsText} />
      </div>
      {row.difference ? (
        <p className="text-[0.8125rem] text-ink-soft">
          Difference <span className="figures text-ink">{row.difference.display}</span>
          {dir ? `, ${dir}` : ""}; tolerance <span className="figures text-ink">{row.tolerance.text}</span>.
        </p>
      ) : null}
      {row.reason ? <p className="text-[0.8125rem] text-ink-soft">{row.reason}</p> : null}
      <details className="text-xs text-ink-faint">
        <summary className="cursor-pointer">Why this tolerance</summary>
        <p className="mt-1">{row.tolerance.source}.</p>
      </details>
    </li>
  );
}

/** The buyer's re-measurement against the listing's bench sheet, pair by pair, with the overall outcome first. */
export function RemeasureTable({
  comparison,
  title = "Re-measurement against the bench sheet",
}: {
  comparison: Remeasurement;
  title?: string;
}) {
  const { counts } = comparison;
  return (
    <section aria-label={title} className="space-y-3">
      <div className="space-y-1">
        <h2 className="text-lg leading-snug">{title}</h2>
        <p className="text-sm text-ink" data-overall={comparison.outcome}>
          <strong>{REMEASURE_OUTCOME_LABELS[comparison.outcome]}.</strong>{" "}
          <span className="text-ink-soft">
            {counts.within} within tolerance, {counts.outside} outside, {counts.not_comparable} not comparable.
          </span>
        </p>
      </div>
      {comparison.rows.length ? (
        <ul className="space-y-2">
          {comparison.rows.map((row) => (
            <Row key={row.measured.index} row={row} />
          ))}
        </ul>
      ) : (
        <p className="text-sm text-ink-soft">No figures were entered.</p>
      )}
    </section>
  );
}
