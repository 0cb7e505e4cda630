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

/**
 * The event in a webhook request, after checking its `Stripe-Signature` header against the raw
 * body (HMAC-SHA256, 300 s tolerance). Throws Stripe.errors.StripeSignatureVerificationError.
 */
export function verifyWebhook(rawBody: string | Buffer, signature: string | null): Stripe.Event {
  return Stripe.webhooks.constructEvent(rawBody, signature ?? "", env().stripe.webhookSecret);
}

export async function ping(): Promise<void> {
  await payments().balance.retrieve();
}
