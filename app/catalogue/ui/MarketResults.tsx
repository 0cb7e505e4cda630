import { Link } from "react-router";
import { useQuery } from "@tanstack/react-query";
import { CATEGORY_LABELS } from "@shared/catalogue";
import { marketFiltersToParams, withoutPaging, type MarketFilters } from "@shared/market-filters";
import { appliedFilters, marketPageHref } from "~/catalogue/market-view";
import { ListingCard } from "~/components/ListingCard";
import { Pagination } from "~/components/Pagination";
import { WatchButton } from "~/components/WatchButton";
import { Button } from "~/components/Button";
import { cx } from "~/components/cx";
import type { useMarketResults } from "./use-market-results";
import { AppliedFilters } from "./AppliedFilters";
import type { CountryOption } from "./FilterPanel";
import { useHydrated } from "./use-hydrated";

// The results beside the panel: how many units, the filters in use, the cards, and more of them. While
// new filters load, the previous cards stay (dimmed) and a status line says so to screen readers too.

type Results = ReturnType<typeof useMarketResults>;

export function MarketResults({
  results,
  filters,
  pager,
  watching,
  signedIn,
  problem,
  countries,
}: {
  results: Results;
  filters: MarketFilters;
  pager: { page: number; pageCount: number };
  /** The loader's watch states for its cards (never the buyer's own units). */
  watching: Record<string, boolean>;
  signedIn: boolean;
  /** A refusal or failure not tied to one field. */
  problem: string | null;
  countries: readonly CountryOption[];
}) {
  const { items, total, counts, updating, loading } = results;
  // Queries run only in the browser: on the server this asks nothing.
  const watched = useWatchedIds(signedIn && items.some((l) => !(l.id in watching)));
  const alertParams = marketFiltersToParams(withoutPaging(filters)).toString();
  const units = `${total} ${total === 1 ? "unit" : "units"}`;
  return (
    <section aria-labelledby="results" aria-busy={updating || loading} className="min-w-0 space-y-4">
      <h2 id="results" className="sr-only">
        Units for sale
      </h2>
      <div className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-2">
        <p role="status" className="flex items-center gap-2 text-sm font-medium text-ink-soft">
          {updating || loading ? (
            <>
              <Spinner /> Updating…
            </>
          ) : (
            <span>
              <span className="figures">{total}</span> {total === 1 ? "unit matches" : "units match"}
            </span>
          )}
        </p>
        {appliedFilters(filters).length ? (
          <Link to={`/alerts/new?${alertParams}`} className="text-sm font-medium text-walnut hover:text-walnut-deep">
            Save these filters as an alert
          </Link>
        ) : null}
      </div>
      <AppliedFilters filters={filters} counts={counts} countries={countries} />
      {problem ? (
        <div
          role="alert"
          className="flex flex-wrap items-center justify-between gap-3 rounded-md border border-fault/40 bg-fault-wash px-3 py-2 text-sm text-fault"
        >
          <span className="font-medium">{problem}</span>
          <Button size="sm" variant="secondary" onClick={results.retry}>
            Try again
          </Button>
        </div>
      ) : null}
      {loading ? (
        <p className="rounded-panel border border-dashed border-rule-strong bg-card/60 px-6 py-12 text-center text-ink-soft">
          Loading units…
        </p>
      ) : items.length ? (
        <ul className={cx("grid grid-cols-1 gap-5 transition-opacity sm:grid-cols-2 xl:grid-cols-3", updating && "opacity-55")}>
          {items.map((l, i) => (
            <li key={l.id} className="flex min-w-0">
              <ListingCard
                listing={l}
                href={`/listings/${l.id}`}
                // Cards below the first row are laid out and painted when scrolled near, not with the page.
                className={cx("w-full", i > 1 && "[contain-intrinsic-size:auto_28rem] [content-visibility:auto]")}
                priority={i === 0}
                action={
                  l.id in watching || (watched && signedIn) ? (
                    <WatchButton
                      listingId={l.id}
                      watching={watching[l.id] ?? watched?.has(l.id) ?? false}
                      action={`/listings/${l.id}`}
                      layout="card"
                    />
                  ) : null
                }
              />
            </li>
          ))}
        </ul>
      ) : (
        <Empty filters={filters} results={results} countries={countries} />
      )}
      <MoreResults results={results} filters={filters} pager={pager} units={units} />
    </section>
  );
}

/** With JavaScript, "Load more" follows the cursor; without it, the pager's links. */
function MoreResults({
  results,
  filters,
  pager,
  units,
}: {
  results: Results;
  filters: MarketFilters;
  pager: { page: number; pageCount: number };
  units: string;
}) {
  const hydrated = useHydrated();
  if (!hydrated)
    return <Pagination page={pager.page} pageCount={pager.pageCount} hrefFor={(p) => marketPageHref(filters, p)} className="pt-2" />;
  return results.hasMore ? (
    <div className="flex justify-center pt-2">
      <Button variant="secondary" busy={results.loadingMore} onClick={results.loadMore}>
        {results.loadingMore ? "Loading more…" : `Load more of ${units}`}
      </Button>
    </div>
  ) : null;
}

function Empty({ filters, results, countries }: { filters: MarketFilters; results: Results; countries: readonly CountryOption[] }) {
  const applied = appliedFilters(filters);
  const what = filters.category ? CATEGORY_LABELS[filters.category].many.toLowerCase() : "units";
  return (
    <div className="rounded-panel border border-dashed border-rule-strong bg-card/60 px-6 py-10 text-center">
      <h3 className="text-xl">No {what} match</h3>
      {applied.length ? (
        <>
          <p className="mt-2 text-ink-soft">Loosen one of these filters, or clear them all:</p>
          <AppliedFilters filters={filters} counts={results.counts} countries={countries} showCounts className="mt-4 justify-center" />
        </>
      ) : (
        <p className="mt-2 text-ink-soft">
          None are for sale right now. Try another category or <Link to="/market">the whole market</Link>.
        </p>
      )}
    </div>
  );
}

/** The buyer's watched units, for cards that came after the page loaded (the loader knew only its own). */
function useWatchedIds(enabled: boolean): Set<string> | null {
  const query = useQuery({
    queryKey: ["watches"],
    enabled,
    queryFn: async ({ signal }) => {
      const response = await fetch("/api/v1/watches", { headers: { Accept: "application/json" }, signal });
      if (!response.ok) throw new Error(`watches ${response.status}`);
      const body = (await response.json()) as { watches: { listingId: string }[] }; // our own API's answer
      return new Set(body.watches.map((w) => w.listingId));
    },
  });
  return query.data ?? null;
}

function Spinner() {
  return (
    <svg aria-hidden="true" viewBox="0 0 16 16" className="size-4 animate-spin text-walnut">
      <circle cx="8" cy="8" r="6" fill="none" stroke="currentColor" strokeOpacity="0.3" strokeWidth="2" />
      <path d="M14 8a6 6 0 0 0-6-6" fill="none" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
    </svg>
  );
}
