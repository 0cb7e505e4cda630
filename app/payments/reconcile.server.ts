import type Stripe from "stripe";
import { LedgerEntry, Order } from "~/models/index.server";
import { payments } from "~/services/payments.server";

// `npm run reconcile`: the ledger per order beside the provider's own record of the same money:
// charges (what buyers paid), refunds and transfers (what sellers were paid), each matched by its
// provider id. Every difference is reported; none means the two agree to the minor unit.

export type MovementKind = "payment" | "refund" | "transfer";

export interface Difference {
  orderId: string | null;
  kind: MovementKind | "balance";
  providerRef: string | null;
  ledgerMinor: number | null;
  providerMinor: number | null;
  message: string;
}

interface Money {
  orderId: string | null;
  kind: MovementKind;
  ref: string;
  amountMinor: number;
  currency: string;
}

/** The ledger's movements that touch the provider, one per provider id. */
async function ledgerSide(orderIds?: string[]): Promise<{ movements: Money[]; unbalanced: Difference[] }> {
  const entries = await LedgerEntry.findAll({ ...(orderIds ? { where: { orderId: orderIds } } : {}), order: [["seq", "ASC"]] });
  const movements = new Map<string, Money>();
  const sums = new Map<string, number>();
  // The leg that shows each movement's size from the provider's side.
  const legs: Record<string, [MovementKind, string]> = {
    buyer_payment: ["payment", "escrow"],
    refund: ["refund", "buyer"],
    transfer: ["transfer", "seller_paid"],
  };
  for (const e of entries) {
    sums.set(e.orderId, (sums.get(e.orderId) ?? 0) + e.amountMinor);
    const leg = legs[e.kind];
    if (!leg || e.account !== leg[1]) continue;
    const key = `${leg[0]}:${e.providerRef ?? `missing:${e.movementId}`}`;
    const seen = movements.get(key);
    if (seen) seen.amountMinor += e.amountMinor;
    else
      movements.set(key, { orderId: e.orderId, kind: leg[0], ref: e.providerRef ?? "", amountMinor: e.amountMinor, currency: e.currency });
  }
  const unbalanced = [...sums]
    .filter(([, sum]) => sum !== 0)
    .map(([orderId, sum]) => ({
      orderId,
      kind: "balance" as const,
      providerRef: null,
      ledgerMinor: sum,
      providerMinor: null,
      message: `the order's ledger entries sum to ${sum}, not 0`,
    }));
  return { movements: [...movements.values()], unbalanced };
}

const ORDER_GROUP = /^order_(.+)$/;

function orderOf(obj: { metadata?: Stripe.Metadata | null; transfer_group?: string | null }): string | null {
  return obj.metadata?.order_id ?? ORDER_GROUP.exec(obj.transfer_group ?? "")?.[1] ?? null;
}

/** The provider's charges, refunds and transfers, listed through the SDK (every page). */
async function providerSide(stripe: Stripe): Promise<Money[]> {
  const out: Money[] = [];
  const chargeOrder = new Map<string, string | null>();
  for await (const c of stripe.charges.list({ limit: 100 })) {
    if (!c.captured || c.amount_captured === 0) continue;
    const orderId = orderOf(c);
    chargeOrder.set(c.id, orderId);
    out.push({ orderId, kind: "payment", ref: c.id, amountMinor: c.amount_captured, currency: c.currency });
  }
  for await (const r of stripe.refunds.list({ limit: 100 })) {
    if (r.status !== "succeeded") continue;
    const charge = typeof r.charge === "string" ? r.charge : (r.charge?.id ?? "");
    const orderId = r.metadata?.order_id ?? chargeOrder.get(charge) ?? null;
    out.push({ orderId, kind: "refund", ref: r.id, amountMinor: r.amount, currency: r.currency });
  }
  for await (const t of stripe.transfers.list({ limit: 100 })) {
    out.push({ orderId: orderOf(t), kind: "transfer", ref: t.id, amountMinor: t.amount - t.amount_reversed, currency: t.currency });
  }
  return out;
}

const WORDS: Record<MovementKind, string> = { payment: "payment", refund: "refund", transfer: "transfer to the seller" };

/**
 * Every difference between the ledger and the provider; an empty list when they agree. With
 * `orderIds`, only those orders' money on either side.
 */
export async function reconcile({ stripe = payments(), orderIds }: { stripe?: Stripe; orderIds?: string[] } = {}): Promise<Difference[]> {
  const [{ movements, unbalanced }, all] = await Promise.all([ledgerSide(orderIds), providerSide(stripe)]);
  const provider = orderIds ? all.filter((p) => p.orderId && orderIds.includes(p.orderId)) : all;
  const known = new Set((await Order.findAll({ attributes: ["id"], ...(orderIds ? { where: { id: orderIds } } : {}) })).map((o) => o.id));
  const differences: Difference[] = [...unbalanced];
  const byRef = new Map(provider.map((p) => [`${p.kind}:${p.ref}`, p]));
  const matched = new Set<string>();
  for (const m of movements) {
    const key = `${m.kind}:${m.ref}`;
    const theirs = m.ref ? byRef.get(key) : undefined;
    const base = { orderId: m.orderId, kind: m.kind, providerRef: m.ref || null, ledgerMinor: m.amountMinor };
    if (!theirs) {
      differences.push({
        ...base,
        providerMinor: null,
        message: m.ref
          ? `the ledger's ${WORDS[m.kind]} ${m.ref} is not at the provider`
          : `the ledger has a ${WORDS[m.kind]} without a provider id`,
      });
      continue;
    }
    matched.add(key);
    if (theirs.orderId && theirs.orderId !== m.orderId) {
      differences.push({
        ...base,
        providerMinor: theirs.amountMinor,
        message: `the provider files ${m.ref} under order ${theirs.orderId}`,
      });
    } else if (theirs.amountMinor !== m.amountMinor || theirs.currency.toUpperCase() !== m.currency.toUpperCase()) {
      differences.push({
        ...base,
        providerMinor: theirs.amountMinor,
        message: `${WORDS[m.kind]} ${m.ref}: ledger ${m.amountMinor} ${m.currency.toUpperCase()}, provider ${theirs.amountMinor} ${theirs.currency.toUpperCase()}`,
      });
    }
  }
  for (const p of provider) {
    if (matched.has(`${p.kind}:${p.ref}`) || !p.orderId) continue; // money of no order of ours is not the ledger's
    differences.push({
      orderId: p.orderId,
      kind: p.kind,
      providerRef: p.ref,
      ledgerMinor: null,
      providerMinor: p.amountMinor,
      message: known.has(p.orderId)
        ? `the provider's ${WORDS[p.kind]} ${p.ref} (${p.amountMinor} ${p.currency.toUpperCase()}) is not in the ledger`
        : `the provider's ${WORDS[p.kind]} ${p.ref} names order ${p.orderId}, which does not exist`,
    });
  }
  return differences;
}

export function describeDifference(d: Difference): string {
  return `${d.orderId ? `order ${d.orderId}` : "no order"}: ${d.message}`;
}
