import { Link } from "react-router";
import type { FilterCounts, MarketFilters } from "@shared/market-filters";
import { appliedFilters, clearedFilters, marketHref, type AppliedFilter } from "~/catalogue/market-view";
import { cx } from "~/components/cx";
import type { CountryOption } from "./FilterPanel";

// The filters in use as chips, each a link to the same search without it (so they work without
// JavaScript too), and "Clear all".

const chip =
  "inline-flex h-8 items-center gap-1.5 rounded-full border border-rule-strong bg-card px-3 text-sm text-ink no-underline " +
  "hover:border-walnut hover:text-walnut-deep";

export function AppliedFilters({
  filters,
  counts,
  countries,
  showCounts = false,
  className,
}: {
  filters: MarketFilters;
  /** The countries as the market's loader named them, for the "Delivers to" chip. */
  countries: readonly CountryOption[];
  counts: FilterCounts | null;
  /** Beside each chip, how many units there would be without it (where the counts say). */
  showCounts?: boolean;
  className?: string;
}) {
  const applied = appliedFilters(filters, (code) => countries.find((c) => c.value === code)?.label ?? code);
  if (applied.length === 0) return null;
  return (
    <ul aria-label="Filters in use" className={cx("flex flex-wrap items-center gap-2", className)}>
      {applied.map((a) => {
        const without = showCounts ? unitsWithout(a, filters, counts) : null;
        return (
          <li key={a.id}>
            <Link to={marketHref(a.without)} preventScrollReset className={chip}>
              {/* The name begins with what the chip shows, so speech control finds it by what is seen. */}
              <span>
                <span className="sr-only">Remove </span>
                {a.label}
              </span>
              {without === null ? null : <span className="figures text-xs text-ink-faint">{without} without it</span>}
              <svg aria-hidden="true" viewBox="0 0 12 12" className="size-3 text-ink-faint">
                <path d="M3 3l6 6M9 3l-6 6" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" />
              </svg>
            </Link>
          </li>
        );
      })}
      <li>
        <Link
          to={marketHref(clearedFilters(filters))}
          preventScrollReset
          className="px-1 text-sm font-medium text-walnut hover:text-walnut-deep"
        >
          Clear all
        </Link>
      </li>
    </ul>
  );
}

/** Units left with this one filter removed, where the counts tell (each unit has one grade, one state, one kind of seller). */
export function unitsWithout(a: AppliedFilter, f: MarketFilters, counts: FilterCounts | null): number | null {
  if (!counts) return null;
  const [param, value] = a.id.split(":");
  const sum = (all: Record<string, number>, keep: readonly string[]) =>
    (keep.length ? keep : Object.keys(all)).reduce((n, k) => n + (all[k] ?? 0), 0);
  if (param === "condition")
    return sum(
      counts.condition,
      f.condition.filter((g) => g !== value),
    );
  if (param === "service")
    return sum(
      counts.service,
      f.service.filter((s) => s !== value),
    );
  if (param === "seller") return sum(counts.seller, []);
  return null;
}
