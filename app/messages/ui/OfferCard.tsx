import { Form } from "react-router";
import { OFFER_STATE_LABELS } from "@shared/offers";
import { Badge } from "~/components/Badge";
import { Button, ButtonLink } from "~/components/Button";
import { Field } from "~/components/Field";
import { Price } from "~/components/Price";
import type { OfferItem, ThreadHead } from "../types";
import { momentText } from "@shared/dates";

// An offer inside the conversation, with what the viewer may do with it now, and the buyer's form to
// make one. Plain forms posting to the thread page: they work without JavaScript.

export interface OfferFormErrors {
  amount?: string;
  /** A counter-offer's amount, for the offer it answers. */
  counter?: { offerId: string; message: string };
  offer?: { offerId: string; message: string };
}

export function OfferCard({ offer, thread, errors }: { offer: OfferItem; thread: ThreadHead; errors?: OfferFormErrors }) {
  const who = offer.fromMe ? "You" : thread.otherName;
  const title = offer.madeBy === "buyer" ? "Offer" : "Counter-offer";
  const counterError = errors?.counter?.offerId === offer.id ? errors.counter.message : undefined;
  const offerError = errors?.offer?.offerId === offer.id ? errors.offer.message : undefined;
  return (
    <div className="w-full max-w-sm space-y-3 rounded-panel border border-brass/50 bg-brass-wash/50 px-4 py-3" data-testid="offer">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <p className="text-sm text-ink-soft">
          {title} from <span className="font-medium text-ink">{who}</span>
        </p>
        <Badge tone={offer.state === "accepted" ? "trace" : offer.state === "open" ? "brass" : "neutral"}>
          {OFFER_STATE_LABELS[offer.state]}
        </Badge>
      </div>
      <Price minor={offer.amountMinor} currency={offer.currency} className="text-xl font-semibold text-ink" />
      {offer.state === "open" ? (
        <p className="text-xs text-ink-faint">
          Open until <span className="figures">{momentText(offer.expiresAt)}</span>
        </p>
      ) : null}
      {offer.state === "accepted" && offer.checkoutUntil ? (
        <p className="text-sm text-ink">
          {thread.role === "buyer" ? "You can buy at this price until " : "The buyer can buy at this price until "}
          <span className="figures">{momentText(offer.checkoutUntil)}</span>.
        </p>
      ) : null}
      {offer.state === "accepted" && thread.role === "buyer" && offer.checkoutUntil && offer.checkoutUntil > new Date().toISOString() ? (
        <ButtonLink to={`/checkout/${thread.listingId}`} size="sm">
          Buy at this price
        </ButtonLink>
      ) : null}
      {offerError ? (
        <p role="alert" className="text-sm text-fault">
          {offerError}
        </p>
      ) : null}
      {offer.actions.length ? (
        <div className="space-y-3">
          <Form method="post" className="flex flex-wrap gap-2">
            <input type="hidden" name="intent" value="answer" />
            <input type="hidden" name="offerId" value={offer.id} />
            {offer.actions.includes("accept") ? (
              <Button type="submit" name="answer" value="accept" size="sm">
                Accept
              </Button>
            ) : null}
            {offer.actions.includes("decline") ? (
              <Button type="submit" name="answer" value="decline" size="sm" variant="secondary">
                Decline
              </Button>
            ) : null}
            {offer.actions.includes("withdraw") ? (
              <Button type="submit" name="answer" value="withdraw" size="sm" variant="secondary">
                Withdraw
              </Button>
            ) : null}
          </Form>
          {offer.actions.includes("counter") ? (
            <Form method="post" className="flex flex-wrap items-end gap-2">
              <input type="hidden" name="intent" value="answer" />
              <input type="hidden" name="offerId" value={offer.id} />
              <input type="hidden" name="answer" value="counter" />
              <Field label="Counter-offer" name="amount" inputMode="decimal" unit={offer.currency} className="w-40" error={counterError} />
              <Button type="submit" size="sm" variant="secondary">
                Counter
              </Button>
            </Form>
          ) : null}
        </div>
      ) : null}
    </div>
  );
}

export function MakeOfferForm({ thread, errors }: { thread: ThreadHead; errors?: OfferFormErrors }) {
  return (
    <section id="make-offer" aria-labelledby="make-offer-title" className="space-y-3 rounded-panel border border-rule bg-card px-4 py-4">
      <h2 id="make-offer-title" className="text-lg">
        Make an offer
      </h2>
      <p className="text-sm text-ink-soft">
        The asking price is{" "}
        {thread.priceMinor !== null ? (
          <Price minor={thread.priceMinor} currency={thread.currency} className="font-medium text-ink" />
        ) : (
          "not set"
        )}
        . The seller can accept, decline or answer with a counter-offer before your offer expires; an accepted offer lets you buy at that
        price for a limited time, shown with it.
      </p>
      <Form method="post" className="flex flex-wrap items-end gap-2">
        <input type="hidden" name="intent" value="offer" />
        <Field label="Your offer" name="amount" inputMode="decimal" unit={thread.currency} className="w-44" error={errors?.amount} />
        <Button type="submit">Make the offer</Button>
      </Form>
    </section>
  );
}
