import type { ReactNode } from "react";
import { Card } from "~/components/Card";
import { cx } from "~/components/cx";

/** One part of a step: a serif title, a line on why it matters, then its fields. */
export function Section({
  title,
  lede,
  children,
  className,
  id,
}: {
  title: string;
  lede?: ReactNode;
  children: ReactNode;
  className?: string;
  id?: string;
}) {
  return (
    <Card className={cx("space-y-5", className)}>
      <div className="space-y-1">
        <h2 id={id} className="text-lg leading-snug">
          {title}
        </h2>
        {lede ? <p className="text-sm text-ink-soft">{lede}</p> : null}
      </div>
      {children}
    </Card>
  );
}

/** A brass caution box for safety notes: what can hurt, in plain words. */
export function Caution({
  title,
  children,
  tone = "brass",
  className,
}: {
  title: string;
  children: ReactNode;
  tone?: "brass" | "fault";
  className?: string;
}) {
  return (
    <aside
      className={cx(
        "rounded-md border-l-4 px-4 py-3 text-sm",
        tone === "fault" ? "border-fault bg-fault-wash text-ink" : "border-brass bg-brass-wash text-ink",
        className,
      )}
    >
      <p className={cx("mb-1 flex items-center gap-2 font-semibold", tone === "fault" ? "text-fault" : "text-brass-ink")}>
        <svg aria-hidden="true" viewBox="0 0 16 16" className="size-4 shrink-0">
          <path d="M8 1.5 15 14H1z" fill="none" stroke="currentColor" strokeWidth="1.5" strokeLinejoin="round" />
          <path d="M8 6v4M8 11.8v.4" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" />
        </svg>
        {title}
      </p>
      <div className="space-y-1.5 text-ink-soft">{children}</div>
    </aside>
  );
}
