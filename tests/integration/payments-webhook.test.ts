import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { createServer, type IncomingMessage, type Server, type ServerResponse } from "node:http";
import type { AddressInfo } from "node:net";
import Stripe from "stripe";
import { startStripeFake, signatureHeader, type RunningStripeFake } from "../../fakes/stripe/index";
import { routeArgs } from "../support/route-args";

// The app's webhook receiver (POST /api/v1/webhooks/stripe) fed by the payments stand-in: the signature
// is checked on the raw body, and each event id is stored once in payment_events (real PostgreSQL).
const WEBHOOK_SECRET = "whsec_loadline_local"; // the fake-mode default in app/env.server.ts

describe("payments webhook receiver", () => {
  let fake: RunningStripeFake;
  let app: Server;
  let appUrl: string;
  const answers: { status: number; body: Record<string, unknown> }[] = [];
  let route: typeof import("~/routes/api.v1.webhooks.stripe");
  let PaymentEvent: typeof import("~/models/payment-event.server").PaymentEvent;
  let sequelize: typeof import("~/db.server").sequelize;

  beforeAll(async () => {
    // Hands each HTTP request to the route's action as the framework would, as a Fetch Request.
    const relay = async (req: IncomingMessage, res: ServerResponse) => {
      const chunks: Buffer[] = [];
      for await (const c of req) chunks.push(c as Buffer);
      const request = new Request(`http://127.0.0.1${req.url}`, {
        method: req.method,
        headers: Object.entries(req.headers).flatMap(([k, v]): [string, string][] => (typeof v === "string" ? [[k, v]] : [])),
        body: Buffer.concat(chunks),
      });
      const response = await route.action(routeArgs(request, {}));
      const body = await response.json();
      answers.push({ status: response.status, body });
      res.writeHead(response.status, { "content-type": "application/json" }).end(JSON.stringify(body));
    };
    app = createServer((req, res) => void relay(req, res));
    await new Promise<void>((r) => app.listen(0, "127.0.0.1", r));
    appUrl = `http://127.0.0.1:${(app.address() as AddressInfo).port}`;
    fake = await startStripeFake({
      port: 0,
      secretKey: "sk_test_loadline_local",
      webhook: { url: `${appUrl}/api/v1/webhooks/stripe`, secret: WEBHOOK_SECRET, retryDelaysMs: [] },
    });
    vi.stubEnv("STRIPE_SECRET_KEY", undefined);
    vi.stubEnv("STRIPE_WEBHOOK_SECRET", undefined);
    vi.stubEnv("FAKE_STRIPE_PORT", String(fake.port));
    vi.resetModules();
    route = await import("~/routes/api.v1.webhooks.stripe");
    ({ PaymentEvent } = await import("~/models/payment-event.server"));
    ({ sequelize } = await import("~/db.server"));
  });
  afterAll(async () => {
    await fake?.stop();
    await new Promise((r) => app?.close(r));
    await sequelize?.close();
    vi.unstubAllEnvs();
  });

  async function lastDelivery() {
    const { payments } = await import("~/services/payments.server");
    const account = await payments().accounts.create({ type: "express", country: "DE" });
    await payments().accounts.update(account.id, { metadata: { workshop: "w-3" } });
    await fake.webhooksIdle();
    const event = fake.store.all("event").find((e) => e.data.object.id === account.id)!;
    return { account, event };
  }

  it("stores a signed event once and answers 200", async () => {
    const { account, event } = await lastDelivery();
    expect(answers.at(-1)).toEqual({ status: 200, body: { received: true, duplicate: false } });
    const row = await PaymentEvent.findByPk(event.id);
    expect(row).toMatchObject({ type: "account.updated", objectId: account.id, livemode: false });
    expect(row!.payload.data.object).toHaveProperty("metadata", { workshop: "w-3" });
  });

  it("recognises a redelivered event and does not store it twice", async () => {
    const { event } = await lastDelivery();
    const body = JSON.stringify(event);
    const res = await fetch(`${appUrl}/api/v1/webhooks/stripe`, {
      method: "POST",
      headers: { "content-type": "application/json", "stripe-signature": signatureHeader(body, WEBHOOK_SECRET) },
      body,
    });
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ received: true, duplicate: true });
    expect(await PaymentEvent.count({ where: { eventId: event.id } })).toBe(1);
  });

  it("refuses a tampered body, a wrong secret and a missing signature with 400", async () => {
    const forged = {
      id: "evt_forged_1",
      object: "event",
      type: "payment_intent.succeeded",
      created: 1,
      livemode: false,
      data: { object: { id: "pi_x" } },
    };
    const body = JSON.stringify(forged);
    const goodHeader = signatureHeader(body, WEBHOOK_SECRET);
    const post = (payload: string, header?: string) =>
      fetch(`${appUrl}/api/v1/webhooks/stripe`, { method: "POST", headers: header ? { "stripe-signature": header } : {}, body: payload });
    expect((await post(body.replace("pi_x", "pi_y"), goodHeader)).status).toBe(400);
    expect((await post(body, signatureHeader(body, "whsec_someone_else"))).status).toBe(400);
    expect((await post(body)).status).toBe(400);
    // Older than the SDK's 300 s default tolerance (the provider's webhook signature docs): a replayed capture is refused.
    expect((await post(body, signatureHeader(body, WEBHOOK_SECRET, Math.floor(Date.now() / 1000) - 600))).status).toBe(400);
    expect(await PaymentEvent.findByPk("evt_forged_1")).toBeNull();
    // The same payload correctly signed is accepted, so the refusals above were about the signature.
    expect((await post(body, goodHeader)).status).toBe(200);
    await PaymentEvent.destroy({ where: { eventId: "evt_forged_1" } });
    expect(Stripe.webhooks.constructEvent(body, goodHeader, WEBHOOK_SECRET).id).toBe("evt_forged_1");
  });

  it("refuses a correctly signed event stamped an hour ahead, as it refuses one an hour old", async () => {
    const event = {
      id: "evt_future_1",
      object: "event",
      type: "payment_intent.succeeded",
      created: 1,
      livemode: false,
      data: { object: { id: "pi_f" } },
    };
    const body = JSON.stringify(event);
    const now = Math.floor(Date.now() / 1000);
    const post = (t: number) =>
      fetch(`${appUrl}/api/v1/webhooks/stripe`, {
        method: "POST",
        headers: { "stripe-signature": signatureHeader(body, WEBHOOK_SECRET, t) },
        body,
      });
    for (const t of [now + 3600, now - 3600]) {
      const res = await post(t);
      expect(res.status).toBe(400);
      expect(await res.json()).toEqual({
        error: "invalid_signature",
        message: "The signature does not verify: Timestamp outside the tolerance zone.",
      });
    }
    expect(await PaymentEvent.findByPk("evt_future_1")).toBeNull();
    // A clock a minute ahead is within the tolerance.
    expect((await post(now + 60)).status).toBe(200);
    await PaymentEvent.destroy({ where: { eventId: "evt_future_1" } });
  });
});
