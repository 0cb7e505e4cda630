import type { Route } from "./+types/api.v1.webhooks.stripe";
import { PaymentEvent } from "~/models/payment-event.server";
import { verifyWebhook } from "~/services/payments.server";

// POST /api/v1/webhooks/stripe: events from the payments provider. The caller is a machine, not an
// account, so it is authenticated by the signature over the raw body instead of a session.
export async function action({ request }: Route.ActionArgs) {
  if (request.method !== "POST") {
    return Response.json({ error: { reason: "only POST is accepted here" } }, { status: 405, headers: { allow: "POST" } });
  }
  const raw = Buffer.from(await request.arrayBuffer());
  let event;
  try {
    event = verifyWebhook(raw, request.headers.get("stripe-signature"));
  } catch (err) {
    return Response.json(
      { error: { reason: "signature verification failed", detail: (err as Error).message } },
      { status: 400 },
    );
  }
  const { duplicate } = await PaymentEvent.record(event);
  return Response.json({ received: true, duplicate });
}
