import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "~/db.server";

// Whether a thread's buyer has paid for the unit: from 'funded' on (the money is held by Loadline's
// checkout), the two sides may swap contact details to arrange collection or delivery.

const PAID_STATES = ["funded", "shipped", "arrived", "audition", "released", "contested", "refunded"];

export async function buyerHasPaid(listingId: string, buyerId: string, transaction?: Transaction): Promise<boolean> {
  if (!(await ordersExist(transaction))) return false;
  const rows = await sequelize.query<{ paid: boolean }>(
    `SELECT EXISTS (SELECT 1 FROM orders WHERE listing_id = :listingId AND buyer_id = :buyerId AND state IN (:states)) AS paid`,
    { replacements: { listingId, buyerId, states: PAID_STATES }, type: QueryTypes.SELECT, transaction },
  );
  return rows[0]?.paid === true;
}

// The orders table comes with the orders migration; a database without it has no paid orders.
let ordersTable: boolean | undefined;
async function ordersExist(transaction?: Transaction): Promise<boolean> {
  if (ordersTable) return true;
  const rows = await sequelize.query<{ ok: boolean }>(`SELECT to_regclass('public.orders') IS NOT NULL AS ok`, {
    type: QueryTypes.SELECT,
    transaction,
  });
  ordersTable = rows[0]?.ok === true;
  return ordersTable;
}
