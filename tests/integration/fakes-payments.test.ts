import { afterAll, beforeAll, describe, expect, it } from "vitest";
import Stripe from "stripe";
import { startStripeFake, type RunningStripeFake } from "../../fakes/stripe/index";
import { createPaymentsClient } from "~/services/payments.server";
import { startReceiver } from "../support/http-receiver";

// The real stripe SDK, configured by the app's own client factory, against the payments stand-in
// over loopback. Test cards and their outcomes: docs.stripe.com/testing.
const SECRET = "sk_test_payments_suite";
const WEBHOOK_SECRET = "whsec_payments_suite";

describe("payments stand-in", () => {
  let fake: RunningStripeFake;
  let receiver: Awaited<ReturnType<typeof startReceiver>>;
  let stripe: Stripe;

  beforeAll(async () => {
    receiver = await startReceiver();
    fake = await startStripeFake({
      port: 0,
      secretKey: SECRET,
      webhook: { url: `${receiver.url}/api/v1/webhooks/stripe`, secret: WEBHOOK_SECRET, retryDelaysMs: [] },
    });
    stripe = createPaymentsClient({ mode: "fake", secretKey: SECRET, webhookSecret: WEBHOOK_SECRET, apiUrl: fake.url, port: fake.port });
  });
  afterAll(async () => {
    await fake?.stop();
    await receiver?.close();
  });

  async function onboardedWorkshop() {
    const account = await stripe.accounts.create({
      type: "express",
      country: "DE",
      email: "werkbank.nord@example.test",
      capabilities: { transfers: { requested: true }, card_payments: { requested: true } },
      metadata: { workshop: "w-17" },
    });
    const link = await stripe.accountLinks.create({
      account: account.id,
      type: "account_onboarding",
      return_url: "http://127.0.0.1:3000/sell/payouts?done=1",
      refresh_url: "http://127.0.0.1:3000/sell/payouts?again=1",
    });
    const done = await fetch(link.url, {
      method: "POST",
      body: new URLSearchParams({ business_name: "Werkbank Nord" }),
      redirect: "manual",
    });
    return { account, link, done };
  }

  async function pay(url: string, number: string) {
    return fetch(url, {
      method: "POST",
      body: new URLSearchParams({ email: "buyer@example.test", number, exp: "12 / 39", cvc: "123", name: "Pia Lorenz" }),
      redirect: "manual",
    });
  }

  it("creates a connected account whose onboarding link enables charges and payouts", async () => {
    const { account, link, done } = await onboardedWorkshop();
    expect(account.id).toMatch(/^acct_/);
    expect(account).toMatchObject({
      charges_enabled: false,
      payouts_enabled: false,
      default_currency: "eur",
      metadata: { workshop: "w-17" },
    });
    expect(link.url.startsWith(fake.url)).toBe(true);
    expect(done.status).toBe(303);
    expect(done.headers.get("location")).toBe("http://127.0.0.1:3000/sell/payouts?done=1");
    const after = await stripe.accounts.retrieve(account.id);
    expect(after).toMatchObject({
      charges_enabled: true,
      payouts_enabled: true,
      details_submitted: true,
      capabilities: { transfers: "active" },
    });
    // Links are single-use: a second visit goes to refresh_url.
    const again = await fetch(link.url, { redirect: "manual" });
    expect(again.headers.get("location")).toBe("http://127.0.0.1:3000/sell/payouts?again=1");
  });

  it("takes an escrow payment through the hosted page: declined card refused, then held, captured, transferred and refunded", async () => {
    const { account } = await onboardedWorkshop();
    const session = await stripe.checkout.sessions.create({
      mode: "payment",
      line_items: [
        { quantity: 1, price_data: { currency: "eur", unit_amount: 64_900, product_data: { name: "Integrated amplifier, serviced" } } },
      ],
      success_url: "http://127.0.0.1:3000/orders/o-5/paid?session={CHECKOUT_SESSION_ID}",
      cancel_url: "http://127.0.0.1:3000/orders/o-5",
      metadata: { order: "o-5" },
      payment_intent_data: { capture_method: "manual", transfer_group: "order_o-5", metadata: { order: "o-5" } },
    });
    expect(session).toMatchObject({
      status: "open",
      payment_status: "unpaid",
      amount_total: 64_900,
      currency: "eur",
      payment_intent: null,
    });

    const declined = await pay(session.url!, "4000 0000 0000 0002");
    expect(declined.status).toBe(402);
    expect(await declined.text()).toContain("Your card was declined.");
    const poor = await pay(session.url!, "4000000000009995");
    expect(await poor.text()).toContain("insufficient funds");
    const stillOpen = await stripe.checkout.sessions.retrieve(session.id, { expand: ["payment_intent"] });
    expect(stillOpen.status).toBe("open");
    expect((stillOpen.payment_intent as Stripe.PaymentIntent).status).toBe("requires_payment_method");
    expect((stillOpen.payment_intent as Stripe.PaymentIntent).last_payment_error?.decline_code).toBe("insufficient_funds");

    const paid = await pay(session.url!, "4242 4242 4242 4242");
    expect(paid.status).toBe(303);
    expect(paid.headers.get("location")).toBe(`http://127.0.0.1:3000/orders/o-5/paid?session=${session.id}`);
    const completed = await stripe.checkout.sessions.retrieve(session.id);
    expect(completed.status).toBe("complete");
    const held = await stripe.paymentIntents.retrieve(completed.payment_intent as string);
    expect(held).toMatchObject({
      status: "requires_capture",
      amount_capturable: 64_900,
      transfer_group: "order_o-5",
      metadata: { order: "o-5" },
    });

    const captured = await stripe.paymentIntents.capture(held.id);
    expect(captured).toMatchObject({ status: "succeeded", amount_received: 64_900 });
    // The captured funds are pending, so only a transfer tied to this charge may go yet.
    await expect(
      stripe.transfers.create({ amount: 58_410, currency: "eur", destination: account.id, transfer_group: "order_o-5" }),
    ).rejects.toMatchObject({ code: "balance_insufficient" });
    const transfer = await stripe.transfers.create({
      amount: 58_410,
      currency: "eur",
      destination: account.id,
      transfer_group: "order_o-5",
      source_transaction: captured.latest_charge as string,
    });
    expect(transfer).toMatchObject({ amount: 58_410, destination: account.id, transfer_group: "order_o-5" });
    const refund = await stripe.refunds.create({ payment_intent: held.id, amount: 1_000, reason: "requested_by_customer" });
    expect(refund).toMatchObject({ status: "succeeded", amount: 1_000, payment_intent: held.id });
    await expect(stripe.refunds.create({ payment_intent: held.id, amount: 64_000 })).rejects.toMatchObject({ param: "amount" });
  });

  it("creates, confirms and cancels payment intents through the API", async () => {
    const pi = await stripe.paymentIntents.create({
      amount: 12_500,
      currency: "eur",
      capture_method: "manual",
      transfer_group: "order_o-6",
    });
    expect(pi).toMatchObject({ status: "requires_payment_method", amount: 12_500 });
    expect(pi.id).toMatch(/^pi_/);
    expect(pi.client_secret).toMatch(new RegExp(`^${pi.id}_secret_`));
    const confirmed = await stripe.paymentIntents.confirm(pi.id, { payment_method: "pm_card_visa" });
    expect(confirmed.status).toBe("requires_capture");
    const canceled = await stripe.paymentIntents.cancel(pi.id, { cancellation_reason: "abandoned" });
    expect(canceled.status).toBe("canceled");
    await expect(stripe.paymentIntents.capture(pi.id)).rejects.toMatchObject({ code: "payment_intent_unexpected_state" });

    const refused = stripe.paymentIntents.create({
      amount: 9_900,
      currency: "eur",
      payment_method: "pm_card_chargeDeclined",
      confirm: true,
    });
    await expect(refused).rejects.toBeInstanceOf(Stripe.errors.StripeCardError);
    await expect(refused).rejects.toMatchObject({ statusCode: 402, code: "card_declined", decline_code: "generic_decline" });
  });

  it("replays an idempotent request and refuses the same key with other parameters", async () => {
    // docs.stripe.com/api/idempotent_requests: same key → the saved response; other parameters → error.
    const key = `order-o-7-${Date.now()}`;
    const first = await stripe.paymentIntents.create({ amount: 30_000, currency: "eur" }, { idempotencyKey: key });
    const again = await stripe.paymentIntents.create({ amount: 30_000, currency: "eur" }, { idempotencyKey: key });
    expect(again.id).toBe(first.id);
    expect(again.lastResponse.headers["idempotent-replayed"]).toBe("true");
    await expect(stripe.paymentIntents.create({ amount: 31_000, currency: "eur" }, { idempotencyKey: key })).rejects.toBeInstanceOf(
      Stripe.errors.StripeIdempotencyError,
    );
    const all = await stripe.paymentIntents.list({ limit: 100 });
    expect(all.data.filter((p) => p.id === first.id)).toHaveLength(1);
  });

  it("answers like the provider to a bad key, an unknown parameter and a missing object", async () => {
    const bad = createPaymentsClient({
      mode: "fake",
      secretKey: "sk_test_wrong",
      webhookSecret: WEBHOOK_SECRET,
      apiUrl: fake.url,
      port: fake.port,
    });
    await expect(bad.balance.retrieve()).rejects.toBeInstanceOf(Stripe.errors.StripeAuthenticationError);
    // A parameter the provider does not know, past the compiler's check for unknown keys.
    const withColour = { type: "express" as const, colour: "walnut" };
    await expect(stripe.accounts.create(withColour)).rejects.toMatchObject({
      code: "parameter_unknown",
      param: "colour",
    });
    await expect(stripe.transfers.retrieve("tr_missing")).rejects.toMatchObject({ statusCode: 404, code: "resource_missing" });
  });

  it("delivers events to the webhook signed the way the provider signs them", async () => {
    await stripe.accounts.create({ type: "express", country: "DE", metadata: { marker: "signed-delivery" } });
    const created = await stripe.events.list({ limit: 100 });
    expect(created.data.length).toBeGreaterThan(5);
    await fake.webhooksIdle();
    expect(receiver.received.length).toBeGreaterThan(0);
    const delivery = receiver.received[receiver.received.length - 1];
    expect(delivery.path).toBe("/api/v1/webhooks/stripe");
    // Header t=<unix>,v1=<hex HMAC-SHA256(secret, "t.body")> (the provider's webhook signature docs; the official Ruby SDK's compute_signature).
    const header = String(delivery.headers["stripe-signature"]);
    expect(header).toMatch(/^t=\d+,v1=[0-9a-f]{64}$/);
    const event = Stripe.webhooks.constructEvent(delivery.body, header, WEBHOOK_SECRET);
    expect(event.id).toMatch(/^evt_/);
    expect((await stripe.events.retrieve(event.id)).type).toBe(event.type);
    const tampered = delivery.body.replace(/"livemode": false/, '"livemode": true');
    expect(tampered).not.toBe(delivery.body);
    expect(() => Stripe.webhooks.constructEvent(tampered, header, WEBHOOK_SECRET)).toThrow(Stripe.errors.StripeSignatureVerificationError);
    expect(() => Stripe.webhooks.constructEvent(delivery.body, header, "whsec_other")).toThrow(
      Stripe.errors.StripeSignatureVerificationError,
    );
  });

  it("retries a delivery the app did not accept", async () => {
    const flaky = await startReceiver((_req, i) => (i === 0 ? 500 : 200));
    const second = await startStripeFake({
      port: 0,
      secretKey: SECRET,
      webhook: { url: flaky.url, secret: WEBHOOK_SECRET, retryDelaysMs: [20, 20] },
    });
    try {
      const client = createPaymentsClient({
        mode: "fake",
        secretKey: SECRET,
        webhookSecret: WEBHOOK_SECRET,
        apiUrl: second.url,
        port: second.port,
      });
      await client.accounts.update((await client.accounts.create({ type: "express" })).id, { metadata: { a: "1" } });
      await flaky.waitFor(2);
      const [firstTry, retry] = flaky.received;
      expect(JSON.parse(retry.body).id).toBe(JSON.parse(firstTry.body).id);
      expect(Stripe.webhooks.constructEvent(retry.body, String(retry.headers["stripe-signature"]), WEBHOOK_SECRET).type).toBe(
        "account.updated",
      );
    } finally {
      await second.stop();
      await flaky.close();
    }
  });
});
