import { Form } from "react-router";
import { Button, ButtonLink } from "~/components/Button";
import type { ListingHead, ViewerState } from "../types";

// "Ask the seller" and, where the seller welcomes offers, "Make an offer": both open the buyer's
// conversation about this unit (made on first use), where the offer form is. A plain form, so it
// works without JavaScript; visitors are sent to sign in first.

export function TalkControls({ listing, viewer }: { listing: ListingHead; viewer: ViewerState }) {
  if (listing.status !== "live" || viewer.isSeller) return null;
  if (!viewer.signedIn) {
    return (
      <ButtonLink to={viewer.signInHref} variant="quiet" className="w-full sm:w-auto">
        Sign in to ask the seller{listing.offersWelcome ? " or make an offer" : ""}
      </ButtonLink>
    );
  }
  return (
    <Form method="post" action="/messages" className="flex flex-wrap gap-2">
      <input type="hidden" name="listingId" value={listing.id} />
      <Button type="submit" name="intent" value="ask" variant="secondary">
        Ask the seller
      </Button>
      {listing.offersWelcome ? (
        <Button type="submit" name="intent" value="offer" variant="secondary">
          Make an offer
        </Button>
      ) : null}
    </Form>
  );
}
