import { Listing, Workshop } from "~/models/index.server";
import { ratingOf, sellerHref, type Rating } from "./profile.server";
import { soldPriceIndex, type SoldPriceIndex } from "./price-index.server";

// What the listing page adds from reputation: the seller's rating and page beside the seller's card,
// and the sold-price index for the unit's maker and model (once there are enough sales).

export interface ListingReputation {
  seller: { href: string; rating: Rating };
  index: SoldPriceIndex | null;
}

export async function listingReputation(listingId: string): Promise<ListingReputation | null> {
  const listing = await Listing.findByPk(listingId, { attributes: ["id", "sellerId", "maker", "model", "currency"] });
  if (!listing) return null;
  const [workshop, rating, index] = await Promise.all([
    Workshop.findOne({ where: { ownerId: listing.sellerId }, attributes: ["slug", "verificationStatus"] }),
    ratingOf(listing.sellerId),
    soldPriceIndex(listing.maker, listing.model, listing.currency),
  ]);
  return { seller: { href: sellerHref(listing.sellerId, workshop), rating }, index };
}
