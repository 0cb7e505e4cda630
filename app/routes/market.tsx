import type { Route } from "./+types/market";
import { CATEGORY_LABELS, type Category } from "@shared/catalogue";
import { marketPage, parseMarketSearch } from "~/catalogue/market.server";
import { getUser } from "~/auth/guards.server";
import { watchStates } from "~/listings/watch.server";
import { WatchButton } from "~/components/WatchButton";
import { CategoryNav } from "~/components/CategoryNav";
import { ListingCard } from "~/components/ListingCard";
import { PageHeader } from "~/components/PageHeader";
import { Pagination } from "~/components/Pagination";
import { BenchGlyph } from "~/components/BenchVerifiedMark";
import { marketDescription } from "~/meta";

export async function loader({ request }: Route.LoaderArgs) {
  const [page, user] = await Promise.all([marketPage(parseMarketSearch(new URL(request.url))), getUser(request)]);
  // Signed in: which cards show a watch button, and in which state (never on the buyer's own units).
  const watching = user
    ? await watchStates(
        user.id,
        page.items.map((l) => l.id),
      )
    : {};
  return { ...page, watching };
}

export const meta: Route.MetaFunction = ({ data }) => {
  const many = data?.category ? CATEGORY_LABELS[data.category].many : null;
  return [{ title: `${many ?? "Used and vintage hi-fi"} · Market · Loadline` }, { name: "description", content: marketDescription(many) }];
};

function marketHref(category: Category | null, page = 1): string {
  const q = new URLSearchParams();
  if (category) q.set("category", CATEGORY_LABELS[category].slug);
  if (page > 1) q.set("page", String(page));
  const s = q.toString();
  return s ? `/market?${s}` : "/market";
}

export default function Market({ loaderData }: Route.ComponentProps) {
  const { items, total, page, pageCount, category, counts, watching } = loaderData;
  const title = category ? CATEGORY_LABELS[category].many : "The market";
  return (
    <main className="mx-auto w-full max-w-6xl space-y-6 px-4 py-8 sm:px-6 sm:py-10">
      <PageHeader
        overline="Market"
        title={title}
        lede={
          <>
            <span className="figures">{total}</span> {total === 1 ? "unit" : "units"} for sale, newest first. Figures are shown with the
            conditions they were measured in.
          </>
        }
      />
      <CategoryNav counts={counts} current={category} hrefFor={(c) => marketHref(c)} />
      <p className="flex items-start gap-2 text-sm text-ink-soft">
        <BenchGlyph className="mt-0.5 size-4 shrink-0 text-trace" />
        <span>
          <strong className="font-semibold text-trace">Bench-verified</strong>: the unit's bench sheet passed every check against physics
          and the trade's standards.
        </span>
      </p>
      {items.length ? (
        <section aria-labelledby="results">
          {/* The cards' titles are h3s: this keeps the outline h1 → h2 → h3 for screen readers. */}
          <h2 id="results" className="sr-only">
            Units for sale
          </h2>
          <ul className="grid grid-cols-1 gap-5 sm:grid-cols-2 lg:grid-cols-3">
            {items.map((l, i) => (
              <li key={l.id} className="flex min-w-0">
                <ListingCard
                  listing={l}
                  href={`/listings/${l.id}`}
                  className="w-full"
                  priority={i === 0}
                  action={
                    l.id in watching ? (
                      <WatchButton listingId={l.id} watching={watching[l.id]} action={`/listings/${l.id}`} layout="card" />
                    ) : null
                  }
                />
              </li>
            ))}
          </ul>
        </section>
      ) : (
        <div className="rounded-panel border border-dashed border-rule-strong bg-card/60 px-6 py-12 text-center">
          <h2 className="text-xl">Nothing here yet</h2>
          <p className="mt-2 text-ink-soft">
            No {category ? CATEGORY_LABELS[category].many.toLowerCase() : "units"} are for sale right now. Try another category.
          </p>
        </div>
      )}
      <Pagination page={page} pageCount={pageCount} hrefFor={(p) => marketHref(category, p)} className="pt-2" />
    </main>
  );
}
