import { createHmac } from "node:crypto";
import type { StripeObject, StripeStore } from "./store";

// Sends each event to the app's webhook endpoint, signed as Stripe signs them:
// `Stripe-Signature: t=<unix>,v1=<hex HMAC-SHA256(secret, "<t>.<raw body>")>` (the provider's docs: "Check the webhook signatures").
// A delivery that does not get a 2xx answer is retried later, with a fresh timestamp and signature.

export function signatureHeader(payload: string, secret: string, timestamp = Math.floor(Date.now() / 1000)): string {
  const v1 = createHmac("sha256", secret).update(`${timestamp}.${payload}`, "utf8").digest("hex");
  return `t=${timestamp},v1=${v1}`;
}

export interface WebhookTarget {
  url: string;
  secret: string;
  /** Waits before each retry; the default spreads eight attempts over about three hours. */
  retryDelaysMs?: number[];
  timeoutMs?: number;
}

export interface DeliveryAttempt {
  at: string;
  status: number | null;
  error: string | null;
}

const DEFAULT_RETRIES = [5_000, 30_000, 120_000, 600_000, 1_800_000, 3_600_000, 7_200_000];

// Each event's delivery state lives on the stored event (saved in the state file with everything
// else): `pending_webhooks`, `_failures` and `_next_attempt_at` (ms). A stand-in stopped or killed
// with deliveries outstanding resumes them on its next start, due ones at once and in creation order.
export class WebhookSender {
  private timers = new Set<NodeJS.Timeout>();
  private chain: Promise<void> = Promise.resolve();
  private stopped = false;

  constructor(
    private readonly store: StripeStore,
    private readonly target: WebhookTarget | null,
    private readonly log: (line: string) => void = () => {},
  ) {
    store.onEvent((event) => this.enqueue(event));
    this.resume();
  }

  private enqueue(event: StripeObject): void {
    if (!this.target) return;
    event.pending_webhooks = 1;
    event._deliveries = [] satisfies DeliveryAttempt[];
    event._failures = 0;
    event._next_attempt_at = Date.now();
    this.store.changed();
    this.queueFirst(event.id);
  }

  // First attempts go out one at a time in creation order, after the API answer that caused them.
  private queueFirst(id: string): void {
    this.chain = this.chain.then(() => new Promise((resolve) => setImmediate(resolve))).then(() => this.attempt(id));
  }

  private resume(): void {
    if (!this.target) return;
    const waiting = this.store
      .all("event")
      .filter((e) => e.pending_webhooks > 0 && typeof e._next_attempt_at === "number")
      .reverse();
    if (waiting.length) this.log(`payments stand-in: resuming ${waiting.length} webhook deliveries`);
    for (const event of waiting) {
      const wait = event._next_attempt_at - Date.now();
      if (wait <= 0) this.queueFirst(event.id);
      else this.later(event.id, wait);
    }
  }

  private later(id: string, wait: number): void {
    const timer = setTimeout(() => {
      this.timers.delete(timer);
      void this.attempt(id);
    }, wait);
    timer.unref();
    this.timers.add(timer);
  }

  private async attempt(id: string): Promise<void> {
    const stored = this.store.get(id);
    if (this.stopped || !this.target || !stored || !(stored.pending_webhooks > 0)) return;
    const { url, secret, timeoutMs = 10_000 } = this.target;
    const delays = this.target.retryDelaysMs ?? DEFAULT_RETRIES;
    const payload = JSON.stringify({ ...publicEvent(stored), pending_webhooks: 1 }, null, 2);
    let status: number | null = null;
    let error: string | null = null;
    try {
      const res = await fetch(url, {
        method: "POST",
        headers: {
          "content-type": "application/json; charset=utf-8",
          "stripe-signature": signatureHeader(payload, secret),
          "user-agent": "Stripe/1.0 (+https://stripe.com/docs/webhooks)",
        },
        body: payload,
        signal: AbortSignal.timeout(timeoutMs),
      });
      status = res.status;
      await res.arrayBuffer().catch(() => undefined);
    } catch (err) {
      error = (err as Error).message;
    }
    if (this.stopped) return; // the next start tries again
    const ok = status !== null && status >= 200 && status < 300;
    (stored._deliveries ??= []).push({ at: new Date().toISOString(), status, error } satisfies DeliveryAttempt);
    if (ok) {
      stored.pending_webhooks = 0;
      stored._next_attempt_at = null;
      this.store.changed();
      return;
    }
    stored._failures = (stored._failures ?? 0) + 1;
    const wait = delays[stored._failures - 1];
    stored._next_attempt_at = wait === undefined ? null : Date.now() + wait;
    this.store.changed();
    this.log(
      `payments stand-in: ${stored.type} ${stored.id} not delivered (${status ?? error})${wait === undefined ? ", giving up" : `, retrying in ${Math.round(wait / 1000)} s`}`,
    );
    if (wait !== undefined) this.later(id, wait);
  }

  /** Resolves once every first attempt queued so far has finished (retries excluded). */
  idle(): Promise<void> {
    return this.chain;
  }

  stop(): void {
    this.stopped = true;
    for (const t of this.timers) clearTimeout(t);
    this.timers.clear();
  }
}

function publicEvent(event: StripeObject): Record<string, unknown> {
  return Object.fromEntries(Object.entries(event).filter(([k]) => !k.startsWith("_")));
}
