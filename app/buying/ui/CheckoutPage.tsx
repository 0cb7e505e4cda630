import { Form, Link, useNavigation } from "react-router";
import { Button } from "~/components/Button";
import { Card } from "~/components/Card";
import { FormError } from "~/components/Field";
import { PageHeader } from "~/components/PageHeader";
import { Price } from "~/components/Price";
import { formatPrice } from "@shared/catalogue";
import type { CheckoutView } from "../checkout.server";
import { HeavyUnit } from "~/components/cautions/HeavyUnit";
import { Money } from "./Money";

// The checkout: what is bought and from whom, the delivery to choose (each option with its total, so
// the page reads right without JavaScript), the heavy-unit caution, and one button to the payment.

export function CheckoutPage({ view, errors }: { view: CheckoutView; errors: Record<string, string> }) {
  const busy = useNavigation().state === "submitting";
  const { listing, choices, offer } = view;
  const currency = listing.currency;
  const blocked = view.buy?.kind === "blocked" ? view.buy.reason : null;
  return (
    <main className="mx-auto w-full max-w-5xl space-y-8 px-4 pb-16 pt-8 sm:px-6">
      <PageHeader
        overline="Checkout"
        title="Buy this unit"
        lede="Your payment is held by Loadline's payment provider until the unit has arrived and passed your audition window; the seller is paid only then."
      />
      <div className="grid gap-8 lg:grid-cols-[minmax(0,1fr)_22rem]">
        <section aria-labelledby="unit-heading" className="lg:order-2">
          <Card className="space-y-4">
            <div className="flex gap-4">
              {listing.thumbUrl ? (
                <img
                  src={listing.thumbUrl}
                  alt=""
                  width={96}
                  height={72}
                  className="h-18 w-24 shrink-0 rounded-md border border-rule object-cover"
                />
              ) : null}
              <div className="min-w-0 space-y-1">
                <h2 id="unit-heading" className="text-xl leading-snug">
                  <Link to={`/listings/${listing.id}`} className="no-underline hover:text-walnut-deep">
                    {listing.title}
                  </Link>
                </h2>
                <p className="text-sm text-ink-soft">From {listing.seller}</p>
                {listing.weightText ? <p className="figures text-xs text-ink-faint">{listing.weightText}</p> : null}
              </div>
            </div>
            <dl className="space-y-1.5 border-t border-rule pt-3 text-sm">
              <div className="flex items-baseline justify-between gap-3">
                <dt className="text-ink-soft">{offer ? "Your accepted offer" : "Price"}</dt>
                <dd>
                  <Price
                    layout="stacked"
                    minor={view.priceMinor}
                    currency={currency}
                    className="text-right font-semibold"
                    approxClassName="block text-xs font-normal"
                  />
                </dd>
              </div>
              {offer && offer.amountMinor !== listing.listedPriceMinor ? (
                <div className="flex items-baseline justify-between gap-3 text-ink-faint">
                  <dt>Listed at</dt>
                  <dd className="figures line-through">{formatPrice(listing.listedPriceMinor, currency)}</dd>
                </div>
              ) : null}
            </dl>
            {listing.handlingDays !== null ? (
              <p className="text-xs text-ink-faint">
                The seller ships within <span className="figures">{listing.handlingDays}</span> working day
                {listing.handlingDays === 1 ? "" : "s"} of payment, or the order is cancelled and you are refunded.
              </p>
            ) : null}
          </Card>
        </section>

        <div className="space-y-6 lg:order-1">
          {blocked ? (
            <Card className="space-y-2">
              <h2 className="text-xl">This unit cannot be bought right now</h2>
              <p className="text-ink-soft">{blocked}</p>
              <p>
                <Link to={`/listings/${listing.id}`} className="text-walnut underline underline-offset-2">
                  Back to the listing
                </Link>
              </p>
            </Card>
          ) : (
            <>
              <ZonePicker view={view} />
              <Form method="post" className="space-y-5" noValidate>
                <FormError>{errors.form ?? errors.zone}</FormError>
                <input type="hidden" name="zone" value={view.zone} />
                <fieldset className="space-y-3" aria-describedby={errors.deliveryMethod ? "delivery-error" : undefined}>
                  <legend className="mb-1 font-serif text-xl font-semibold">Delivery</legend>
                  {choices.length === 0 ? (
                    <p className="rounded-md border border-rule bg-card px-4 py-3 text-sm text-ink-soft">
                      The seller does not deliver to this zone. Choose another above, or ask the seller.
                    </p>
                  ) : (
                    choices.map((c, i) => (
                      <label
                        key={c.method}
                        className="flex cursor-pointer items-start gap-3 rounded-panel border border-rule bg-card p-4 shadow-panel has-checked:border-walnut has-checked:bg-walnut-wash/40"
                      >
                        <input
                          type="radio"
                          name="deliveryMethod"
                          value={c.method}
                          defaultChecked={i === 0}
                          className="mt-1 size-4 shrink-0 accent-walnut"
                        />
                        <span className="min-w-0 flex-1 space-y-0.5">
                          <span className="block font-medium text-ink">{c.label}</span>
                          {c.note ? <span className="block text-xs text-ink-faint">{c.note}</span> : null}
                          <span className="block text-sm text-ink-soft">
                            Delivery <Money minor={c.deliveryMinor} currency={currency} free="no charge" />
                          </span>
                        </span>
                        <span className="shrink-0 text-right">
                          <span className="block text-xs uppercase tracking-[0.08em] text-ink-faint">Total</span>
                          <Price
                            minor={c.totalMinor}
                            currency={currency}
                            className="font-semibold text-ink"
                            approxClassName="block text-xs font-normal"
                            layout="stacked"
                          />
                        </span>
                      </label>
                    ))
                  )}
                  {errors.deliveryMethod ? (
                    <p id="delivery-error" role="alert" className="text-[0.8125rem] font-medium text-fault">
                      {errors.deliveryMethod}
                    </p>
                  ) : null}
                </fieldset>
                <HeavyUnit weightG={listing.weightG} context="checkout" />
                <div className="space-y-2">
                  <Button type="submit" size="lg" busy={busy} disabled={choices.length === 0} className="max-sm:w-full">
                    Reserve and pay
                  </Button>
                  <p className="text-xs text-ink-faint">
                    The unit is held for you while you pay on the payment provider's page. Your card details never reach Loadline.
                  </p>
                </div>
              </Form>
            </>
          )}
        </div>
      </div>
    </main>
  );
}

function ZonePicker({ view }: { view: CheckoutView }) {
  return (
    <Form method="get" className="space-y-1.5" preventScrollReset>
      <label htmlFor="zone" className="block text-sm font-medium text-ink">
        Deliver to
      </label>
      <div className="flex max-w-md gap-2">
        <select
          id="zone"
          name="zone"
          defaultValue={view.zone}
          className="block w-full rounded-md border border-rule-strong bg-card px-3 py-2 text-[0.9375rem] text-ink"
        >
          {view.zones.map((z) => (
            <option key={z.zone} value={z.zone}>
              {z.label}
            </option>
          ))}
        </select>
        <Button type="submit" variant="secondary">
          Show
        </Button>
      </div>
      {view.zoneGuessedFrom ? <p className="text-xs text-ink-faint">Guessed from your browser's region ({view.zoneGuessedFrom}).</p> : null}
    </Form>
  );
}
