import type { InputHTMLAttributes, ReactNode } from "react";
import { cx } from "~/components/cx";

// One checkbox or radio in the filter panel, with how many units choosing it would leave.

export function Choice({
  label,
  count,
  className,
  ...input
}: { label: ReactNode; count?: number | null; className?: string } & Omit<InputHTMLAttributes<HTMLInputElement>, "className">) {
  return (
    <label className={cx("flex cursor-pointer items-center gap-2.5 py-1 text-sm text-ink", className)}>
      <input {...input} className="size-4 shrink-0 accent-walnut" />
      <span className="min-w-0 flex-1">{label}</span>
      {count === undefined || count === null ? null : <Count n={count} />}
    </label>
  );
}

/** "12" beside a choice, read as "12 units". */
export function Count({ n }: { n: number }) {
  return (
    <span className="figures text-xs text-ink-faint">
      {n}
      <span className="sr-only"> {n === 1 ? "unit" : "units"}</span>
    </span>
  );
}

export function Legend({ children }: { children: ReactNode }) {
  return <legend className="mb-1.5 text-sm font-semibold text-ink">{children}</legend>;
}
