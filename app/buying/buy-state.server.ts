import { QueryTypes } from "sequelize";
import { sequelize } from "~/db.server";
import type { SessionUser } from "~/auth/guards.server";

// Whether the listing page offers "Buy", and when it does not, the reason in plain words. The
// checkout's reservation is the authority (it refuses the same cases under a row lock); this only
// keeps a button from promising what the checkout would refuse.

export type BuyState =
  | { kind: "buy"; href: string }
  /** The viewer holds the reservation: back to their purchase to pay. */
  | { kind: "continue"; href: string }
  | { kind: "blocked"; reason: string };

interface Row {
  status: string;
  seller_id: string;
  payouts_enabled: boolean | null;
  price_minor: number | null;
  own_order_id: string | null;
}

export async function buyState(listingId: string, viewer: Pick<SessionUser, "id"> | null): Promise<BuyState | null> {
  const rows = await sequelize.query<Row>(
    `SELECT l.status, l.seller_id, l.price_minor, u.payouts_enabled,
            (SELECT o.id FROM orders o WHERE o.listing_id = l.id AND o.buyer_id = :viewerId AND o.state = 'reserved'
              ORDER BY o.created_at DESC LIMIT 1) AS own_order_id
       FROM listings l JOIN users u ON u.id = l.seller_id
      WHERE l.id = :listingId`,
    { replacements: { listingId, viewerId: viewer?.id ?? null }, type: QueryTypes.SELECT },
  );
  const row = rows[0];
  if (!row) return null;
  return decideBuyState(row, listingId, viewer?.id ?? null);
}

/** The decision alone (tested without a database). */
export function decideBuyState(row: Row, listingId: string, viewerId: string | null): BuyState | null {
  if (viewerId && viewerId === row.seller_id) {
    return row.status === "live" ? { kind: "blocked", reason: "This is your listing: buyers see Buy here." } : null;
  }
  switch (row.status) {
    case "live":
      if (row.price_minor === null) return { kind: "blocked", reason: "The seller has not set a price." };
      if (!row.payouts_enabled)
        return {
          kind: "blocked",
          reason: "The seller has not connected a payout account yet, so this unit cannot be bought until they do.",
        };
      return { kind: "buy", href: `/checkout/${listingId}` };
    case "reserved":
      if (row.own_order_id) return { kind: "continue", href: `/purchases/${row.own_order_id}` };
      return {
        kind: "blocked",
        reason: "Reserved: another buyer is checking out. If they do not pay in time, the unit returns to the market.",
      };
    case "held":
      return { kind: "blocked", reason: "Held for the review desk: it cannot be bought until a moderator clears it." };
    default:
      // Sold, withdrawn, removed and drafts have their own banner; nothing to buy.
      return null;
  }
}
