import { Link } from "react-router";
import { Badge } from "~/components/Badge";
import { Card } from "~/components/Card";
import { ListingCard } from "~/components/ListingCard";
import { PageHeader } from "~/components/PageHeader";
import type { SellerProfile } from "../profile.server";
import { RatingPips } from "./RatingPips";
import { ReviewList } from "./ReviewList";

// A seller's or a workshop's public page: who they are, their standing in figures, the latest
// reviews and what they have in the market now.

const statTitle = "font-sans text-xs font-semibold uppercase tracking-[0.14em] text-brass-ink";

export function ProfilePage({ profile }: { profile: SellerProfile }) {
  const { seller, workshop, rating, verified, completedSales, live, reviews } = profile;
  const name = workshop?.name ?? seller.name;
  const share = verified.listings ? Math.round((verified.benchVerified / verified.listings) * 100) : null;
  return (
    <main className="mx-auto w-full max-w-6xl space-y-8 px-4 pb-16 pt-6 sm:px-6">
      <PageHeader
        overline={workshop ? "Workshop" : "Private seller"}
        title={name}
        lede={workshop?.place ?? null}
        actions={
          workshop ? workshop.verified ? <Badge tone="trace">Verified workshop</Badge> : <Badge>Workshop, not yet verified</Badge> : null
        }
      />
      {workshop?.about ? <p className="max-w-3xl leading-relaxed text-ink-soft">{workshop.about}</p> : null}

      <section aria-labelledby="standing" className="grid grid-cols-2 gap-4 md:grid-cols-4">
        <h2 id="standing" className="sr-only">
          Standing
        </h2>
        <Card className="space-y-1.5">
          <p className={statTitle}>Rating</p>
          {rating.average !== null ? <RatingPips value={rating.average} /> : <p className="text-sm text-ink-soft">Not rated yet</p>}
          <p className="text-xs text-ink-faint" data-testid="review-count">
            <span className="figures">{rating.count}</span> {rating.count === 1 ? "review" : "reviews"}
          </p>
        </Card>
        <Card className="space-y-1.5">
          <p className={statTitle}>Completed sales</p>
          <p className="figures text-2xl text-ink" data-testid="completed-sales">
            {completedSales}
          </p>
        </Card>
        <Card className="space-y-1.5">
          <p className={statTitle}>Bench-verified</p>
          <p className="figures text-2xl text-ink" data-testid="verified-share">
            {share === null ? "–" : `${share} %`}
          </p>
          <p className="text-xs text-ink-faint">
            {verified.listings
              ? `${verified.benchVerified} of ${verified.listings} ${verified.listings === 1 ? "unit" : "units"} put in the market`
              : "Nothing in the market yet"}
          </p>
        </Card>
        <Card className="space-y-1.5">
          <p className={statTitle}>On Loadline since</p>
          <p className="text-lg text-ink">{seller.memberSince}</p>
        </Card>
      </section>

      <div className="grid gap-10 lg:grid-cols-12">
        <section aria-labelledby="reviews-heading" className="space-y-4 lg:col-span-5">
          <h2 id="reviews-heading" className="text-2xl">
            What buyers said
          </h2>
          <ReviewList reviews={reviews} sellerName={name} />
          <p className="text-xs text-ink-faint">
            Only buyers whose order was completed can rate a seller, once per order. The review desk hides a review only when it is abusive.
          </p>
        </section>
        <section aria-labelledby="live-heading" className="space-y-4 lg:col-span-7">
          <h2 id="live-heading" className="text-2xl">
            In the market now
          </h2>
          {live.length ? (
            <ul className="grid grid-cols-1 gap-5 sm:grid-cols-2">
              {live.map((l) => (
                <li key={l.id} className="flex min-w-0">
                  <ListingCard listing={l} href={`/listings/${l.id}`} className="w-full" />
                </li>
              ))}
            </ul>
          ) : (
            <p className="text-sm text-ink-soft">
              Nothing for sale right now. <Link to="/market">Browse the market</Link>
            </p>
          )}
        </section>
      </div>
    </main>
  );
}
