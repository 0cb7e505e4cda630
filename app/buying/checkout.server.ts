import { z } from "zod";
import { isId } from "@shared/ids";
import {
  SHIPPING_METHODS,
  SHIPPING_ZONES,
  TWO_PERSON_LIFT_G,
  formatWeight,
  listingTitle,
  type ShippingMethod,
  type ShippingZone,
} from "@shared/catalogue";
import type { SessionUser } from "~/auth/guards.server";
import { sequelize } from "~/db.server";
import { HttpError } from "~/http/errors.server";
import { Listing, User, Workshop } from "~/models/index.server";
import { countryName, shippingView } from "~/listings/sections.server";
import { countryFromAcceptLanguage, parseZone, zoneFor } from "~/listings/zones";
import { acceptedOfferFor } from "~/offers/accepted.server";
import { attachCheckout, reserveUnit } from "~/orders/transitions.server";
import { createCheckout } from "~/orders/provider.server";
import type { Clock } from "~/orders/clock.server";
import { buyState, type BuyState } from "./buy-state.server";
import { coverThumbs } from "./covers.server";

// The checkout page: the delivery options the listing offers for the buyer's zone, the price (an
// accepted offer's when the buyer has one), and the start of payment: reserve the unit for this buyer
// (the transition's row lock decides between buyers), open a Checkout Session on the provider's
// hosted page and send the browser there. Paying there does not fund the order; the webhook does.

export interface DeliveryChoice {
  method: ShippingMethod;
  label: string;
  note: string | null;
  deliveryMinor: number;
  totalMinor: number;
}

export interface CheckoutView {
  listing: {
    id: string;
    title: string;
    currency: string;
    listedPriceMinor: number;
    thumbUrl: string | null;
    weightG: number | null;
    weightText: string | null;
    heavy: boolean;
    seller: string;
    handlingDays: number | null;
  };
  offer: { offerId: string; amountMinor: number } | null;
  priceMinor: number;
  zone: ShippingZone;
  zoneGuessedFrom: string | null;
  zones: { zone: ShippingZone; label: string }[];
  choices: DeliveryChoice[];
  buy: BuyState | null;
}

export async function loadCheckout(
  listingId: string,
  buyer: Pick<SessionUser, "id">,
  where: { zone?: string | null; acceptLanguage?: string | null },
  clock: Clock,
): Promise<CheckoutView | null> {
  if (!isId(listingId)) return null;
  const listing = await Listing.findByPk(listingId, {
    include: [
      { model: User, as: "seller", attributes: ["id", "displayName"] },
      { model: Workshop, as: "workshop", attributes: ["id", "name"] },
    ],
  });
  // Only units the market shows (or the one this buyer holds) have a checkout; the rest are not here.
  if (!listing || listing.priceMinor === null || !["live", "reserved"].includes(listing.status)) return null;
  const guessed = countryFromAcceptLanguage(where.acceptLanguage);
  const zone = parseZone(where.zone) ?? zoneFor(listing.country, guessed);
  const shipping = shippingView(listing, zone, where.zone ? null : guessed ? countryName(guessed) : null);
  const [offer, buy, thumbs] = await Promise.all([
    // Read-only here: the reservation reads (and spends) the offer again under its own lock.
    sequelize.transaction((tx) => acceptedOfferFor(listing.id, buyer.id, clock.now(), tx)),
    buyState(listing.id, buyer),
    coverThumbs([listing.id]),
  ]);
  const priceMinor = offer?.amountMinor ?? listing.priceMinor;
  const choices: DeliveryChoice[] = [];
  for (const o of shipping.options) {
    const deliveryMinor = o.method === "collection" ? 0 : o.prices[zone]?.minor;
    if (deliveryMinor === undefined) continue;
    choices.push({ method: o.method, label: o.label, note: o.note, deliveryMinor, totalMinor: priceMinor + deliveryMinor });
  }
  return {
    listing: {
      id: listing.id,
      title: listingTitle(listing.maker, listing.model),
      currency: listing.currency,
      listedPriceMinor: listing.priceMinor,
      thumbUrl: thumbs.get(listing.id) ?? null,
      weightG: listing.weightG,
      weightText: listing.weightG ? formatWeight(listing.weightG) : null,
      heavy: (listing.weightG ?? 0) >= TWO_PERSON_LIFT_G,
      seller: listing.workshop?.name ?? listing.seller?.displayName ?? "the seller",
      handlingDays: listing.handlingDays,
    },
    offer: offer ? { offerId: offer.offerId, amountMinor: offer.amountMinor } : null,
    priceMinor,
    zone,
    zoneGuessedFrom: shipping.zoneGuessedFrom,
    zones: shipping.zones,
    choices,
    buy,
  };
}

export const CheckoutForm = z.object({
  zone: z.enum(SHIPPING_ZONES, { message: "Choose where it goes." }),
  deliveryMethod: z.enum(SHIPPING_METHODS, { message: "Choose how it reaches you." }),
});

export type StartResult = { ok: true; paymentUrl: string; orderId: string } | { ok: false; status: number; errors: Record<string, string> };

/** Reserve the unit and open the payment; refusals come back as messages for the page. */
export async function startCheckout(
  listingId: string,
  buyer: Pick<SessionUser, "id">,
  fields: Record<string, unknown>,
  origin: string,
  clock: Clock,
): Promise<StartResult> {
  const parsed = CheckoutForm.safeParse(fields);
  if (!parsed.success) {
    const errors: Record<string, string> = {};
    for (const i of parsed.error.issues) errors[String(i.path[0] ?? "form")] ??= i.message;
    return { ok: false, status: 400, errors };
  }
  const view = await loadCheckout(listingId, buyer, { zone: parsed.data.zone }, clock);
  if (!view) return { ok: false, status: 404, errors: { form: "There is no listing here." } };
  if (!view.choices.some((c) => c.method === parsed.data.deliveryMethod)) {
    const zone = view.zones.find((z) => z.zone === parsed.data.zone)?.label ?? parsed.data.zone;
    return { ok: false, status: 400, errors: { deliveryMethod: `The seller does not offer this delivery to “${zone}”.` } };
  }
  let order;
  try {
    order = await reserveUnit(
      { listingId, buyerId: buyer.id, deliveryMethod: parsed.data.deliveryMethod, deliveryZone: parsed.data.zone },
      clock,
    );
  } catch (e) {
    if (e instanceof HttpError && e.status < 500) return { ok: false, status: e.status, errors: { form: e.message } };
    throw e;
  }
  const session = await createCheckout(order, {
    successUrl: `${origin}/purchases/${order.id}?paid=1`,
    cancelUrl: `${origin}/purchases/${order.id}`,
  });
  await attachCheckout(order.id, { checkoutSessionId: session.id });
  return { ok: true, paymentUrl: session.url, orderId: order.id };
}
