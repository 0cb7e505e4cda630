import { refusal } from "~/http/errors.server";
import type { Listing, User } from "~/models/index.server";
import { SHIPPING_METHOD_LABELS, SHIPPING_ZONE_LABELS, type ShippingMethod, type ShippingZone } from "@shared/catalogue";

// Who may reserve which unit, and what delivery costs: the checks reserveUnit makes under the listing's lock.

/** Why this buyer cannot reserve this listing now, in plain words; null when they can. */
export function listingRefusal(listing: Listing, seller: User | null, buyerId: string): string | null {
  if (listing.sellerId === buyerId) return "This is your own listing.";
  switch (listing.status) {
    case "live":
      break;
    case "reserved":
      return "Another buyer is checking out this unit. If they do not pay in time it returns to the market.";
    case "sold":
      return "This unit has been sold.";
    case "held":
      return "This unit is with the review desk and cannot be bought yet.";
    default:
      return "This unit is not for sale.";
  }
  if (listing.priceMinor === null) return "This unit has no price.";
  if (!seller || seller.status !== "active" || !seller.payoutsEnabled || !seller.payoutAccountId)
    return "The seller has not connected a payout account yet, so this unit cannot be bought for now.";
  return null;
}

/** The delivery price for the chosen method and zone, in the listing's currency; refuses an option it does not offer. */
export function deliveryPriceFor(listing: Listing, method: ShippingMethod, zone: ShippingZone): number {
  const option = listing.shippingOptions.find((o) => o.method === method);
  if (!option)
    throw refusal("invalid", `This unit is not offered by ${SHIPPING_METHOD_LABELS[method].toLowerCase()}.`, {
      issues: [{ path: "deliveryMethod", message: "Pick one of the seller's delivery options." }],
    });
  if (option.method === "collection") return 0;
  const price = option.prices[zone];
  if (price === undefined)
    throw refusal(
      "invalid",
      `The seller does not deliver ${SHIPPING_ZONE_LABELS[zone].toLowerCase()} by ${SHIPPING_METHOD_LABELS[method].toLowerCase()}.`,
      {
        issues: [{ path: "deliveryZone", message: "The seller does not deliver to this zone by this method." }],
      },
    );
  return price;
}
