import type { Params } from "./form";
import type { RequestInfo, StripeObject, StripeStore } from "./store";

// What every resource handler gets: the state, where the stand-in is reachable (for hosted page
// URLs), and the request the resulting events will name.

export interface Ctx {
  store: StripeStore;
  baseUrl: string;
  request: RequestInfo;
  /** The connected account named by a `Stripe-Account` header, or null for the platform. */
  account: string | null;
  emit(type: string, obj: StripeObject, previous?: Record<string, unknown>): void;
  /** An event on a connected account's behalf (Connect events carry `account`); null = the platform. */
  emitFor(account: string | null, type: string, obj: StripeObject, previous?: Record<string, unknown>): void;
}

export type Handler = (ctx: Ctx, params: Params, args: string[]) => unknown;

export interface Route {
  method: "GET" | "POST" | "DELETE";
  path: RegExp;
  handler: Handler;
}

export function route(method: Route["method"], pattern: string, handler: Handler): Route {
  const source = pattern.replace(/:[a-z_]+/g, "([^/]+)");
  return { method, path: new RegExp(`^${source}$`), handler };
}

export function makeCtx(store: StripeStore, baseUrl: string, request: RequestInfo, account: string | null = null): Ctx {
  return {
    store,
    baseUrl,
    request,
    account,
    emit: (type, obj, previous) => void store.emit(type, obj, request, previous),
    emitFor: (on, type, obj, previous) => void store.emit(type, obj, request, previous, on),
  };
}

/** Previous values of the given keys, for an event's `previous_attributes`. */
export function snapshot(obj: StripeObject, keys: string[]): Record<string, unknown> {
  return Object.fromEntries(keys.map((k) => [k, structuredClone(obj[k])]));
}
