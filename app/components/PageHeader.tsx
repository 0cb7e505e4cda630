import type { ReactNode } from "react";
import { cx } from "./cx";

/** The top of a page: an optional overline (section), the title in serif, a lede and actions on the right. */
export function PageHeader({
  title,
  overline,
  lede,
  actions,
  className,
}: {
  title: ReactNode;
  overline?: ReactNode;
  lede?: ReactNode;
  actions?: ReactNode;
  className?: string;
}) {
  return (
    <header className={cx("flex flex-col gap-4 border-b border-rule pb-6 sm:flex-row sm:items-end sm:justify-between", className)}>
      <div className="max-w-2xl space-y-2">
        {overline ? <p className="text-xs font-semibold uppercase tracking-[0.14em] text-brass-ink">{overline}</p> : null}
        <h1 className="text-3xl leading-tight sm:text-[2.5rem]">{title}</h1>
        {lede ? <p className="text-base text-ink-soft sm:text-lg">{lede}</p> : null}
      </div>
      {actions ? <div className="flex shrink-0 flex-wrap gap-2">{actions}</div> : null}
    </header>
  );
}
