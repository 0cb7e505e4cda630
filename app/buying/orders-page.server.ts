import type { SessionUser } from "~/auth/guards.server";
import { HttpError, pageError } from "~/http/errors.server";
import { User } from "~/models/index.server";
import { orderFor, purchasesFor, salesFor, type OrderRole } from "~/orders/queries.server";
import { acceptUnit, confirmArrival, markShipped } from "~/orders/transitions.server";
import { createCheckout } from "~/orders/provider.server";
import type { Clock } from "~/orders/clock.server";
import { fieldErrors, ShipForm, type FieldErrors } from "./order-forms";
import { orderDetailView, orderSummaries } from "./order-view.server";
import { orderRef } from "./order-view";
import type { PayoutView } from "./ui/PayoutsPanel";

// The buyer's and the seller's order pages: loading (someone else's order is the same 404 as a
// missing one) and the steps each side takes from them.

export async function purchasesPage(user: Pick<SessionUser, "id">) {
  return { orders: await orderSummaries(await purchasesFor(user.id), "buyer") };
}

export async function salesPage(user: Pick<SessionUser, "id">) {
  const orders = await salesFor(user.id);
  const seller = await User.findByPk(user.id, { attributes: ["id", "payoutsEnabled"] });
  const summaries = await orderSummaries(orders, "seller");
  const items: PayoutView[] = orders
    .filter((o) => o.transferId && o.releasedAt)
    .map((o) => {
      const s = summaries.find((x) => x.id === o.id)!;
      return {
        orderId: o.id,
        ref: orderRef(o.id),
        title: s.listing.title,
        at: o.releasedAt!.toISOString(),
        amountMinor: s.money.sellerNetMinor ?? 0,
        currency: o.currency,
      };
    })
    .sort((a, b) => b.at.localeCompare(a.at));
  return { orders: summaries, payouts: { enabled: seller?.payoutsEnabled ?? false, items } };
}

/** One order for the buyer (role "buyer") or the seller ("seller"); a 404 page for anyone else. */
export async function orderPage(user: Pick<SessionUser, "id">, orderId: string, role: Exclude<OrderRole, "moderator">) {
  try {
    const detail = await orderFor(user.id, orderId, role);
    return { detail, view: await orderDetailView(detail, role) };
  } catch (e) {
    return pageError(e);
  }
}

export type StepResult =
  { ok: true; redirectTo?: string } | { ok: false; status: number; errors: FieldErrors; values?: Record<string, string> };

/** A transition's refusal (wrong state, deadline passed) as a message for the form; anything else is thrown. */
async function step(run: () => Promise<unknown>): Promise<StepResult> {
  try {
    await run();
    return { ok: true };
  } catch (e) {
    if (e instanceof HttpError && e.status === 404) return pageError(e);
    if (e instanceof HttpError && e.status < 500) {
      const errors: FieldErrors = { form: e.message };
      for (const i of e.issues ?? []) errors[i.path] ??= i.message;
      return { ok: false, status: e.status, errors };
    }
    throw e;
  }
}

/** The buyer's steps: go to payment (again), confirm arrival, accept the unit. */
export async function buyerStep(
  user: Pick<SessionUser, "id">,
  orderId: string,
  intent: string,
  origin: string,
  clock: Clock,
): Promise<StepResult> {
  // Someone else's order is a 404 before anything else is looked at.
  const { order } = await orderFor(user.id, orderId, "buyer").catch(pageError);
  switch (intent) {
    case "pay": {
      if (order.state !== "reserved") return { ok: false, status: 409, errors: { form: "This order is no longer waiting for payment." } };
      // The same idempotency key as at checkout: the same hosted page comes back while it is open.
      const session = await createCheckout(order, {
        successUrl: `${origin}/purchases/${order.id}?paid=1`,
        cancelUrl: `${origin}/purchases/${order.id}`,
      });
      return { ok: true, redirectTo: session.url };
    }
    case "arrived":
      return step(() => confirmArrival(orderId, user.id, clock));
    case "accept":
      return step(() => acceptUnit(orderId, user.id, clock));
    default:
      return { ok: false, status: 400, errors: { form: "That is not a step you can take here." } };
  }
}

/** The seller's step: mark it shipped with the carrier and tracking number. */
export async function sellerStep(
  user: Pick<SessionUser, "id">,
  orderId: string,
  fields: Record<string, unknown>,
  clock: Clock,
): Promise<StepResult> {
  await orderFor(user.id, orderId, "seller").catch(pageError);
  if (fields.intent !== "ship") return { ok: false, status: 400, errors: { form: "That is not a step you can take here." } };
  const typed = (v: unknown) => (typeof v === "string" ? v.slice(0, 80) : "");
  const values = { carrier: typed(fields.carrier), trackingNumber: typed(fields.trackingNumber) };
  const parsed = ShipForm.safeParse(fields);
  if (!parsed.success) return { ok: false, status: 400, errors: fieldErrors(parsed.error), values };
  const done = await step(() => markShipped(orderId, user.id, parsed.data, clock));
  return done.ok ? done : { ...done, values };
}
