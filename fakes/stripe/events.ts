import type { Params } from "./form";
import { P } from "./params";
import { paginate, publicView, type StripeObject } from "./store";
import { route, type Route } from "./context";

// /v1/events: what happened, newest first, with Stripe's filters (type with a trailing `*`,
// types[], created ranges).

function matchesType(type: string, pattern: string): boolean {
  return pattern.endsWith("*") ? type.startsWith(pattern.slice(0, -1)) : type === pattern;
}

function createdFilter(p: P): (o: StripeObject) => boolean {
  if (!p.has("created")) return () => true;
  const exact = (() => {
    try {
      return p.int("created");
    } catch {
      return undefined;
    }
  })();
  if (exact !== undefined) return (o) => o.created === exact;
  const range = p.obj("created", ["gt", "gte", "lt", "lte"])!;
  const gt = range.int("gt");
  const gte = range.int("gte");
  const lt = range.int("lt");
  const lte = range.int("lte");
  return (o) =>
    (gt === undefined || o.created > gt) &&
    (gte === undefined || o.created >= gte) &&
    (lt === undefined || o.created < lt) &&
    (lte === undefined || o.created <= lte);
}

function listEvents(store: Parameters<Route["handler"]>[0]["store"], params: Params) {
  const p = new P(params, ["limit", "starting_after", "ending_before", "type", "types", "created", "delivery_success"]);
  const type = p.str("type");
  const types = p.strings("types");
  const inRange = createdFilter(p);
  const items = store
    .all("event")
    .filter((e) => (!type || matchesType(e.type, type)) && (types.length === 0 || types.includes(e.type)) && inRange(e));
  return paginate(items, "/v1/events", {
    limit: p.int("limit", { min: 1, max: 100 }),
    starting_after: p.str("starting_after"),
    ending_before: p.str("ending_before"),
  });
}

export const eventRoutes: Route[] = [
  route("GET", "/v1/events", (ctx, params) => listEvents(ctx.store, params)),
  route("GET", "/v1/events/:id", (ctx, _params, [id]) => publicView(ctx.store.find(id, "event", "event"))),
];
