import type { Transaction } from "sequelize";
import { marketplaceSettings } from "~/orders/settings.server";

// How long an offer stays open and how long an accepted one's price holds for checkout: the admin's
// marketplace settings, read fresh for each offer so a change applies to the next one.

export interface OfferTimes {
  offerHours: number;
  checkoutHours: number;
}

export async function offerTimes(transaction?: Transaction): Promise<OfferTimes> {
  const settings = await marketplaceSettings(transaction);
  return { offerHours: settings.offerHours, checkoutHours: settings.offerCheckoutHours };
}
