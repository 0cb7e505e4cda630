import { cx } from "./cx";

/**
 * A measured figure: value and unit in tabular mono, the conditions beside it in the UI face.
 * Loadline never shows a figure without its unit and conditions.
 */
export function Figure({
  value,
  unit,
  conditions,
  label,
  size = "md",
  className,
}: {
  value: string;
  unit: string;
  conditions: string;
  /** What was measured, e.g. "Output power". */
  label?: string;
  size?: "sm" | "md" | "lg";
  className?: string;
}) {
  return (
    <div className={cx("min-w-0", className)}>
      {label ? <div className="mb-0.5 text-[0.6875rem] font-semibold uppercase tracking-[0.1em] text-ink-faint">{label}</div> : null}
      <div className="flex flex-wrap items-baseline gap-x-2 gap-y-0.5">
        <span className={cx("figures font-medium text-ink", size === "lg" ? "text-2xl" : size === "md" ? "text-lg" : "text-[0.9375rem]")}>
          {value}
          <span className="ml-1 text-ink-soft">{unit}</span>
        </span>
        <span className="text-[0.8125rem] leading-snug text-ink-faint">{conditions}</span>
      </div>
    </div>
  );
}
