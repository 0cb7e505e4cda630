import type Stripe from "stripe";
import { startStripeFake, type RunningStripeFake, type StripeFakeOptions } from "../../fakes/stripe/index";
import { createPaymentsClient } from "~/services/payments.server";

// A payments stand-in of a test's own, with a clock the test moves (seconds since the epoch), and
// the real SDK pointed at it through the app's client factory.

export const FAKE_SECRET = "sk_test_loadline_local";
export const FAKE_WEBHOOK_SECRET = "whsec_loadline_local";

export interface TestFake {
  fake: RunningStripeFake;
  stripe: Stripe;
  clock: { now: number; advance(seconds: number): void };
}

export async function startTestFake(opts: Partial<StripeFakeOptions> = {}, start = Math.floor(Date.now() / 1000)): Promise<TestFake> {
  const clock = {
    now: start,
    advance(seconds: number) {
      clock.now += seconds;
    },
  };
  const fake = await startStripeFake({ port: 0, secretKey: FAKE_SECRET, clock: () => clock.now, ...opts });
  const stripe = createPaymentsClient({
    mode: "fake",
    secretKey: FAKE_SECRET,
    webhookSecret: FAKE_WEBHOOK_SECRET,
    apiUrl: fake.url,
    port: fake.port,
  });
  return { fake, stripe, clock };
}

/** A connected account that finished the stand-in's onboarding (transfers and payouts enabled). */
export async function onboardedAccount(stripe: Stripe, email = "seller@example.test"): Promise<Stripe.Account> {
  const account = await stripe.accounts.create({ type: "express", country: "GB", email, capabilities: { transfers: { requested: true } } });
  const link = await stripe.accountLinks.create({
    account: account.id,
    type: "account_onboarding",
    return_url: "http://127.0.0.1:3000/account?payouts=back",
  });
  const done = await fetch(link.url, { method: "POST", body: new URLSearchParams({ business_name: "Test bench" }), redirect: "manual" });
  if (done.status !== 303) throw new Error(`onboarding answered ${done.status}`);
  return stripe.accounts.retrieve(account.id);
}

/** Pays a Checkout Session on the stand-in's hosted page with a test card number. */
export function payOnPage(url: string, number = "4242 4242 4242 4242"): Promise<Response> {
  return fetch(url, {
    method: "POST",
    body: new URLSearchParams({ email: "buyer@example.test", number, exp: "12 / 39", cvc: "123", name: "Test Buyer" }),
    redirect: "manual",
  });
}

/** A paid session's charge id. */
export async function chargeOf(stripe: Stripe, sessionId: string): Promise<Stripe.Charge> {
  const session = await stripe.checkout.sessions.retrieve(sessionId, { expand: ["payment_intent.latest_charge"] });
  const pi = session.payment_intent as Stripe.PaymentIntent;
  return pi.latest_charge as Stripe.Charge;
}
