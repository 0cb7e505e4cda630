import { QueryTypes } from "sequelize";
import { z } from "zod";
import { sequelize } from "~/db.server";
import { addMonths, monthOf, monthsBetween, type Month } from "./months";

// A seller's money per calendar month (UTC), read from the escrow ledger (app/orders/ledger.server.ts)
// of the orders they sold: what buyers paid in, what was refunded, Loadline's fees, what was released
// to them and paid out, and at each month's end what was still held in escrow (pending release) and
// released but not yet paid out. Per currency: an order's legs are in its own currency and sums never
// mix them. Integer minor units throughout; the page and the CSV format them.

export interface MonthRow {
  month: Month;
  /** Buyers' payments into escrow for the seller's units (the escrow leg of buyer_payment). */
  salesMinor: number;
  /** Refunds paid back to buyers (the buyer leg of refund). */
  refundsMinor: number;
  /** Loadline's fees, fixed at release (the platform_fees leg of platform_fee). */
  feesMinor: number;
  /** Released to the seller, less fee and refund (the seller_payable leg of seller_payable). */
  releasedMinor: number;
  /** Paid out to the seller's account (the seller_paid leg of transfer). */
  payoutsMinor: number;
  /** Escrow balance of the seller's orders at the month's end: paid, not yet released or refunded. */
  pendingReleaseMinor: number;
  /** seller_payable balance at the month's end: released, not yet paid out. */
  awaitingPayoutMinor: number;
}

export interface CurrencyBook {
  currency: string;
  months: MonthRow[];
  totals: Omit<MonthRow, "month" | "pendingReleaseMinor" | "awaitingPayoutMinor">;
}

export const MonthRangeSchema = z
  .object({
    from: z
      .string()
      .regex(/^\d{4}-(0[1-9]|1[0-2])$/, "Give a month as YYYY-MM.")
      .optional(),
    to: z
      .string()
      .regex(/^\d{4}-(0[1-9]|1[0-2])$/, "Give a month as YYYY-MM.")
      .optional(),
  })
  .refine((r) => !r.from || !r.to || r.from <= r.to, { message: "The first month must not be after the last.", path: ["from"] })
  .refine((r) => !r.from || !r.to || monthsBetween(r.from, r.to).length <= 120, {
    message: "Ten years at most at a time.",
    path: ["from"],
  });

/** The months asked for; by default the twelve ending with `now`'s. */
export function monthRange(query: z.infer<typeof MonthRangeSchema>, now: Date): { from: Month; to: Month } {
  const to = query.to ?? monthOf(now);
  return { from: query.from ?? addMonths(to, -11), to };
}

type Row = { month: Month; currency: string } & Record<
  "sales" | "refunds" | "fees" | "released" | "payouts" | "escrow" | "payable",
  string
>;

export async function moneyByMonth(sellerId: string, range: { from: Month; to: Month }): Promise<CurrencyBook[]> {
  // Every month up to the range's end: the balances at a month's end need what came before it.
  const rows = await sequelize.query<Row>(
    `SELECT to_char(date_trunc('month', le.at AT TIME ZONE 'UTC'), 'YYYY-MM') AS month, le.currency,
            coalesce(sum(le.amount_minor) FILTER (WHERE le.kind = 'buyer_payment' AND le.account = 'escrow'), 0)::text AS sales,
            coalesce(sum(le.amount_minor) FILTER (WHERE le.kind = 'refund' AND le.account = 'buyer'), 0)::text AS refunds,
            coalesce(sum(le.amount_minor) FILTER (WHERE le.kind = 'platform_fee' AND le.account = 'platform_fees'), 0)::text AS fees,
            coalesce(sum(le.amount_minor) FILTER (WHERE le.kind = 'seller_payable' AND le.account = 'seller_payable'), 0)::text AS released,
            coalesce(sum(le.amount_minor) FILTER (WHERE le.kind = 'transfer' AND le.account = 'seller_paid'), 0)::text AS payouts,
            coalesce(sum(le.amount_minor) FILTER (WHERE le.account = 'escrow'), 0)::text AS escrow,
            coalesce(sum(le.amount_minor) FILTER (WHERE le.account = 'seller_payable'), 0)::text AS payable
       FROM ledger_entries le JOIN orders o ON o.id = le.order_id
      WHERE o.seller_id = :sellerId AND le.at < (:end)::timestamp AT TIME ZONE 'UTC'
      GROUP BY 1, 2 ORDER BY 2, 1`,
    { replacements: { sellerId, end: `${addMonths(range.to, 1)}-01` }, type: QueryTypes.SELECT },
  );
  const byCurrency = new Map<string, Row[]>();
  for (const r of rows) byCurrency.set(r.currency, [...(byCurrency.get(r.currency) ?? []), r]);
  return [...byCurrency].map(([currency, list]) => book(currency, list, range));
}

function book(currency: string, rows: Row[], range: { from: Month; to: Month }): CurrencyBook {
  const of = new Map(rows.map((r) => [r.month, r]));
  let escrow = 0;
  let payable = 0;
  // The balances carried into the range from the months before it.
  for (const r of rows) {
    if (r.month >= range.from) break;
    escrow += Number(r.escrow);
    payable += Number(r.payable);
  }
  const months = monthsBetween(range.from, range.to).map((month): MonthRow => {
    const r = of.get(month);
    escrow += Number(r?.escrow ?? 0);
    payable += Number(r?.payable ?? 0);
    return {
      month,
      salesMinor: Number(r?.sales ?? 0),
      refundsMinor: Number(r?.refunds ?? 0),
      feesMinor: Number(r?.fees ?? 0),
      releasedMinor: Number(r?.released ?? 0),
      payoutsMinor: Number(r?.payouts ?? 0),
      pendingReleaseMinor: escrow,
      awaitingPayoutMinor: payable,
    };
  });
  const sum = (k: keyof CurrencyBook["totals"]) => months.reduce((s, m) => s + m[k], 0);
  return {
    currency,
    months,
    totals: {
      salesMinor: sum("salesMinor"),
      refundsMinor: sum("refundsMinor"),
      feesMinor: sum("feesMinor"),
      releasedMinor: sum("releasedMinor"),
      payoutsMinor: sum("payoutsMinor"),
    },
  };
}
