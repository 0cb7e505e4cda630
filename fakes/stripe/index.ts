import Stripe from "stripe";
import { createServer, type IncomingMessage, type ServerResponse } from "node:http";
import { BodyTooLarge, close, listen, readBody, redirect, sendHtml } from "../http";
import { handleApi, sweep } from "./api";
import { completeOnboarding, onboardingLink } from "./accounts";
import { findSession, paySession, type CardForm } from "./checkout";
import { makeCtx } from "./context";
import { checkoutPage, indexPage, messagePage, onboardingPage } from "./pages";
import { StripeStore } from "./store";
import { WebhookSender, signatureHeader, type WebhookTarget } from "./webhooks";

// Local stand-in for the payments API, reached by the real `stripe` SDK over loopback
// (`new Stripe(key, { host, port, protocol: "http" })`). State in memory, optionally mirrored to a file.

export { signatureHeader, type WebhookTarget };

export interface StripeFakeOptions {
  port: number;
  host?: string;
  secretKey: string;
  /** Where events are delivered, and the signing secret the app verifies them with. */
  webhook?: WebhookTarget | null;
  /** JSON file that keeps accounts, payments and events across restarts. */
  file?: string;
  log?: (line: string) => void;
  /** Seconds since the epoch; tests move it to let holds and sessions lapse. */
  clock?: () => number;
}

export interface RunningStripeFake {
  url: string;
  port: number;
  store: StripeStore;
  /** Resolves when every webhook first attempt queued so far has been made. */
  webhooksIdle(): Promise<void>;
  stop: () => Promise<void>;
}

export async function startStripeFake(opts: StripeFakeOptions): Promise<RunningStripeFake> {
  const host = opts.host ?? "127.0.0.1";
  const store = new StripeStore(Stripe.API_VERSION, opts.file, opts.clock);
  const sender = new WebhookSender(store, opts.webhook ?? null, opts.log);
  let baseUrl = "";
  const pageCtx = () => makeCtx(store, baseUrl, { id: null, idempotency_key: null });

  async function handle(req: IncomingMessage, res: ServerResponse): Promise<void> {
    const url = new URL(req.url ?? "/", "http://payments.local");
    const method = req.method ?? "GET";
    const body = method === "POST" ? (await readBody(req, 2_000_000)).toString("utf8") : "";
    if (url.pathname.startsWith("/v1/")) {
      return handleApi({ store, secretKey: opts.secretKey, baseUrl: () => baseUrl }, req, res, url, body);
    }
    const parts = url.pathname.split("/").filter(Boolean);
    const ctx = pageCtx();
    sweep(ctx);

    if (parts.length === 0 && method === "GET") {
      return sendHtml(res, 200, indexPage(store.all("event").slice(0, 50), opts.webhook?.url ?? null));
    }
    if (parts[0] === "checkout" && parts[1] === "pay" && parts.length === 3) {
      const session = store.get(parts[2]);
      if (!session || session.object !== "checkout.session") {
        return sendHtml(res, 404, messagePage("Checkout not found", "This payment link is not known to the stand-in."));
      }
      findSession(ctx, session.id);
      if (method === "GET") return sendHtml(res, 200, checkoutPage(session));
      const f = new URLSearchParams(body);
      const form: CardForm = {
        number: f.get("number") ?? "",
        exp: f.get("exp") ?? "",
        cvc: f.get("cvc") ?? "",
        name: f.get("name") ?? "",
        email: f.get("email") ?? "",
      };
      const result = paySession(ctx, session, form);
      if ("redirect" in result) return redirect(res, result.redirect);
      return sendHtml(res, 402, checkoutPage(session, form, { field: result.field, message: result.error }));
    }
    if (parts[0] === "connect" && parts[1] === "onboarding" && parts.length === 3) {
      const found = onboardingLink(ctx, parts[2]);
      if (!found?.account) return sendHtml(res, 404, messagePage("Link not found", "This onboarding link is not known to the stand-in."));
      const { link, account, stale } = found;
      if (stale) return redirect(res, link.refreshUrl ?? link.returnUrl);
      if (method === "GET") return sendHtml(res, 200, onboardingPage(parts[2], account));
      const f = new URLSearchParams(body);
      return redirect(
        res,
        completeOnboarding(ctx, parts[2], { businessName: (f.get("business_name") ?? "").trim(), iban: f.get("account_number") ?? "" }),
      );
    }
    sendHtml(res, 404, messagePage("Not found", "The payments stand-in has no page here."));
  }

  const server = createServer((req, res) => {
    handle(req, res).catch((err: Error) => {
      if (res.headersSent) return;
      const status = err instanceof BodyTooLarge ? 413 : 500;
      res.writeHead(status, { "content-type": "application/json" });
      res.end(JSON.stringify({ error: { type: "api_error", message: err.message } }));
    });
  });
  const port = await listen(server, opts.port, host);
  baseUrl = `http://${host}:${port}`;

  return {
    url: baseUrl,
    port,
    store,
    webhooksIdle: () => sender.idle(),
    async stop() {
      sender.stop();
      await close(server);
      store.flush();
    },
  };
}
