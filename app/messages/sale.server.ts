import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "~/db.server";

// Whether a thread's buyer has paid for the unit: from 'funded' on (the money is held by Loadline's
// checkout), the two sides may swap contact details to arrange collection or delivery.

const PAID_STATES = ["funded", "shipped", "arrived", "audition", "released", "contested", "refunded"];

export async function buyerHasPaid(listingId: string, buyerId: string, transaction?: Transaction): Promise<boolean> {
  const rows = await sequelize.query<{ paid: boolean }>(
    `SELECT EXISTS (SELECT 1 FROM orders WHERE listing_id = :listingId AND buyer_id = :buyerId AND state IN (:states)) AS paid`,
    { replacements: { listingId, buyerId, states: PAID_STATES }, type: QueryTypes.SELECT, transaction },
  );
  return rows[0]?.paid === true;
}
