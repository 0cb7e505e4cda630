import { Link } from "react-router";
import { momentText } from "@shared/dates";

// A copied_photo flag on the desk: the flagged listing's photo beside the photo it matches, each
// with its listing's title, state and seller, so a moderator judges the copy by eye. Stacked on a
// phone, side by side from a tablet up. Data from copiedPhotoPair (../copied-photo-pair.server.ts).

export type PairSide = {
  photoId: string;
  imageUrl: string | null;
  listingId: string;
  listingTitle: string;
  listingStatus: string;
  publishedAt: string | null;
  sellerId: string;
  sellerName: string;
};

export type CopiedPhotoPairData = { photo: PairSide; original: PairSide; distance: number };

export function CopiedPhotoPair({ pair }: { pair: CopiedPhotoPairData }) {
  return (
    <figure className="space-y-3" data-testid="copied-photo-pair">
      <div className="grid gap-4 sm:grid-cols-2">
        <Side side={pair.photo} heading="This listing's photo" testId="copied-photo-this" />
        <Side side={pair.original} heading="Matches a photo on another seller's listing" testId="copied-photo-other" />
      </div>
      <figcaption className="text-sm text-ink-soft">
        The two photos' fingerprints differ in <span className="figures">{pair.distance}</span> of <span className="figures">64</span> bits;{" "}
        <span className="figures">0</span> is the same picture, and photos of different units usually differ in about half.
      </figcaption>
    </figure>
  );
}

function Side({ side, heading, testId }: { side: PairSide; heading: string; testId: string }) {
  return (
    <div className="rounded-panel border border-rule bg-card p-3" data-testid={testId}>
      <p className="mb-2 text-xs font-semibold uppercase tracking-wide text-ink-soft">{heading}</p>
      {side.imageUrl ? (
        <img
          src={side.imageUrl}
          alt={`Photo on the listing ${side.listingTitle}`}
          className="aspect-[4/3] w-full rounded-panel border border-rule bg-sunk object-contain"
          loading="lazy"
        />
      ) : (
        <div className="flex aspect-[4/3] w-full items-center justify-center rounded-panel border border-rule bg-sunk text-sm text-ink-soft">
          Photo no longer stored
        </div>
      )}
      <dl className="mt-2 space-y-0.5 text-sm">
        <div>
          <dt className="sr-only">Listing</dt>
          <dd>
            <Link to={`/desk/listings/${side.listingId}`} className="font-semibold text-walnut underline-offset-2 hover:underline">
              {side.listingTitle}
            </Link>{" "}
            <span className="text-ink-soft">· {side.listingStatus}</span>
          </dd>
        </div>
        <div>
          <dt className="inline text-ink-soft">Seller: </dt>
          <dd className="inline">
            <Link to={`/desk/users/${side.sellerId}`} className="underline-offset-2 hover:underline">
              {side.sellerName}
            </Link>
          </dd>
        </div>
        {side.publishedAt ? (
          <div>
            <dt className="inline text-ink-soft">Published: </dt>
            <dd className="inline figures">{momentText(side.publishedAt)}</dd>
          </div>
        ) : null}
      </dl>
    </div>
  );
}
