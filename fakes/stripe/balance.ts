import { publicView, type StripeObject } from "./store";
import type { Ctx } from "./context";

// Balance transactions and the balances they make, for the platform and for each connected account.
// A captured charge's funds are pending until its `available_on` (the start of the UTC day PENDING_DAYS
// after capture, as Stripe rolls availability to a day boundary); refunds, transfers and payouts
// take effect at once. The stand-in charges no processing fee of its own, so a charge's net is its
// amount and the platform's books need no provider-fee line.

export const PENDING_DAYS = 2;
const DAY = 86_400;

/** Which balance a transaction belongs to: null for the platform, else a connected account id. */
export type BalanceOwner = string | null;

export function availableOnFrom(created: number, days = PENDING_DAYS): number {
  return (Math.floor(created / DAY) + days + 1) * DAY;
}

export function addBalanceTransaction(
  ctx: Ctx,
  fields: {
    owner: BalanceOwner;
    amount: number;
    currency: string;
    type: string;
    source: string;
    description?: string | null;
    availableOn?: number;
    fee?: number;
    feeDetails?: { amount: number; currency: string; description: string; type: string }[];
  },
): StripeObject {
  const now = ctx.store.now();
  const fee = fields.fee ?? 0;
  return ctx.store.insert({
    id: ctx.store.newId("txn"),
    object: "balance_transaction",
    amount: fields.amount,
    available_on: fields.availableOn ?? now,
    created: now,
    currency: fields.currency,
    description: fields.description ?? null,
    exchange_rate: null,
    fee,
    fee_details: fields.feeDetails ?? [],
    net: fields.amount - fee,
    reporting_category: fields.type === "payment" ? "charge" : fields.type,
    source: fields.source,
    status: "pending",
    type: fields.type,
    _owner: fields.owner,
  });
}

/** A balance transaction as the API shows it now: `status` follows the clock. */
export function viewBalanceTransaction(ctx: Ctx, txn: StripeObject): StripeObject {
  const view = publicView(txn);
  view.status = txn.available_on <= ctx.store.now() ? "available" : "pending";
  return view;
}

export function balanceTransactions(ctx: Ctx, owner: BalanceOwner): StripeObject[] {
  return ctx.store.all("balance_transaction").filter((t) => (t._owner ?? null) === owner);
}

/** Available and pending amounts per currency for one balance. */
export function balanceOf(ctx: Ctx, owner: BalanceOwner): { available: Record<string, number>; pending: Record<string, number> } {
  const available: Record<string, number> = {};
  const pending: Record<string, number> = {};
  const now = ctx.store.now();
  for (const t of balanceTransactions(ctx, owner)) {
    const into = t.available_on <= now ? available : pending;
    into[t.currency] = (into[t.currency] ?? 0) + t.net;
    if (!(t.currency in available)) available[t.currency] = 0;
  }
  return { available, pending };
}

export function balanceObject(ctx: Ctx, owner: BalanceOwner): Record<string, unknown> {
  const { available, pending } = balanceOf(ctx, owner);
  const rows = (m: Record<string, number>) => {
    const entries = Object.entries(m);
    if (entries.length === 0) return [{ amount: 0, currency: "usd", source_types: { card: 0 } }];
    return entries.map(([currency, amount]) => ({ amount, currency, source_types: { card: amount } }));
  };
  return { object: "balance", available: rows(available), pending: rows({ ...zeroes(available), ...pending }), livemode: false };
}

function zeroes(m: Record<string, number>): Record<string, number> {
  return Object.fromEntries(Object.keys(m).map((k) => [k, 0]));
}

/**
 * Automatic payouts: a connected account with payouts enabled is paid out whatever has become
 * available, in one payout per currency, arriving the next day (status pending → paid).
 */
export function runPayouts(ctx: Ctx): void {
  const now = ctx.store.now();
  for (const payout of ctx.store.all("payout")) {
    if (payout.status === "pending" && payout.arrival_date <= now) {
      const before = { status: payout.status };
      payout.status = "paid";
      ctx.store.changed();
      ctx.emitFor(payout._owner, "payout.paid", payout, before);
    }
  }
  for (const account of ctx.store.all("account")) {
    if (!account.payouts_enabled || account.settings?.payouts?.schedule?.interval === "manual") continue;
    const { available } = balanceOf(ctx, account.id);
    for (const [currency, amount] of Object.entries(available)) {
      if (amount <= 0) continue;
      const bank = account.external_accounts?.data?.[0];
      const payout = ctx.store.insert({
        id: ctx.store.newId("po"),
        object: "payout",
        amount,
        arrival_date: availableOnFrom(now, 0),
        automatic: true,
        balance_transaction: null as string | null,
        created: now,
        currency,
        description: "STRIPE PAYOUT",
        destination: bank?.id ?? null,
        livemode: false,
        metadata: {},
        method: "standard",
        status: "pending",
        type: "bank_account",
        _owner: account.id,
      });
      payout.balance_transaction = addBalanceTransaction(ctx, {
        owner: account.id,
        amount: -amount,
        currency,
        type: "payout",
        source: payout.id,
      }).id;
      ctx.emitFor(account.id, "payout.created", payout);
    }
  }
}
