import { P } from "./params";
import { paginate, publicView, type StripeObject } from "./store";
import { route, type Ctx, type Route } from "./context";
import { balanceObject, balanceTransactions, viewBalanceTransaction } from "./balance";
import { noSuch } from "./errors";

// /v1/balance, /v1/balance_transactions, /v1/payouts and /v1/application_fees. With a
// `Stripe-Account` header they answer for that connected account, as Stripe's do.

function owned(ctx: Ctx, object: string): StripeObject[] {
  return ctx.store.all(object).filter((o) => (o._owner ?? null) === ctx.account);
}

function page(ctx: Ctx, p: P, items: StripeObject[], url: string) {
  return paginate(items, url, {
    limit: p.int("limit", { min: 1, max: 100 }),
    starting_after: p.str("starting_after"),
    ending_before: p.str("ending_before"),
  });
}

export const balanceRoutes: Route[] = [
  route("GET", "/v1/balance", (ctx) => balanceObject(ctx, ctx.account)),
  route("GET", "/v1/balance_transactions", (ctx, params) => {
    const p = new P(params, ["limit", "starting_after", "ending_before", "created", "type", "source", "currency", "payout"]);
    let items = balanceTransactions(ctx, ctx.account);
    for (const f of ["type", "source", "currency"] as const) {
      const v = p.str(f);
      if (v) items = items.filter((t) => t[f] === v);
    }
    const list = page(ctx, p, items, "/v1/balance_transactions");
    list.data = list.data.map((t) => viewBalanceTransaction(ctx, t));
    return list;
  }),
  route("GET", "/v1/balance_transactions/:id", (ctx, _params, [id]) => {
    const txn = ctx.store.find(id, "balance_transaction", "balance transaction");
    if ((txn._owner ?? null) !== ctx.account) throw noSuch("balance transaction", id);
    return viewBalanceTransaction(ctx, txn);
  }),
  route("GET", "/v1/payouts", (ctx, params) => {
    const p = new P(params, ["limit", "starting_after", "ending_before", "created", "status", "arrival_date", "destination"]);
    const status = p.str("status");
    return page(
      ctx,
      p,
      owned(ctx, "payout").filter((o) => !status || o.status === status),
      "/v1/payouts",
    );
  }),
  route("GET", "/v1/payouts/:id", (ctx, _params, [id]) => {
    const payout = ctx.store.find(id, "payout", "payout");
    if ((payout._owner ?? null) !== ctx.account) throw noSuch("payout", id);
    return publicView(payout);
  }),
  route("GET", "/v1/application_fees", (ctx, params) => {
    const p = new P(params, ["limit", "starting_after", "ending_before", "created", "charge"]);
    const charge = p.str("charge");
    return page(
      ctx,
      p,
      ctx.store.all("application_fee").filter((f) => !charge || f.charge === charge),
      "/v1/application_fees",
    );
  }),
  route("GET", "/v1/application_fees/:id", (ctx, _params, [id]) => publicView(ctx.store.find(id, "application_fee", "application fee"))),
];
