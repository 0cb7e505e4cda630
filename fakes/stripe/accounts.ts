import { invalid } from "./errors";
import { P } from "./params";
import { paginate, publicView, randomToken, type StripeObject } from "./store";
import { route, snapshot, type Ctx, type Route } from "./context";

// Connected accounts (the workshops and sellers who get paid) and their onboarding links. The
// onboarding page is the stand-in's own; finishing it enables charges and payouts.

const CURRENCY_BY_COUNTRY: Record<string, string> = {
  US: "usd",
  GB: "gbp",
  CH: "chf",
  SE: "sek",
  DK: "dkk",
  NO: "nok",
  PL: "pln",
  CA: "cad",
  AU: "aud",
};
const EURO = ["AT", "BE", "CY", "DE", "EE", "ES", "FI", "FR", "GR", "HR", "IE", "IT", "LT", "LU", "LV", "MT", "NL", "PT", "SI", "SK"];
const DUE = ["business_profile.url", "external_account", "tos_acceptance.date", "tos_acceptance.ip"];
const PLATFORM_ID = "acct_loadlineplatform0";

function defaultCurrency(country: string): string {
  return CURRENCY_BY_COUNTRY[country] ?? (EURO.includes(country) ? "eur" : "usd");
}

function createAccount(ctx: Ctx, raw: Parameters<Route["handler"]>[1]): StripeObject {
  const p = new P(raw, [
    "type",
    "country",
    "email",
    "business_type",
    "capabilities",
    "metadata",
    "business_profile",
    "default_currency",
    "controller",
  ]);
  const type = p.oneOf("type", ["express", "standard", "custom"] as const) ?? (p.has("controller") ? "none" : "standard");
  const country = (p.str("country") ?? "US").toUpperCase();
  if (!/^[A-Z]{2}$/.test(country)) throw invalid(`Invalid country: ${country}`, "country");
  const capsParam = p.obj("capabilities", ["card_payments", "transfers"]);
  const requested = ["card_payments", "transfers"].filter((c) => capsParam?.obj(c, ["requested"])?.bool("requested"));
  if (type === "custom" && requested.length === 0) {
    throw invalid("You must request at least one capability for custom accounts.", "capabilities");
  }
  const profile = p.obj("business_profile", ["name", "url", "mcc", "product_description", "support_email"]);
  const now = ctx.store.now();
  const account = ctx.store.insert({
    id: ctx.store.newId("acct", 16),
    object: "account",
    type,
    country,
    email: p.str("email") ?? null,
    business_type: p.oneOf("business_type", ["individual", "company", "non_profit", "government_entity"] as const) ?? null,
    business_profile: { name: profile?.str("name") ?? null, url: profile?.str("url") ?? null, mcc: profile?.str("mcc") ?? null },
    capabilities: Object.fromEntries((requested.length ? requested : ["card_payments", "transfers"]).map((c) => [c, "inactive"])),
    charges_enabled: false,
    payouts_enabled: false,
    details_submitted: false,
    default_currency: p.currency("default_currency") ?? defaultCurrency(country),
    metadata: p.metadata(),
    requirements: {
      currently_due: DUE,
      eventually_due: DUE,
      past_due: [],
      pending_verification: [],
      errors: [],
      disabled_reason: "requirements.past_due",
      current_deadline: null,
    },
    tos_acceptance: { date: null },
    settings: { payouts: { schedule: { interval: "daily", delay_days: 2 } } },
    external_accounts: { object: "list", data: [], has_more: false, url: "" },
    created: now,
    livemode: false,
  });
  account.external_accounts.url = `/v1/accounts/${account.id}/external_accounts`;
  return publicView(account);
}

function updateAccount(ctx: Ctx, raw: Parameters<Route["handler"]>[1], id: string): StripeObject {
  const account = ctx.store.find(id, "account", "account");
  const p = new P(raw, ["email", "metadata", "business_profile"]);
  const before = snapshot(account, ["email", "metadata", "business_profile"]);
  if (p.has("email")) account.email = p.str("email") ?? null;
  account.metadata = p.metadata(account.metadata);
  const profile = p.obj("business_profile", ["name", "url", "mcc", "product_description", "support_email"]);
  if (profile) for (const k of ["name", "url", "mcc"]) if (profile.has(k)) account.business_profile[k] = profile.str(k) ?? null;
  ctx.store.changed();
  ctx.emit("account.updated", account, before);
  return publicView(account);
}

function createAccountLink(ctx: Ctx, raw: Parameters<Route["handler"]>[1]): Record<string, unknown> {
  const p = new P(raw, ["account", "refresh_url", "return_url", "type", "collect", "collection_options"]);
  const accountId = p.str("account", { required: true })!;
  ctx.store.find(accountId, "account", "account", "account");
  p.oneOf("type", ["account_onboarding", "account_update"] as const, { required: true });
  const returnUrl = p.url("return_url", { required: true })!;
  const refreshUrl = p.url("refresh_url") ?? null;
  const now = ctx.store.now();
  const token = randomToken(32);
  // Links are single-use and short-lived, as Stripe's are; a stale one sends the person to refresh_url.
  ctx.store.links[token] = { account: accountId, refreshUrl, returnUrl, expiresAt: now + 300, used: false };
  ctx.store.changed();
  return { object: "account_link", created: now, expires_at: now + 300, url: `${ctx.baseUrl}/connect/onboarding/${token}` };
}

/** Finishes onboarding from the hosted page; returns where to send the browser. */
export function completeOnboarding(ctx: Ctx, token: string, form: { businessName: string; iban: string }): string {
  const link = ctx.store.links[token];
  if (!link) throw invalid("Unknown onboarding link");
  if (link.used || link.expiresAt < ctx.store.now()) return link.refreshUrl ?? link.returnUrl;
  link.used = true;
  const account = ctx.store.find(link.account, "account", "account");
  const before = snapshot(account, ["charges_enabled", "payouts_enabled", "details_submitted", "capabilities", "requirements"]);
  account.charges_enabled = true;
  account.payouts_enabled = true;
  account.details_submitted = true;
  for (const cap of Object.keys(account.capabilities)) account.capabilities[cap] = "active";
  account.requirements = { ...account.requirements, currently_due: [], eventually_due: [], past_due: [], disabled_reason: null };
  account.tos_acceptance = { date: ctx.store.now() };
  if (form.businessName) account.business_profile.name = form.businessName;
  const last4 = form.iban.replace(/\s/g, "").slice(-4) || "3000";
  account.external_accounts.data = [
    {
      id: ctx.store.newId("ba", 24),
      object: "bank_account",
      account: account.id,
      last4,
      currency: account.default_currency,
      country: account.country,
      status: "new",
      default_for_currency: true,
    },
  ];
  ctx.store.changed();
  ctx.emit("account.updated", account, before);
  return link.returnUrl;
}

export function onboardingLink(ctx: Ctx, token: string) {
  const link = ctx.store.links[token];
  if (!link) return null;
  return { link, account: ctx.store.get(link.account), stale: link.used || link.expiresAt < ctx.store.now() };
}

function platformAccount(ctx: Ctx): StripeObject {
  return {
    id: PLATFORM_ID,
    object: "account",
    type: "standard",
    country: "US",
    business_profile: { name: "Loadline (local stand-in)" },
    charges_enabled: true,
    payouts_enabled: true,
    details_submitted: true,
    default_currency: "usd",
    created: ctx.store.now(),
    livemode: false,
  };
}

export const accountRoutes: Route[] = [
  route("POST", "/v1/accounts", (ctx, params) => createAccount(ctx, params)),
  route("GET", "/v1/accounts", (ctx, params) => {
    const p = new P(params, ["limit", "starting_after", "ending_before", "created"]);
    return paginate(ctx.store.all("account"), "/v1/accounts", {
      limit: p.int("limit", { min: 1, max: 100 }),
      starting_after: p.str("starting_after"),
      ending_before: p.str("ending_before"),
    });
  }),
  route("GET", "/v1/account", (ctx) => platformAccount(ctx)),
  route("GET", "/v1/accounts/:id", (ctx, _params, [id]) => publicView(ctx.store.find(id, "account", "account"))),
  route("POST", "/v1/accounts/:id", (ctx, params, [id]) => updateAccount(ctx, params, id)),
  route("DELETE", "/v1/accounts/:id", (ctx, _params, [id]) => {
    const account = ctx.store.find(id, "account", "account");
    account.deleted = true;
    ctx.store.changed();
    return { id, object: "account", deleted: true };
  }),
  route("POST", "/v1/account_links", (ctx, params) => createAccountLink(ctx, params)),
];
