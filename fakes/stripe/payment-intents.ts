import { invalid, missingParam } from "./errors";
import type { Params } from "./form";
import { P } from "./params";
import { paginate, publicView, type StripeObject } from "./store";
import { route, type Ctx, type Route } from "./context";
import {
  attemptPayment,
  cancelPaymentIntent,
  capturePaymentIntent,
  createPaymentIntent,
  expireHold,
  resolvePaymentMethod,
} from "./payments";

// /v1/payment_intents and /v1/charges (read-only) over the money core in payments.ts.

const CAPTURE_METHODS = ["automatic", "automatic_async", "manual"] as const;

function findIntent(ctx: Ctx, id: string): StripeObject {
  const pi = ctx.store.find(id, "payment_intent", "payment_intent");
  expireHold(ctx, pi);
  return pi;
}

/** Confirms with the given method; a decline is thrown as Stripe's 402 card error. */
function confirm(ctx: Ctx, pi: StripeObject, paymentMethodId: string | undefined): StripeObject {
  const id = paymentMethodId ?? pi.payment_method;
  if (!id) throw missingParam("payment_method");
  const pm = resolvePaymentMethod(ctx, id);
  const outcome = pm._outcome ?? { ok: true };
  const declined = attemptPayment(ctx, pi, pm, outcome);
  if (declined) throw declined;
  return pi;
}

function create(ctx: Ctx, params: Params): StripeObject {
  const p = new P(params, [
    "amount",
    "currency",
    "capture_method",
    "confirm",
    "payment_method",
    "payment_method_types",
    "metadata",
    "description",
    "transfer_group",
    "receipt_email",
    "transfer_data",
    "application_fee_amount",
    "return_url",
    "automatic_payment_methods",
    "statement_descriptor_suffix",
  ]);
  const amount = p.int("amount", { required: true, min: 1 })!;
  const currency = p.currency("currency", { required: true })!;
  const transferData = p.obj("transfer_data", ["destination", "amount"]);
  const destination = transferData?.str("destination", { required: true });
  if (destination) ctx.store.find(destination, "account", "account", "transfer_data[destination]");
  const types = p.strings("payment_method_types");
  if (types.some((t) => t !== "card")) throw invalid("This stand-in accepts only payment_method_types=card", "payment_method_types");
  const pmId = p.str("payment_method");
  const pi = createPaymentIntent(
    ctx,
    {
      amount,
      currency,
      capture_method: p.oneOf("capture_method", CAPTURE_METHODS) ?? "automatic_async",
      metadata: p.metadata(),
      description: p.str("description") ?? null,
      transfer_group: p.str("transfer_group") ?? null,
      receipt_email: p.str("receipt_email") ?? null,
      transfer_data: destination
        ? { destination, ...(transferData?.has("amount") ? { amount: transferData.int("amount", { min: 1 }) } : {}) }
        : null,
      application_fee_amount: p.int("application_fee_amount", { min: 0 }) ?? null,
    },
    pmId ? resolvePaymentMethod(ctx, pmId).id : null,
  );
  if (p.bool("confirm")) confirm(ctx, pi, undefined);
  return pi;
}

function update(ctx: Ctx, params: Params, pi: StripeObject): StripeObject {
  const p = new P(params, ["metadata", "description", "transfer_group", "receipt_email", "amount"]);
  if (p.has("amount")) {
    if (!["requires_payment_method", "requires_confirmation"].includes(pi.status)) {
      throw invalid(`The amount cannot be changed when the status is ${pi.status}.`, "amount");
    }
    pi.amount = p.int("amount", { min: 1 })!;
  }
  pi.metadata = p.metadata(pi.metadata);
  if (p.has("description")) pi.description = p.str("description") ?? null;
  if (p.has("transfer_group")) pi.transfer_group = p.str("transfer_group") ?? null;
  if (p.has("receipt_email")) pi.receipt_email = p.str("receipt_email") ?? null;
  ctx.store.changed();
  return pi;
}

function listOf(ctx: Ctx, params: Params, object: string, url: string, filters: string[]) {
  const p = new P(params, ["limit", "starting_after", "ending_before", "created", ...filters]);
  let items = ctx.store.all(object);
  for (const f of filters) {
    const value = p.str(f);
    if (value) items = items.filter((o) => o[f] === value);
  }
  return paginate(items, url, {
    limit: p.int("limit", { min: 1, max: 100 }),
    starting_after: p.str("starting_after"),
    ending_before: p.str("ending_before"),
  });
}

export const paymentIntentRoutes: Route[] = [
  route("POST", "/v1/payment_intents", (ctx, params) => publicView(create(ctx, params))),
  route("GET", "/v1/payment_intents", (ctx, params) => {
    for (const pi of ctx.store.all("payment_intent")) expireHold(ctx, pi);
    return listOf(ctx, params, "payment_intent", "/v1/payment_intents", ["customer"]);
  }),
  route("GET", "/v1/payment_intents/:id", (ctx, params, [id]) => {
    new P(params, ["client_secret"]);
    return publicView(findIntent(ctx, id));
  }),
  route("POST", "/v1/payment_intents/:id", (ctx, params, [id]) => publicView(update(ctx, params, findIntent(ctx, id)))),
  route("POST", "/v1/payment_intents/:id/confirm", (ctx, params, [id]) => {
    const p = new P(params, ["payment_method", "return_url", "receipt_email"]);
    return publicView(confirm(ctx, findIntent(ctx, id), p.str("payment_method")));
  }),
  route("POST", "/v1/payment_intents/:id/capture", (ctx, params, [id]) => {
    const p = new P(params, ["amount_to_capture", "metadata", "final_capture"]);
    const pi = findIntent(ctx, id);
    pi.metadata = p.metadata(pi.metadata);
    return publicView(capturePaymentIntent(ctx, pi, p.int("amount_to_capture", { min: 1 })));
  }),
  route("POST", "/v1/payment_intents/:id/cancel", (ctx, params, [id]) => {
    const p = new P(params, ["cancellation_reason"]);
    const reason = p.oneOf("cancellation_reason", ["duplicate", "fraudulent", "requested_by_customer", "abandoned"] as const);
    return publicView(cancelPaymentIntent(ctx, findIntent(ctx, id), reason ?? null));
  }),
  route("GET", "/v1/charges", (ctx, params) => listOf(ctx, params, "charge", "/v1/charges", ["payment_intent", "transfer_group"])),
  route("GET", "/v1/charges/:id", (ctx, _params, [id]) => publicView(ctx.store.find(id, "charge", "charge"))),
  route("GET", "/v1/payment_methods/:id", (ctx, _params, [id]) => publicView(ctx.store.find(id, "payment_method", "PaymentMethod"))),
];

export { listOf };
