import { Badge } from "~/components/Badge";
import { BenchVerifiedMark } from "~/components/BenchVerifiedMark";
import { ButtonLink } from "~/components/Button";
import { Price } from "~/components/Price";
import { EyeIcon, WatchButton } from "~/components/WatchButton";
import type { ListingHead, ViewerState } from "../types";

// Title, price, condition and the watch button; the state banner for units that are not plainly for sale.

export function StatusBanner({ listing, viewer }: { listing: ListingHead; viewer: ViewerState }) {
  switch (listing.status) {
    case "held":
      return (
        <Banner tone="brass" title="Held for the review desk">
          Only the seller and the review desk can see this page; it is not in the market until a moderator clears it.
          {listing.heldReason ? (
            <span className="mt-1 block">
              <span className="font-medium">Why:</span> {listing.heldReason}
            </span>
          ) : null}
        </Banner>
      );
    case "draft":
      return (
        <Banner tone="neutral" title="Draft">
          Only you can see this page. Buyers will see it like this once it is published.
        </Banner>
      );
    case "sold":
      return (
        <Banner tone="neutral" title="Sold">
          This unit has found a buyer. Its bench sheet and restoration log stay here as a record.
        </Banner>
      );
    case "withdrawn":
      return (
        <Banner tone="neutral" title="Withdrawn">
          {viewer.isSeller ? "You withdrew this listing" : "The seller withdrew this listing"}; it is no longer in the market.
        </Banner>
      );
    case "removed":
      return (
        <Banner tone="fault" title="Removed by the review desk">
          This listing is no longer in the market.
        </Banner>
      );
    default:
      return null;
  }
}

function Banner({ tone, title, children }: { tone: "brass" | "neutral" | "fault"; title: string; children: React.ReactNode }) {
  const tones = {
    brass: "border-brass/50 bg-brass-wash",
    neutral: "border-rule-strong bg-card",
    fault: "border-fault/35 bg-fault-wash",
  };
  return (
    <div role="status" className={`rounded-panel border px-4 py-3 text-sm text-ink ${tones[tone]}`}>
      <p className="font-semibold">{title}</p>
      <p className="text-ink-soft">{children}</p>
    </div>
  );
}

export function ListingTitle({ listing }: { listing: ListingHead }) {
  return (
    <div className="space-y-3">
      <p className="text-xs font-semibold uppercase tracking-[0.14em] text-brass-ink">
        {listing.categoryLabel}
        {listing.era ? <span className="text-ink-faint"> · {listing.era}</span> : null}
      </p>
      <h1 className="text-[2rem] leading-[1.15] text-balance sm:text-[2.5rem]">
        {listing.maker && listing.model ? (
          <>
            {listing.maker} <span className="whitespace-nowrap">{listing.model}</span>
          </>
        ) : (
          listing.title
        )}
      </h1>
      {listing.benchVerified ? <BenchVerifiedMark /> : null}
    </div>
  );
}

export function PriceAndCondition({ listing }: { listing: ListingHead }) {
  const { cosmetic, service, note } = listing.condition;
  return (
    <div className="space-y-4">
      {listing.priceMinor !== null ? (
        <div className="flex flex-wrap items-baseline gap-x-3 gap-y-1">
          <Price
            testId="price"
            minor={listing.priceMinor}
            currency={listing.currency}
            className="text-[1.875rem] font-semibold leading-none text-ink"
            approxClassName="text-lg font-medium"
          />
          {listing.offersWelcome ? <Badge tone="brass">Offers welcome</Badge> : null}
        </div>
      ) : null}
      {cosmetic || service ? (
        <dl className="grid gap-3 sm:grid-cols-2">
          {cosmetic ? (
            <div>
              <dt className="text-[0.6875rem] font-semibold uppercase tracking-[0.1em] text-ink-faint">Cosmetic</dt>
              <dd>
                <span className="font-medium text-ink">{cosmetic.label}</span>
                <span className="block text-[0.8125rem] leading-snug text-ink-faint">{cosmetic.description}</span>
              </dd>
            </div>
          ) : null}
          {service ? (
            <div>
              <dt className="text-[0.6875rem] font-semibold uppercase tracking-[0.1em] text-ink-faint">Service</dt>
              <dd>
                <span className="font-medium text-ink">{service.label}</span>
                <span className="block text-[0.8125rem] leading-snug text-ink-faint">{service.description}</span>
              </dd>
            </div>
          ) : null}
        </dl>
      ) : null}
      {note ? <p className="whitespace-pre-line border-l-2 border-walnut/30 pl-3 text-sm leading-relaxed text-ink-soft">{note}</p> : null}
    </div>
  );
}

/** The seller's way to their editor, and the desk's way back to its queue; both pages exist. */
export function OwnerLinks({ listing, viewer }: { listing: ListingHead; viewer: ViewerState }) {
  const editable = listing.status !== "sold" && listing.status !== "removed";
  if (viewer.isSeller && editable) {
    return (
      <div className="flex flex-wrap items-center gap-3">
        <ButtonLink to={`/sell/${listing.id}`} variant="secondary">
          Edit this listing
        </ButtonLink>
        <p className="text-xs text-ink-faint">This is your listing; buyers see it as below.</p>
      </div>
    );
  }
  // Moderators act on a listing, and read its trail, on its desk page.
  if (viewer.isModerator) {
    return (
      <ButtonLink to={`/desk/listings/${listing.id}`} variant="secondary">
        {listing.status === "held" ? "Decide on it at the review desk" : "Its trail at the review desk"}
      </ButtonLink>
    );
  }
  return null;
}

/** Watch for signed-in buyers (a form, so it works without script); a sign-in link for visitors. */
export function WatchControl({ listing, viewer }: { listing: ListingHead; viewer: ViewerState }) {
  if (listing.status !== "live" || viewer.isSeller) return null;
  if (!viewer.signedIn) {
    return (
      <ButtonLink to={viewer.signInHref} variant="secondary" className="w-full sm:w-auto">
        <EyeIcon />
        Sign in to watch
      </ButtonLink>
    );
  }
  if (!viewer.canWatch) return null;
  return <WatchButton listingId={listing.id} watching={viewer.watching} />;
}
