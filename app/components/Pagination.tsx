import { Link } from "react-router";
import { cx } from "./cx";

/** Previous / page n of m / next, as plain links so it works without JavaScript. */
export function Pagination({
  page,
  pageCount,
  hrefFor,
  className,
  labels = { previous: "← Newer", next: "Older →" },
}: {
  page: number;
  pageCount: number;
  hrefFor: (page: number) => string;
  className?: string;
  /** The links' words: newer/older for lists by date, previous/next where the order is the reader's choice. */
  labels?: { previous: string; next: string };
}) {
  if (pageCount <= 1) return null;
  const item = "inline-flex h-9 items-center rounded-md border px-3 text-sm font-medium no-underline";
  // The end of the run in either direction: plain text, not a link, still legible (4.5:1 or better).
  const spent = cx(item, "border-rule text-ink-faint");
  return (
    <nav aria-label="Pages" className={cx("flex items-center justify-between gap-3", className)}>
      {page > 1 ? (
        <Link to={hrefFor(page - 1)} rel="prev" className={cx(item, "border-rule-strong bg-card text-ink hover:border-walnut")}>
          {labels.previous}
        </Link>
      ) : (
        <span className={spent} aria-hidden="true">
          {labels.previous}
        </span>
      )}
      <p className="text-sm text-ink-soft">
        Page <span className="figures">{page}</span> of <span className="figures">{pageCount}</span>
      </p>
      {page < pageCount ? (
        <Link to={hrefFor(page + 1)} rel="next" className={cx(item, "border-rule-strong bg-card text-ink hover:border-walnut")}>
          {labels.next}
        </Link>
      ) : (
        <span className={spent} aria-hidden="true">
          {labels.next}
        </span>
      )}
    </nav>
  );
}
