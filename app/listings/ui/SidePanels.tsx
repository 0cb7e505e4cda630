import { useState } from "react";
import { Form, Link } from "react-router";
import { Badge } from "~/components/Badge";
import { Card } from "~/components/Card";
import { ApproxPrice } from "~/components/Price";
import { TWO_PERSON_LIFT_G, type ShippingZone } from "@shared/catalogue";
import type { ListingHead, SellerCard as Seller, ShippingView } from "../types";
import { parseZone } from "../zones";
import { RatingPips } from "~/reputation/ui/RatingPips";

// The seller's card, the shipping options for the visitor's zone, and the safety cautions.

const panelTitle = "font-sans text-xs font-semibold uppercase tracking-[0.14em] text-brass-ink";

/** The seller's rating and public page (from app/reputation), when the page has them. */
export interface SellerStanding {
  href: string;
  rating: { average: number | null; count: number };
}

export function SellerCard({ seller, standing }: { seller: Seller; standing?: SellerStanding | null }) {
  return (
    <Card className="space-y-3" aria-labelledby="seller-heading">
      <h2 id="seller-heading" className={panelTitle}>
        {seller.kind === "workshop" ? "Sold by a workshop" : "Sold by a private seller"}
      </h2>
      <div className="space-y-1">
        <p className="font-serif text-xl font-semibold leading-snug text-ink">{seller.name}</p>
        {seller.place ? <p className="text-sm text-ink-soft">{seller.place}</p> : null}
      </div>
      <div className="flex flex-wrap gap-2">
        {seller.verifiedWorkshop ? (
          <Badge tone="trace">
            <svg aria-hidden="true" viewBox="0 0 16 16" className="mr-1 size-3.5">
              <path
                d="M4.5 8.3l2.2 2.2 4.8-5"
                fill="none"
                stroke="currentColor"
                strokeWidth="1.8"
                strokeLinecap="round"
                strokeLinejoin="round"
              />
            </svg>
            Verified workshop
          </Badge>
        ) : seller.kind === "workshop" ? (
          <Badge>Workshop, not yet verified</Badge>
        ) : (
          <Badge>Private seller</Badge>
        )}
      </div>
      {seller.about ? <p className="text-sm leading-relaxed text-ink-soft">{seller.about}</p> : null}
      {standing ? (
        <div className="flex flex-wrap items-center justify-between gap-2 text-sm">
          {standing.rating.average !== null ? (
            <span className="inline-flex items-center gap-2">
              <RatingPips value={standing.rating.average} size="sm" />
              <span className="text-xs text-ink-faint">
                {standing.rating.count} {standing.rating.count === 1 ? "review" : "reviews"}
              </span>
            </span>
          ) : (
            <span className="text-xs text-ink-faint">Not rated yet</span>
          )}
          <Link to={standing.href} className="font-medium">
            {seller.kind === "workshop" ? "The workshop's page" : "The seller's page"}
          </Link>
        </div>
      ) : null}
      <p className="text-xs text-ink-faint">On Loadline since {seller.memberSince}.</p>
    </Card>
  );
}

export function ShippingPanel({ shipping, currency }: { shipping: ShippingView; currency: string }) {
  const [zone, setZone] = useState<ShippingZone>(shipping.zone);
  const label = shipping.zones.find((z) => z.zone === zone)?.label ?? zone;
  return (
    <Card className="space-y-4" aria-labelledby="shipping-heading">
      <h2 id="shipping-heading" className={panelTitle}>
        Getting it to you
      </h2>
      <Form method="get" preventScrollReset className="space-y-1.5">
        <label htmlFor="zone" className="block text-sm font-medium text-ink">
          Deliver to
        </label>
        <div className="flex gap-2">
          <select
            id="zone"
            name="zone"
            value={zone}
            onChange={(e) => setZone(parseZone(e.target.value) ?? "domestic")}
            className="block w-full rounded-md border border-rule-strong bg-card px-3 py-2 text-[0.9375rem] text-ink"
          >
            {shipping.zones.map((z) => (
              <option key={z.zone} value={z.zone}>
                {z.label}
              </option>
            ))}
          </select>
          <noscript>
            <button type="submit" className="h-10 rounded-md border border-rule-strong bg-card px-3 text-sm font-medium">
              Show
            </button>
          </noscript>
        </div>
        {shipping.zoneGuessedFrom && zone === shipping.zone ? (
          <p className="text-xs text-ink-faint">
            Guessed from your browser's region ({shipping.zoneGuessedFrom}); change it if that is wrong.
          </p>
        ) : null}
      </Form>

      {shipping.options.length === 0 ? (
        <p className="text-sm text-ink-soft">The seller has not listed shipping options yet.</p>
      ) : (
        <ul className="divide-y divide-rule/70 text-sm" aria-label={`Options: ${label}`}>
          {shipping.options.map((o) => {
            const price = o.method === "collection" ? null : o.prices[zone];
            const unavailable = o.method !== "collection" && !price;
            return (
              <li key={o.method} className="flex items-baseline justify-between gap-3 py-2" data-method={o.method}>
                <div className="min-w-0">
                  <p className={unavailable ? "text-ink-faint" : "font-medium text-ink"}>{o.label}</p>
                  {o.note ? <p className="text-xs text-ink-faint">{o.note}</p> : null}
                </div>
                <p className="figures shrink-0 text-right">
                  {o.method === "collection" ? (
                    <span className="text-ink">No charge</span>
                  ) : price ? (
                    <>
                      <span className="text-ink">{price.text}</span>
                      <ApproxPrice minor={price.minor} currency={currency} className="block text-xs" />
                    </>
                  ) : (
                    <span className="font-sans text-xs text-ink-faint">not to this zone</span>
                  )}
                </p>
              </li>
            );
          })}
        </ul>
      )}

      {shipping.handlingDays !== null ? (
        <p className="text-xs text-ink-faint">
          Leaves the seller within <span className="figures">{shipping.handlingDays}</span> working day
          {shipping.handlingDays === 1 ? "" : "s"} of payment.
        </p>
      ) : null}

      {shipping.heavy ? (
        <div className="space-y-1 rounded-md border border-brass/45 bg-brass-wash px-3 py-2.5 text-sm text-ink">
          <p className="font-semibold text-brass-ink">30 kg or more: freight only, two-person lift</p>
          <p className="text-[0.8125rem] leading-relaxed">
            Units this heavy travel on a pallet, not as a parcel
            {shipping.parcelWithheld ? ", so the seller's parcel option is not offered" : ""}. Have two people ready to carry it in and lift
            with bent knees; never carry it alone or by its knobs and handles.
          </p>
        </div>
      ) : null}
    </Card>
  );
}

export function SafetyCautions({ listing }: { listing: ListingHead }) {
  const mains = listing.unit.mains;
  const heavy = (listing.unit.weightG ?? 0) >= TWO_PERSON_LIFT_G;
  // Passive loudspeakers have no mains inside; everything else on Loadline plugs into the wall.
  const mainsPowered = listing.category !== "loudspeaker";
  return (
    <section aria-labelledby="safety-heading" className="space-y-3 rounded-panel border border-rule-strong bg-card/70 p-5">
      <h2 id="safety-heading" className="flex items-center gap-2 font-sans text-sm font-semibold text-ink">
        <svg aria-hidden="true" viewBox="0 0 20 20" className="size-5 text-brass-ink">
          <path d="M10 2.5l8 14H2z" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinejoin="round" />
          <path d="M10 8v4M10 14.4v.3" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" />
        </svg>
        Receiving and testing it safely
      </h2>
      <ul className="list-disc space-y-1.5 pl-5 text-[0.8125rem] leading-relaxed text-ink-soft">
        {mainsPowered ? (
          <>
            <li>
              There is mains voltage inside, and filter capacitors can hold a dangerous charge long after the unit is unplugged (valve
              equipment runs at several hundred volts). Do not open the case: let a qualified technician do any work inside.
            </li>
            <li>
              {mains ? (
                <>
                  It is set for{" "}
                  <span className="figures text-ink">
                    {mains.voltageV} V{mains.frequencyHz ? ` ${mains.frequencyHz} Hz` : ""}
                  </span>
                  {mains.switchable ? " and can be switched" : ""}. Check that matches your supply before plugging it in
                  {mains.switchable ? "; leave changing the selector to a technician" : ""}.
                </>
              ) : (
                "Check that the voltage the unit is set for matches your supply before plugging it in."
              )}
            </li>
            <li>If it arrives cold, let it stand at room temperature for a few hours before switching on, so condensation can dry.</li>
            <li>
              To test it, connect speakers or a proper dummy load before switching on; never short or bridge the outputs, and expect dummy
              loads and heatsinks to get hot.
            </li>
          </>
        ) : (
          <li>Switch the amplifier off before connecting or disconnecting speaker cables, and start listening at low volume.</li>
        )}
        {heavy ? (
          <li>It weighs {listing.unit.weightText}: two people to lift, and keep fingers clear of the feet when setting it down.</li>
        ) : null}
        <li>
          Rules for selling and using second-hand electrical goods differ between countries; follow your local electrical-safety rules.
        </li>
      </ul>
    </section>
  );
}
