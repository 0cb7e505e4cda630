import Stripe from "stripe";
import { env, type Env } from "~/env.server";

// The payments provider's SDK. Without STRIPE_SECRET_KEY it talks to the local stand-in
// (fakes/stripe) over loopback; the SDK itself is never replaced.

export function createPaymentsClient(settings: Env["stripe"] = env().stripe): Stripe {
  const config: Stripe.StripeConfig = {
    maxNetworkRetries: 2,
    timeout: 20_000,
    telemetry: false,
    appInfo: { name: "Loadline" },
  };
  if (settings.apiUrl) {
    const url = new URL(settings.apiUrl);
    const protocol = url.protocol === "https:" ? "https" : "http";
    config.host = url.hostname;
    config.port = Number(url.port || (protocol === "https" ? 443 : 80));
    config.protocol = protocol;
  }
  return new Stripe(settings.secretKey, config);
}

let client: Stripe | undefined;
export function payments(): Stripe {
  client ??= createPaymentsClient();
  return client;
}

/** Points `payments()` at another client (a test's own stand-in with its own clock); undefined restores the default. */
export function setPaymentsClient(next: Stripe | undefined): void {
  client = next;
}

/** How far a webhook's signed timestamp may be from our clock, either way. */
export const WEBHOOK_TOLERANCE_SECONDS = 300;

/** A webhook whose signature does not hold; the message says why (for the 400 answer). */
export class WebhookSignatureError extends Error {
  override name = "WebhookSignatureError";
}

/**
 * The event in a webhook request, after checking its `Stripe-Signature` header against the raw body
 * (HMAC-SHA256) and its timestamp against our clock. The SDK refuses only timestamps that are too old;
 * one from the future is refused too, or a signature made ahead of time could be replayed later.
 */
export function verifyWebhook(rawBody: string | Buffer, signature: string | null, now = Date.now()): Stripe.Event {
  let event: Stripe.Event;
  try {
    event = Stripe.webhooks.constructEvent(rawBody, signature ?? "", env().stripe.webhookSecret, WEBHOOK_TOLERANCE_SECONDS, undefined, now);
  } catch (error) {
    throw new WebhookSignatureError((error as Error).message);
  }
  const signedAt = Number(/(?:^|,)\s*t=(\d+)/.exec(signature ?? "")?.[1]);
  if (!(Math.abs(now / 1000 - signedAt) <= WEBHOOK_TOLERANCE_SECONDS)) {
    throw new WebhookSignatureError("Timestamp outside the tolerance zone");
  }
  return event;
}

export async function ping(): Promise<void> {
  await payments().balance.retrieve();
}
