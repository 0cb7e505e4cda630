import type { ReactNode } from "react";
import { cx } from "../cx";

/** A caution box for safety notes (buyers receiving and testing units): a warning triangle, a title, plain words. */
export function CautionBox({
  title,
  children,
  tone = "brass",
  className,
  headingLevel = 2,
}: {
  title: string;
  children: ReactNode;
  tone?: "brass" | "fault";
  className?: string;
  /** The title is a heading so the caution shows up in a screen reader's outline. */
  headingLevel?: 2 | 3 | 4;
}) {
  const Heading = `h${headingLevel}` as const;
  return (
    <aside
      aria-label={title}
      className={cx(
        "rounded-md border-l-4 px-4 py-3 text-sm",
        tone === "fault" ? "border-fault bg-fault-wash text-ink" : "border-brass bg-brass-wash text-ink",
        className,
      )}
    >
      <Heading
        className={cx("mb-1 flex items-center gap-2 font-sans text-sm font-semibold", tone === "fault" ? "text-fault" : "text-brass-ink")}
      >
        <svg aria-hidden="true" viewBox="0 0 16 16" className="size-4 shrink-0">
          <path d="M8 1.5 15 14H1z" fill="none" stroke="currentColor" strokeWidth="1.5" strokeLinejoin="round" />
          <path d="M8 6v4M8 11.8v.4" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" />
        </svg>
        {title}
      </Heading>
      <div className="space-y-1.5 text-ink-soft">{children}</div>
    </aside>
  );
}
