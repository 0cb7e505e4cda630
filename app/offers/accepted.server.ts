import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "~/db.server";
import { refusal } from "~/http/errors.server";

// What checkout (app/orders) asks of offers: the price a buyer may pay for a listing because the
// seller accepted their offer, and marking that offer spent once the unit is reserved at it.

export interface AcceptedOffer {
  offerId: string;
  amountMinor: number;
}

/**
 * The buyer's accepted offer on the listing whose checkout window is still open at `now`, or null.
 * Locks the offer row (FOR UPDATE) in `tx`, so markOfferUsed in the same transaction cannot race
 * another checkout by the same buyer.
 */
export async function acceptedOfferFor(listingId: string, buyerId: string, now: Date, tx: Transaction): Promise<AcceptedOffer | null> {
  const rows = await sequelize.query<{ id: string; amount_minor: number }>(
    `SELECT id, amount_minor FROM offers
      WHERE listing_id = :listingId AND buyer_id = :buyerId AND state = 'accepted' AND checkout_until > :now
      ORDER BY accepted_at DESC LIMIT 1 FOR UPDATE`,
    { replacements: { listingId, buyerId, now }, type: QueryTypes.SELECT, transaction: tx },
  );
  const row = rows[0];
  return row ? { offerId: row.id, amountMinor: Number(row.amount_minor) } : null;
}

/** Spends an accepted offer (its price went into a reservation). Refuses (409) an offer no longer accepted. */
export async function markOfferUsed(offerId: string, tx: Transaction): Promise<void> {
  const [, count] = await sequelize.query(
    `UPDATE offers SET state = 'used', updated_at = now() WHERE id = :offerId AND state = 'accepted'`,
    { replacements: { offerId }, type: QueryTypes.UPDATE, transaction: tx },
  );
  if (count !== 1) throw refusal("conflict", "That offer can no longer be used at checkout.");
}

/**
 * Gives a spent offer back when the reservation it went into ended unpaid (the reservation lapsed or
 * was cancelled before funding) and its checkout window is still open at `now`; otherwise nothing.
 * Returns whether the buyer may use it again.
 */
export async function restoreOfferUse(offerId: string, now: Date, tx: Transaction): Promise<boolean> {
  const [, count] = await sequelize.query(
    `UPDATE offers SET state = 'accepted', updated_at = now() WHERE id = :offerId AND state = 'used' AND checkout_until > :now`,
    { replacements: { offerId, now }, type: QueryTypes.UPDATE, transaction: tx },
  );
  return count === 1;
}
