import type { Transaction } from "sequelize";

// The seam to TALK's accepted offers (app/offers/accepted.server.ts: acceptedOfferFor, markOfferUsed).
// Until that module is in main, no offer applies and checkout uses the listing's price.

export interface AcceptedOffer {
  offerId: string;
  amountMinor: number;
}

export async function acceptedOfferFor(_listingId: string, _buyerId: string, _now: Date, _tx: Transaction): Promise<AcceptedOffer | null> {
  return null;
}

export async function markOfferUsed(_offerId: string, _tx: Transaction): Promise<void> {}
