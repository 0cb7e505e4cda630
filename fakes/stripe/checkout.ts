import { chargeCardNumber, cvcLength } from "./cards";
import { invalid } from "./errors";
import type { Params } from "./form";
import { P } from "./params";
import { paginate, publicView, type StripeObject } from "./store";
import { route, snapshot, type Ctx, type Route } from "./context";
import { attemptPayment, checkAmount, createPaymentIntent, createPaymentMethod } from "./payments";

// Checkout Sessions (mode=payment) and the payment taken on the stand-in's hosted page. As in
// current Stripe, the PaymentIntent appears at the first payment attempt, not at session creation.

function createSession(ctx: Ctx, params: Params): StripeObject {
  const p = new P(params, [
    "mode",
    "line_items",
    "success_url",
    "cancel_url",
    "metadata",
    "client_reference_id",
    "customer_email",
    "payment_intent_data",
    "expires_at",
    "payment_method_types",
    "locale",
    "currency",
    "submit_type",
  ]);
  const mode = p.oneOf("mode", ["payment", "setup", "subscription"] as const, { required: true });
  if (mode !== "payment") throw invalid("This stand-in supports mode=payment only.", "mode");
  const items = p.list("line_items", ["price_data", "quantity", "price"]).map((item) => {
    if (item.has("price")) throw invalid("This stand-in takes price_data, not stored prices.", item.name("price"));
    const pd = item.obj("price_data", ["currency", "unit_amount", "product_data"], { required: true })!;
    const product = pd.obj("product_data", ["name", "description", "images", "metadata"], { required: true })!;
    const quantity = item.int("quantity", { required: true, min: 1 })!;
    const unit = pd.int("unit_amount", { required: true, min: 0 })!;
    return {
      id: ctx.store.newId("li"),
      object: "item",
      currency: pd.currency("currency", { required: true })!,
      description: product.str("name", { required: true })!,
      quantity,
      amount_subtotal: unit * quantity,
      amount_total: unit * quantity,
      price: { object: "price", unit_amount: unit, currency: pd.currency("currency")!, product_data: { name: product.str("name") } },
    };
  });
  if (items.length === 0) throw invalid("line_items is required in payment mode.", "line_items", "parameter_missing");
  const currency = items[0].currency;
  if (items.some((i) => i.currency !== currency)) throw invalid("All line_items must use the same currency.", "line_items");
  const total = items.reduce((s, i) => s + i.amount_total, 0);
  checkAmount(total, currency, "line_items");
  const pid = p.obj("payment_intent_data", [
    "capture_method",
    "transfer_group",
    "metadata",
    "description",
    "receipt_email",
    "transfer_data",
    "application_fee_amount",
    "setup_future_usage",
  ]);
  const destination = pid?.obj("transfer_data", ["destination", "amount"])?.str("destination");
  if (destination) ctx.store.find(destination, "account", "account", "payment_intent_data[transfer_data][destination]");
  const now = ctx.store.now();
  const expiresAt = p.int("expires_at") ?? now + 24 * 3600;
  if (expiresAt < now + 30 * 60 || expiresAt > now + 24 * 3600) {
    throw invalid("expires_at must be between 30 minutes and 24 hours from now.", "expires_at");
  }
  const id = ctx.store.newId("cs_test", 58);
  return ctx.store.insert({
    id,
    object: "checkout.session",
    amount_subtotal: total,
    amount_total: total,
    cancel_url: p.url("cancel_url") ?? null,
    client_reference_id: p.str("client_reference_id", { max: 200 }) ?? null,
    created: now,
    currency,
    customer_details: null,
    customer_email: p.str("customer_email") ?? null,
    expires_at: expiresAt,
    livemode: false,
    metadata: p.metadata(),
    mode,
    payment_intent: null,
    payment_method_types: ["card"],
    payment_status: "unpaid",
    status: "open",
    success_url: p.url("success_url", { required: true })!,
    url: `${ctx.baseUrl}/checkout/pay/${id}`,
    _line_items: items,
    _payment_intent_data: {
      capture_method: pid?.oneOf("capture_method", ["automatic", "automatic_async", "manual"] as const) ?? "automatic_async",
      transfer_group: pid?.str("transfer_group") ?? null,
      metadata: pid?.metadata() ?? {},
      description: pid?.str("description") ?? null,
      receipt_email: pid?.str("receipt_email") ?? null,
      transfer_data: destination ? { destination } : null,
      application_fee_amount: pid?.int("application_fee_amount", { min: 0 }) ?? null,
    },
  });
}

export function findSession(ctx: Ctx, id: string): StripeObject {
  const session = ctx.store.find(id, "checkout.session", "checkout.session");
  expireSession(ctx, session);
  return session;
}

export function expireSession(ctx: Ctx, session: StripeObject, force = false): void {
  if (session.status !== "open" || (!force && ctx.store.now() < session.expires_at)) return;
  const before = snapshot(session, ["status"]);
  session.status = "expired";
  session.url = null;
  ctx.store.changed();
  ctx.emit("checkout.session.expired", session, before);
}

export interface CardForm {
  number: string;
  exp: string;
  cvc: string;
  name: string;
  email: string;
}

export type PayResult = { redirect: string } | { error: string; field?: keyof CardForm };

/** Takes a payment on the hosted page; a decline keeps the session open for another card. */
export function paySession(ctx: Ctx, session: StripeObject, form: CardForm): PayResult {
  if (session.status !== "open") return { error: `This checkout is ${session.status}.` };
  if (!/^[^@\s]+@[^@\s]+\.[^@\s]+$/.test(form.email.trim())) return { error: "Enter a valid e-mail address.", field: "email" };
  const check = chargeCardNumber(form.number);
  if ("error" in check) return { error: check.error, field: "number" };
  const exp = /^\s*(\d{1,2})\s*\/\s*(\d{2}|\d{4})\s*$/.exec(form.exp);
  if (!exp || Number(exp[1]) < 1 || Number(exp[1]) > 12) return { error: "Enter the expiry as MM / YY.", field: "exp" };
  const month = Number(exp[1]);
  const year = exp[2].length === 2 ? 2000 + Number(exp[2]) : Number(exp[2]);
  const today = new Date(ctx.store.now() * 1000);
  if (year < today.getUTCFullYear() || (year === today.getUTCFullYear() && month < today.getUTCMonth() + 1)) {
    return { error: "Your card's expiration date is in the past.", field: "exp" };
  }
  if (!new RegExp(`^\\d{${cvcLength(check.card.brand)}}$`).test(form.cvc.trim())) {
    return { error: "Your card's security code is incomplete.", field: "cvc" };
  }
  let pi = ctx.store.get(session.payment_intent);
  if (!pi) {
    pi = createPaymentIntent(ctx, { amount: session.amount_total, currency: session.currency, ...session._payment_intent_data });
    session.payment_intent = pi.id;
  }
  const pm = createPaymentMethod(ctx, check.card, { month, year }, { email: form.email.trim(), name: form.name.trim() || null });
  const declined = attemptPayment(ctx, pi, pm, check.outcome);
  if (declined) {
    ctx.store.changed();
    const param = check.outcome.ok ? undefined : check.outcome.param;
    return { error: declined.message, field: param === "cvc" ? "cvc" : param?.startsWith("exp") ? "exp" : "number" };
  }
  const before = snapshot(session, ["status", "payment_status", "payment_intent", "customer_details"]);
  session.status = "complete";
  // A manual-capture payment is only authorised here, so the session stays unpaid until capture.
  session.payment_status = pi.status === "succeeded" ? "paid" : "unpaid";
  session.customer_details = { email: form.email.trim(), name: form.name.trim() || null };
  session.url = null;
  ctx.store.changed();
  ctx.emit("checkout.session.completed", session, before);
  return { redirect: String(session.success_url).replace(/\{CHECKOUT_SESSION_ID\}/g, session.id) };
}

export function lineItems(session: StripeObject) {
  return { object: "list", data: session._line_items, has_more: false, url: `/v1/checkout/sessions/${session.id}/line_items` };
}

export const checkoutRoutes: Route[] = [
  route("POST", "/v1/checkout/sessions", (ctx, params) => publicView(createSession(ctx, params))),
  route("GET", "/v1/checkout/sessions", (ctx, params) => {
    const p = new P(params, ["limit", "starting_after", "ending_before", "payment_intent", "status", "created"]);
    let items = ctx.store.all("checkout.session");
    items.forEach((s) => expireSession(ctx, s));
    const pi = p.str("payment_intent");
    const status = p.str("status");
    if (pi) items = items.filter((s) => s.payment_intent === pi);
    if (status) items = items.filter((s) => s.status === status);
    return paginate(items, "/v1/checkout/sessions", {
      limit: p.int("limit", { min: 1, max: 100 }),
      starting_after: p.str("starting_after"),
      ending_before: p.str("ending_before"),
    });
  }),
  route("GET", "/v1/checkout/sessions/:id", (ctx, _params, [id]) => publicView(findSession(ctx, id))),
  route("GET", "/v1/checkout/sessions/:id/line_items", (ctx, _params, [id]) => lineItems(findSession(ctx, id))),
  route("POST", "/v1/checkout/sessions/:id/expire", (ctx, _params, [id]) => {
    const session = findSession(ctx, id);
    if (session.status !== "open") {
      throw invalid(`Only Checkout Sessions with a status in [open] can be expired. This session has a status of ${session.status}.`);
    }
    expireSession(ctx, session, true);
    return publicView(session);
  }),
];
