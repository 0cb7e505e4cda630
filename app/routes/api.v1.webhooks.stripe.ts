import type { Route } from "./+types/api.v1.webhooks.stripe";
import { apiRoute, json } from "~/http/api-route.server";
import { KiB, readBytes, tooLarge } from "~/http/limited-stream.server";
import { refusal } from "~/http/errors.server";
import { verifyWebhook, WebhookSignatureError } from "~/services/payments.server";
import { recordPaymentEvent } from "~/payments/events.server";

// POST /api/v1/webhooks/stripe: events from the payments provider. The caller is a machine, not an
// account, so it is authenticated by the signature over the raw body instead of a session (and any
// origin may call it). A payment event is a few kilobytes: the body may be 64 KB at most. The event is
// stored once and its processing queued in the same transaction ('payment-event'), so the answer is
// quick and a crash after the answer loses nothing.
const WEBHOOK_MAX_BYTES = 64 * KiB;

const route = apiRoute<Route.ActionArgs>(
  {
    POST: async ({ request }) => {
      const raw = await readBytes(request, WEBHOOK_MAX_BYTES, tooLarge(WEBHOOK_MAX_BYTES, "A webhook event"));
      let event;
      try {
        event = verifyWebhook(raw, request.headers.get("stripe-signature"));
      } catch (error) {
        if (!(error instanceof WebhookSignatureError)) throw error;
        throw refusal("invalid_signature", `The signature does not verify: ${error.message}.`);
      }
      const { duplicate } = await recordPaymentEvent(event);
      return json({ received: true, duplicate });
    },
  },
  { anyOrigin: true },
);
export const loader = route.loader;
export const action = route.action;
