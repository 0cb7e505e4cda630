import { Link } from "react-router";
import { CATEGORY_LABELS, type Category } from "@shared/catalogue";
import { cx } from "./cx";

/** Category filter as plain links ("All" first) with live counts; the current one is marked for screen readers. */
export function CategoryNav({
  counts,
  current,
  hrefFor,
}: {
  counts: { category: Category; live: number }[];
  current: Category | null;
  hrefFor: (c: Category | null) => string;
}) {
  const total = counts.reduce((n, c) => n + c.live, 0);
  const chip = (active: boolean) =>
    cx(
      "inline-flex h-9 shrink-0 items-center gap-2 whitespace-nowrap rounded-full border px-3.5 text-sm font-medium no-underline transition-colors",
      active ? "border-walnut bg-walnut text-card" : "border-rule-strong bg-card text-ink-soft hover:border-walnut hover:text-ink",
    );
  const count = (n: number, active: boolean) => (
    <span className={cx("figures text-xs", active ? "text-card/80" : "text-ink-faint")}>{n}</span>
  );
  return (
    <nav aria-label="Categories" className="scroll-hint -mx-4 overflow-x-auto px-4 sm:mx-0 sm:px-0">
      <ul className="flex gap-2 pb-1 sm:flex-wrap">
        <li>
          <Link to={hrefFor(null)} className={chip(current === null)} aria-current={current === null ? "page" : undefined}>
            All {count(total, current === null)}
          </Link>
        </li>
        {counts.map(({ category, live }) => {
          const active = current === category;
          return (
            <li key={category}>
              <Link to={hrefFor(category)} className={chip(active)} aria-current={active ? "page" : undefined}>
                {CATEGORY_LABELS[category].many} {count(live, active)}
              </Link>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
