import type { Transaction } from "sequelize";
import type { Listing } from "~/models/index.server";
import { openFlags, raiseFlag } from "~/desk/flags.server";
import { isFarBelow, LOW_PRICE_RATIO } from "@shared/price-index";
import { soldPriceIndex } from "./price-index.server";

// The price check at publish: a unit priced under half the sold-price index's median for its maker and
// model (LOW_PRICE_RATIO, common practice rather than a published figure) goes in front of the review
// desk as a low_price flag carrying the index it was judged against. The listing itself is not held:
// a low price alone is not proof of anything, and an honest seller may simply want a quick sale.

export const LOW_PRICE_REASON = "below_sold_price_index";

/** Raises the flag when the listing's price is far below its index (and no such flag is open); true when raised. */
export async function flagLowPrice(listing: Listing, transaction: Transaction): Promise<boolean> {
  if (listing.priceMinor === null) return false;
  const index = await soldPriceIndex(listing.maker, listing.model, listing.currency, transaction);
  if (!index || !isFarBelow(listing.priceMinor, index)) return false;
  const open = await openFlags(listing.id, transaction);
  if (open.some((f) => f.kind === "low_price")) return false;
  await raiseFlag(
    {
      kind: "low_price",
      listingId: listing.id,
      reason: LOW_PRICE_REASON,
      details: {
        priceMinor: listing.priceMinor,
        currency: index.currency,
        ratio: LOW_PRICE_RATIO,
        thresholdMinor: Math.ceil(index.all.medianMinor * LOW_PRICE_RATIO),
        index,
      },
    },
    transaction,
  );
  return true;
}
