import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import Stripe from "stripe";
import { startReceiver } from "../support/http-receiver";
import { chargeOf, onboardedAccount, payOnPage, startTestFake, FAKE_WEBHOOK_SECRET, type TestFake } from "../support/stripe-fake";

// The payments stand-in's balances through the real SDK: funds pending until available_on, transfers
// tied to their charge (source_transaction), refunds that shrink what may still be transferred,
// destination charges with an application fee, automatic payouts on connected accounts, and webhook
// deliveries that outlive a restart. Shapes from the provider's API reference (Balance,
// Balance Transaction, Transfer, Payout, Application Fee).
const DAY = 86_400;

describe("payments stand-in balances", () => {
  let t: TestFake;
  // A fixed noon, so availability (start of the UTC day two days on) is a known 2.5 days away.
  const noon = Date.UTC(2026, 11, 2, 12) / 1000;

  beforeAll(async () => {
    t = await startTestFake({}, noon);
  });
  afterAll(async () => {
    await t?.fake.stop();
  });

  async function paidSession(amount: number, currency = "gbp", extra: Partial<Stripe.Checkout.SessionCreateParams> = {}) {
    const session = await t.stripe.checkout.sessions.create({
      mode: "payment",
      line_items: [{ quantity: 1, price_data: { currency, unit_amount: amount, product_data: { name: "Power amplifier" } } }],
      success_url: "http://127.0.0.1:3000/purchases/o-1",
      ...extra,
    });
    expect((await payOnPage(session.url!)).status).toBe(303);
    return chargeOf(t.stripe, session.id);
  }

  const amountIn = (rows: Stripe.Balance.Available[] | Stripe.Balance.Pending[], currency: string) =>
    rows.find((r) => r.currency === currency)?.amount ?? 0;

  it("keeps a charge's funds pending until available_on, then available", async () => {
    const charge = await paidSession(120_000, "chf");
    const txn = await t.stripe.balanceTransactions.retrieve(charge.balance_transaction as string);
    expect(txn).toMatchObject({ type: "charge", amount: 120_000, net: 120_000, fee: 0, status: "pending", source: charge.id });
    expect(txn.available_on).toBe(Date.UTC(2026, 11, 5) / 1000);
    let balance = await t.stripe.balance.retrieve();
    expect(amountIn(balance.pending, "chf")).toBe(120_000);
    expect(amountIn(balance.available, "chf")).toBe(0);

    t.clock.advance(3 * DAY);
    balance = await t.stripe.balance.retrieve();
    expect(amountIn(balance.available, "chf")).toBe(120_000);
    expect(amountIn(balance.pending, "chf")).toBe(0);
    expect((await t.stripe.balanceTransactions.retrieve(txn.id)).status).toBe("available");
  });

  it("transfers from a pending charge with source_transaction, never beyond the charge less its refunds", async () => {
    const seller = await onboardedAccount(t.stripe);
    const charge = await paidSession(80_000);
    await expect(t.stripe.transfers.create({ amount: 10_000, currency: "gbp", destination: seller.id })).rejects.toMatchObject({
      code: "balance_insufficient",
    });
    await t.stripe.refunds.create({ charge: charge.id, amount: 20_000 });
    await expect(
      t.stripe.transfers.create({ amount: 60_001, currency: "gbp", destination: seller.id, source_transaction: charge.id }),
    ).rejects.toMatchObject({ code: "amount_too_large", param: "amount" });
    const transfer = await t.stripe.transfers.create({
      amount: 55_000,
      currency: "gbp",
      destination: seller.id,
      source_transaction: charge.id,
      transfer_group: "order_o-2",
    });
    expect(transfer).toMatchObject({ amount: 55_000, source_transaction: charge.id, transfer_group: "order_o-2" });
    // 5,000 left: a second transfer of 5,001 from the same charge is refused, 5,000 goes.
    await expect(
      t.stripe.transfers.create({ amount: 5_001, currency: "gbp", destination: seller.id, source_transaction: charge.id }),
    ).rejects.toMatchObject({ code: "amount_too_large" });

    // On the seller's side the money is pending for as long as the charge it came from.
    const theirs = await t.stripe.balance.retrieve({}, { stripeAccount: seller.id });
    expect(amountIn(theirs.pending, "gbp")).toBe(55_000);
    expect(amountIn(theirs.available, "gbp")).toBe(0);
    const platform = await t.stripe.balance.retrieve();
    expect(amountIn(platform.pending, "gbp")).toBe(80_000);
    expect(amountIn(platform.available, "gbp")).toBe(-75_000);
    const listed = await t.stripe.transfers.list({ transfer_group: "order_o-2" });
    expect(listed.data.map((x) => x.id)).toEqual([transfer.id]);
  });

  it("pays a connected account out automatically once its funds are available, and marks the payout paid on arrival", async () => {
    const seller = await onboardedAccount(t.stripe, "payout@example.test");
    const charge = await paidSession(40_000);
    await t.stripe.transfers.create({ amount: 36_000, currency: "gbp", destination: seller.id, source_transaction: charge.id });
    expect((await t.stripe.payouts.list({}, { stripeAccount: seller.id })).data).toHaveLength(0);

    t.clock.advance(3 * DAY);
    const payouts = await t.stripe.payouts.list({}, { stripeAccount: seller.id });
    expect(payouts.data).toHaveLength(1);
    expect(payouts.data[0]).toMatchObject({ amount: 36_000, currency: "gbp", automatic: true, status: "pending" });
    const balance = await t.stripe.balance.retrieve({}, { stripeAccount: seller.id });
    expect(amountIn(balance.available, "gbp")).toBe(0);

    t.clock.advance(DAY);
    await t.stripe.balance.retrieve();
    expect((await t.stripe.payouts.retrieve(payouts.data[0].id, {}, { stripeAccount: seller.id })).status).toBe("paid");
    const events = await t.stripe.events.list({ types: ["payout.created", "payout.paid"] });
    expect(events.data.filter((e) => e.account === seller.id).map((e) => e.type)).toEqual(["payout.paid", "payout.created"]);
    // The platform's own list does not show the seller's payouts.
    expect((await t.stripe.payouts.list()).data).toHaveLength(0);
  });

  it("sends a destination charge's share on at once and keeps the application fee", async () => {
    const seller = await onboardedAccount(t.stripe, "dest@example.test");
    const charge = await paidSession(50_000, "gbp", {
      payment_intent_data: { application_fee_amount: 4_000, transfer_data: { destination: seller.id } },
    });
    expect(charge.transfer).toMatch(/^tr_/);
    const transfer = await t.stripe.transfers.retrieve(charge.transfer as string);
    expect(transfer).toMatchObject({ amount: 46_000, destination: seller.id, source_transaction: charge.id });
    const fees = await t.stripe.applicationFees.list({ charge: charge.id });
    expect(fees.data[0]).toMatchObject({ amount: 4_000, account: seller.id, charge: charge.id });
  });

  it("refuses another account's view of a balance when the account does not exist", async () => {
    await expect(t.stripe.balance.retrieve({}, { stripeAccount: "acct_nobody" })).rejects.toMatchObject({ statusCode: 403 });
  });
});

describe("payments stand-in webhook retries across a restart", () => {
  it("resumes a delivery that was waiting when the stand-in stopped", async () => {
    const dir = mkdtempSync(path.join(os.tmpdir(), "stripe-fake-"));
    const file = path.join(dir, "state.json");
    let accept = false;
    const receiver = await startReceiver(() => (accept ? 200 : 503));
    const target = { url: receiver.url, secret: FAKE_WEBHOOK_SECRET, retryDelaysMs: [60_000] };
    const first = await startTestFake({ file, webhook: target });
    try {
      const account = await first.stripe.accounts.create({ type: "express", country: "GB" });
      await first.stripe.accounts.update(account.id, { metadata: { n: "1" } });
      await first.fake.webhooksIdle();
      expect(receiver.received).toHaveLength(1);
    } finally {
      await first.fake.stop();
    }
    // The stand-in stays down past the retry's time; the next start delivers it at once, signed afresh.
    accept = true;
    const state = JSON.parse(readFileSync(file, "utf8"));
    const waiting = Object.values(state.objects as Record<string, Record<string, unknown>>).filter(
      (o) => o.object === "event" && Number(o.pending_webhooks) > 0,
    );
    expect(waiting).toHaveLength(1);
    expect(waiting[0]._next_attempt_at).toBeGreaterThan(Date.now());
    waiting[0]._next_attempt_at = Date.now() - 1;
    writeFileSync(file, JSON.stringify(state));
    const second = await startTestFake({ file, webhook: { ...target, retryDelaysMs: [] } });
    try {
      await receiver.waitFor(2);
      const retry = receiver.received[1];
      expect(JSON.parse(retry.body).id).toBe(JSON.parse(receiver.received[0].body).id);
      expect(Stripe.webhooks.constructEvent(retry.body, String(retry.headers["stripe-signature"]), FAKE_WEBHOOK_SECRET).type).toBe(
        "account.updated",
      );
      await second.fake.webhooksIdle();
      expect(second.fake.store.all("event")[0]).toMatchObject({ pending_webhooks: 0, _next_attempt_at: null });
      expect(receiver.received).toHaveLength(2);
    } finally {
      await second.fake.stop();
      await receiver.close();
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
