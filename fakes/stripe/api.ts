import type { IncomingMessage, ServerResponse } from "node:http";
import { timingSafeEqual } from "node:crypto";
import { StripeFakeError } from "./errors";
import { fingerprint, parseStripeParams, type Params } from "./form";
import { publicView, randomToken, type StripeObject, type StripeStore } from "./store";
import { makeCtx, type Ctx, type Route } from "./context";
import { accountRoutes } from "./accounts";
import { checkoutRoutes, expireSession, lineItems } from "./checkout";
import { eventRoutes } from "./events";
import { moneyMovementRoutes } from "./money-movements";
import { paymentIntentRoutes } from "./payment-intents";
import { balanceRoutes } from "./balance-routes";
import { runPayouts } from "./balance";
import { expireHold } from "./payments";

// The REST side: API key check, Stripe's request encoding, idempotent replays, `expand[]`, and
// errors in Stripe's JSON shape.

const ROUTES: Route[] = [
  ...accountRoutes,
  ...checkoutRoutes,
  ...paymentIntentRoutes,
  ...moneyMovementRoutes,
  ...balanceRoutes,
  ...eventRoutes,
];

export interface ApiConfig {
  store: StripeStore;
  secretKey: string;
  baseUrl: () => string;
}

export async function handleApi(cfg: ApiConfig, req: IncomingMessage, res: ServerResponse, url: URL, body: string): Promise<void> {
  const requestId = `req_${randomToken(14)}`;
  const method = (req.method ?? "GET").toUpperCase();
  const idempotencyKey = header(req, "idempotency-key");
  const headers: Record<string, string> = {
    "request-id": requestId,
    "stripe-version": header(req, "stripe-version") ?? cfg.store.apiVersion,
    ...(idempotencyKey ? { "idempotency-key": idempotencyKey } : {}),
  };
  const send = (status: number, payload: unknown, extra: Record<string, string> = {}) => {
    res.writeHead(status, { "content-type": "application/json", "cache-control": "no-store", ...headers, ...extra });
    res.end(JSON.stringify(payload, null, 2));
  };

  const authError = checkKey(req, cfg.secretKey);
  if (authError) return send(401, { error: { type: "invalid_request_error", message: authError } });

  let params: Params;
  try {
    params = parseStripeParams(method === "POST" ? body : url.search.slice(1));
  } catch {
    return send(400, { error: { type: "invalid_request_error", message: "Invalid request body." } });
  }

  // Idempotency: the first executed result for a key is replayed; other parameters under the same key are refused.
  const scope = `${header(req, "stripe-account") ?? ""}|${idempotencyKey}`;
  const print = `${method} ${url.pathname} ${fingerprint(params)}`;
  if (method === "POST" && idempotencyKey) {
    if (idempotencyKey.length > 255) {
      return send(400, { error: { type: "invalid_request_error", message: "Idempotency-Key must be at most 255 characters long." } });
    }
    const saved = cfg.store.idempotency[scope];
    if (saved) {
      if (saved.fingerprint !== print) {
        return send(400, {
          error: {
            type: "idempotency_error",
            message: `Keys for idempotent requests can only be used with the same parameters they were first used with. Try using a key other than '${idempotencyKey}' if you meant to execute a different request.`,
          },
        });
      }
      return send(saved.status, saved.body, { "idempotent-replayed": "true", "original-request": saved.requestId });
    }
  }

  const match = findRoute(method, url.pathname);
  if (!match) {
    return send(404, {
      error: {
        type: "invalid_request_error",
        message: `Unrecognized request URL (${method}: ${url.pathname}). The local payments stand-in does not speak this endpoint.`,
      },
    });
  }

  const onBehalf = header(req, "stripe-account") ?? null;
  if (onBehalf && cfg.store.get(onBehalf)?.object !== "account") {
    return send(403, {
      error: {
        type: "invalid_request_error",
        code: "account_invalid",
        message: `The provided key does not have access to account '${onBehalf}' (or that account does not exist).`,
      },
    });
  }
  const ctx = makeCtx(cfg.store, cfg.baseUrl(), { id: requestId, idempotency_key: idempotencyKey ?? null }, onBehalf);
  sweep(ctx);
  let status = 200;
  let payload: unknown;
  try {
    const result = match.route.handler(ctx, params, match.args);
    payload = expand(ctx, result, expandPaths(params));
  } catch (err) {
    const e =
      err instanceof StripeFakeError
        ? err
        : new StripeFakeError(500, "api_error", `Internal error in the stand-in: ${(err as Error).message}`);
    status = e.status;
    payload = e.toJSON();
  }
  // Stripe saves results once execution began (including 402 declines and 500s), not parameter errors.
  if (method === "POST" && idempotencyKey && (status < 400 || status === 402 || status >= 500)) {
    cfg.store.idempotency[scope] = { fingerprint: print, status, body: payload, requestId, savedAt: Date.now() };
    cfg.store.changed();
  }
  send(status, payload);
}

/** Lapsed holds and sessions and due payouts change state on their own, as they would at Stripe;
 *  these are not caused by the request at hand, so their events name no request. */
export function sweep(ctx: Ctx): void {
  const auto = makeCtx(ctx.store, ctx.baseUrl, { id: null, idempotency_key: null });
  for (const pi of auto.store.all("payment_intent")) if (pi.status === "requires_capture") expireHold(auto, pi);
  for (const s of auto.store.all("checkout.session")) if (s.status === "open") expireSession(auto, s);
  runPayouts(auto);
}

function findRoute(method: string, path: string): { route: Route; args: string[] } | null {
  for (const route of ROUTES) {
    if (route.method !== method) continue;
    const m = route.path.exec(path);
    if (m) return { route, args: m.slice(1).map(decodeURIComponent) };
  }
  return null;
}

function checkKey(req: IncomingMessage, secretKey: string): string | null {
  const auth = header(req, "authorization") ?? "";
  let key: string | null = null;
  const bearer = /^Bearer\s+(.+)$/i.exec(auth);
  const basic = /^Basic\s+(.+)$/i.exec(auth);
  if (bearer) key = bearer[1].trim();
  else if (basic) key = Buffer.from(basic[1], "base64").toString("utf8").split(":")[0];
  if (!key) {
    return "You did not provide an API key. You need to provide your API key in the Authorization header, using Bearer auth (e.g. 'Authorization: Bearer YOUR_SECRET_KEY').";
  }
  const a = Buffer.from(key);
  const b = Buffer.from(secretKey);
  if (a.length === b.length && timingSafeEqual(a, b)) return null;
  const shown = key.length > 12 ? `${key.slice(0, 8)}${"*".repeat(key.length - 12)}${key.slice(-4)}` : `${key.slice(0, 3)}***`;
  return `Invalid API Key provided: ${shown}`;
}

function header(req: IncomingMessage, name: string): string | undefined {
  const v = req.headers[name];
  return Array.isArray(v) ? v[0] : v;
}

function expandPaths(params: Params): string[] {
  const e = params.expand;
  if (e === undefined) return [];
  return (Array.isArray(e) ? e : [e]).filter((x): x is string => typeof x === "string");
}

function expand(ctx: Ctx, result: unknown, paths: string[]): unknown {
  for (const path of paths) apply(ctx, result, path.split("."));
  return result;
}

function apply(ctx: Ctx, node: unknown, segments: string[]): void {
  if (!node || typeof node !== "object" || segments.length === 0) return;
  const obj = node as Record<string, unknown>;
  const [head, ...rest] = segments;
  if (head === "data" && obj.object === "list" && Array.isArray(obj.data)) {
    for (const item of obj.data) apply(ctx, item, rest);
    return;
  }
  let value = obj[head];
  if (obj.object === "checkout.session" && head === "line_items") {
    const session = ctx.store.get(String(obj.id));
    if (session) value = lineItems(session);
  } else if (typeof value === "string") {
    const found: StripeObject | undefined = ctx.store.get(value);
    if (found) value = publicView(found);
  }
  obj[head] = value;
  apply(ctx, value, rest);
}
