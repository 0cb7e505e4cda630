import { useMemo, useRef, useState, type RefObject } from "react";
import { CATEGORIES, CATEGORY_LABELS } from "@shared/catalogue";
import { MEASURED_FILTERS } from "@shared/market-filters";
import { appliedFilters, inCategory, marketHref } from "~/catalogue/market-view";
import { BenchGlyph } from "~/components/BenchVerifiedMark";
import { Button, buttonClass } from "~/components/Button";
import { CategoryNav } from "~/components/CategoryNav";
import { PageHeader } from "~/components/PageHeader";
import { cx } from "~/components/cx";
import { useMarketState } from "./use-market-state";
import { useMarketResults, type FirstPage } from "./use-market-results";
import { FilterPanel, type CountryOption } from "./FilterPanel";
import { useHydrated } from "./use-hydrated";
import { MarketResults } from "./MarketResults";

// The market page below its title: categories, the filter panel (a left column on a desktop, a
// disclosure above the results on a phone) and the results, all following the URL.

/** Parameters the panel has a field for: a server message naming one of these shows beside it. */
const PANEL_PARAMS = new Set([
  "q",
  "sort",
  "priceMin",
  "priceMax",
  "condition",
  "service",
  "seller",
  "verified",
  "mains",
  "deliverTo",
  "figures",
  ...MEASURED_FILTERS.map((m) => m.param),
]);

export interface MarketView {
  first: FirstPage;
  pager: { page: number; pageCount: number };
  watching: Record<string, boolean>;
  signedIn: boolean;
}

export function MarketExplorer({ first, pager, watching, signedIn, countries }: MarketView & { countries: CountryOption[] }) {
  const state = useMarketState();
  const results = useMarketResults(state.canonical, first);
  const { filters } = state;
  // A bad value in the address: the phone's panel starts open, so its message is seen.
  const [open, setOpen] = useState(() => state.issues.length > 0);
  const toggle = useRef<HTMLButtonElement>(null);
  // The phone's panel closed from inside: focus returns to its toggle, just above the results.
  const done = () => {
    if (!open) return;
    setOpen(false);
    toggle.current?.focus();
  };

  const { errors, problem } = useMemo(() => {
    const errors = new Map(state.issues.map((i) => [i.param, i.message]));
    let problem: string | null = null;
    const refused = results.error;
    if (refused) {
      const named = refused.issues.filter((i) => PANEL_PARAMS.has(i.path));
      for (const i of named) if (!errors.has(i.path)) errors.set(i.path, i.message);
      if (named.length === 0 || named.length < refused.issues.length) problem = refused.message;
    }
    for (const i of state.issues) if (!PANEL_PARAMS.has(i.param)) problem ??= i.message;
    return { errors, problem };
  }, [state.issues, results.error]);

  const counts = results.counts;
  const categoryCounts = CATEGORIES.map((category) => ({ category, live: counts?.category[category] ?? 0 }));
  const inUse = appliedFilters(filters).length;
  const title = filters.category ? CATEGORY_LABELS[filters.category].many : "The market";
  const toggleLabel = `Filters${inUse ? ` (${inUse})` : ""}`;

  return (
    <>
      <PageHeader
        overline="Market"
        title={title}
        lede="Used and vintage hi-fi. Filter by what the units measured on the bench; figures show the conditions they were measured in."
      />
      <CategoryNav counts={categoryCounts} current={filters.category} hrefFor={(c) => marketHref(inCategory(filters, c))} />
      <p className="flex items-start gap-2 text-sm text-ink-soft">
        <BenchGlyph className="mt-0.5 size-4 shrink-0 text-trace" />
        <span>
          <strong className="font-semibold text-trace">Bench-verified</strong>: the unit's bench sheet passed every check against physics
          and the trade's standards.
        </span>
      </p>
      <div className="lg:hidden">
        <FiltersToggle toggle={toggle} open={open} onClick={() => setOpen((o) => !o)} label={toggleLabel} />
      </div>
      <div className="gap-8 lg:grid lg:grid-cols-[17.5rem_minmax(0,1fr)] lg:items-start">
        <aside
          id="filters"
          aria-labelledby="filters-title"
          onKeyDown={(e) => {
            if (e.key === "Escape") done();
          }}
          className={cx(
            open ? "block" : "hidden",
            "mb-6 rounded-panel border border-rule bg-card px-4 pt-4 shadow-panel target:block lg:mb-0 lg:block lg:pb-4",
          )}
        >
          <h2 id="filters-title" className="mb-4 text-lg">
            Filters
          </h2>
          <FilterPanel state={state} counts={counts} errors={errors} total={results.total} countries={countries} onDone={done} />
        </aside>
        <MarketResults
          results={results}
          filters={filters}
          pager={pager}
          watching={watching}
          signedIn={signedIn}
          problem={problem}
          countries={countries}
        />
      </div>
    </>
  );
}

/** The phone's filter toggle: a button with JavaScript, without it a link to the panel (shown by :target). */
function FiltersToggle({
  toggle,
  open,
  onClick,
  label,
}: {
  toggle: RefObject<HTMLButtonElement | null>;
  open: boolean;
  onClick: () => void;
  label: string;
}) {
  return useHydrated() ? (
    <Button ref={toggle} variant="secondary" aria-expanded={open} aria-controls="filters" onClick={onClick} className="w-full">
      <FunnelIcon /> {label}
    </Button>
  ) : (
    <a href="#filters" className={buttonClass("secondary", "md", "w-full")}>
      <FunnelIcon /> {label}
    </a>
  );
}

function FunnelIcon() {
  return (
    <svg aria-hidden="true" viewBox="0 0 16 16" className="size-4">
      <path d="M2 3h12l-4.5 5.5V13l-3-1.5v-3z" fill="none" stroke="currentColor" strokeWidth="1.5" strokeLinejoin="round" />
    </svg>
  );
}
