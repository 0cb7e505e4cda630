import { randomUUID } from "node:crypto";
import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "~/db.server";
import { LedgerEntry } from "~/models/index.server";
import type { Order } from "~/models/index.server";
import type { LedgerAccount, LedgerKind } from "@shared/orders";

// The double-entry ledger. Each money movement is two or more legs sharing a movement id whose amounts
// sum to zero (the database checks it at commit); balances are sums per account. Accounts, with a
// positive amount adding to the balance:
//   buyer           what the buyer has paid in (negative) and been refunded (positive)
//   escrow          held by the platform for this order
//   platform_fees   Loadline's fee, once the money is released
//   seller_payable  released to the seller, not yet paid out
//   seller_paid     paid out to the seller's connected account

export interface Leg {
  account: LedgerAccount;
  amountMinor: number;
}

/** Writes one movement; refuses legs that do not sum to zero before the database would. */
export async function recordMovement(
  order: Pick<Order, "id" | "currency">,
  kind: LedgerKind,
  legs: Leg[],
  { providerRef = null, at, transaction }: { providerRef?: string | null; at: Date; transaction: Transaction },
): Promise<string> {
  const live = legs.filter((l) => l.amountMinor !== 0);
  if (live.length === 0) return "";
  if (live.some((l) => !Number.isSafeInteger(l.amountMinor))) throw new Error(`ledger ${kind}: amounts must be whole minor units`);
  const sum = live.reduce((s, l) => s + l.amountMinor, 0);
  if (sum !== 0) throw new Error(`ledger ${kind} for order ${order.id} does not balance (${sum})`);
  const movementId = randomUUID();
  await LedgerEntry.bulkCreate(
    live.map((l) => ({
      orderId: order.id,
      movementId,
      kind,
      account: l.account,
      amountMinor: l.amountMinor,
      currency: order.currency,
      providerRef,
      at,
    })),
    { transaction },
  );
  return movementId;
}

/** A move of `amountMinor` from one account to another, as one movement. */
export function move(
  order: Pick<Order, "id" | "currency">,
  kind: LedgerKind,
  from: LedgerAccount,
  to: LedgerAccount,
  amountMinor: number,
  options: { providerRef?: string | null; at: Date; transaction: Transaction },
): Promise<string> {
  return recordMovement(
    order,
    kind,
    [
      { account: from, amountMinor: -amountMinor },
      { account: to, amountMinor },
    ],
    options,
  );
}

export type Balances = Record<LedgerAccount, number>;

/** Each account's balance for one order (accounts with no entries are 0). */
export async function balancesFor(orderId: string, transaction?: Transaction): Promise<Balances> {
  const rows = await sequelize.query<{ account: LedgerAccount; balance: string }>(
    `SELECT account, sum(amount_minor)::text AS balance FROM ledger_entries WHERE order_id = :orderId GROUP BY account`,
    { replacements: { orderId }, type: QueryTypes.SELECT, transaction },
  );
  const balances: Balances = { buyer: 0, escrow: 0, platform_fees: 0, seller_payable: 0, seller_paid: 0 };
  for (const r of rows) balances[r.account] = Number(r.balance);
  return balances;
}
