import { QueryTypes, type Transaction } from "sequelize";
import { DEFAULT_OFFER_CHECKOUT_HOURS, DEFAULT_OFFER_HOURS } from "@shared/offers";
import { sequelize } from "~/db.server";

// How long an offer stays open and how long an accepted one's price holds for checkout: the admin's
// marketplace settings (row 1), or the defaults on a database without them.

export interface OfferTimes {
  offerHours: number;
  checkoutHours: number;
}

export async function offerTimes(transaction?: Transaction): Promise<OfferTimes> {
  // Until the orders migration is in, there is no settings row to read.
  const [present] = await sequelize.query<{ ok: boolean }>(`SELECT to_regclass('public.marketplace_settings') IS NOT NULL AS ok`, {
    type: QueryTypes.SELECT,
    transaction,
  });
  if (!present?.ok) return { offerHours: DEFAULT_OFFER_HOURS, checkoutHours: DEFAULT_OFFER_CHECKOUT_HOURS };
  const [row] = await sequelize.query<{ offer_hours: number; offer_checkout_hours: number }>(
    `SELECT offer_hours, offer_checkout_hours FROM marketplace_settings WHERE id = 1`,
    { type: QueryTypes.SELECT, transaction },
  );
  return {
    offerHours: row?.offer_hours ?? DEFAULT_OFFER_HOURS,
    checkoutHours: row?.offer_checkout_hours ?? DEFAULT_OFFER_CHECKOUT_HOURS,
  };
}
