import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { QueryTypes } from "sequelize";
import { testEmail, TEST_EMAIL_PATTERN } from "./auth-support";
import type { Role } from "~/auth/roles";
import { isData, routeArgs } from "../support/route-args";
import { signedInCookie } from "../support/sessions";

// The admin's rate page and the buyer's display-currency form, called as the server calls them:
// who may open and post the rate page, what it refuses and asks again, and the cookie the footer's
// form sets.

const { sequelize } = await import("~/db.server");
const { createAccount } = await import("~/auth/accounts.server");
const rates = await import("~/routes/admin/rates");
const currency = await import("~/routes/currency");
const { displayCurrency, marketCurrency, pricingFor } = await import("~/currencies/display.server");

const BASE = "http://127.0.0.1";
const cookies: Partial<Record<"admin" | "moderator" | "buyer", string>> = {};
let gbpBefore = "";

type Outcome = { status: number; body?: unknown; location?: string | null; headers?: Headers };
async function run(fn: () => Promise<unknown>): Promise<Outcome> {
  let value: unknown;
  try {
    value = await fn();
  } catch (thrown) {
    value = thrown;
  }
  if (value instanceof Response) return { status: value.status, location: value.headers.get("Location"), headers: value.headers };
  if (isData(value)) return { status: value.init?.status ?? 200, body: value.data, headers: new Headers(value.init?.headers) };
  return { status: 200, body: value };
}

function post(path: string, fields: [string, string][], cookie?: string, extra: Record<string, string> = {}) {
  const headers: Record<string, string> = { "Content-Type": "application/x-www-form-urlencoded", Origin: BASE, ...extra };
  if (cookie) headers.Cookie = cookie;
  return new Request(`${BASE}${path}`, { method: "POST", body: new URLSearchParams(fields), headers });
}
const gbp = async () =>
  (
    await sequelize.query<{ per_eur: string }>(`SELECT per_eur::text AS per_eur FROM currency_rates WHERE currency = 'GBP'`, {
      type: QueryTypes.SELECT,
    })
  )[0].per_eur;
const setGbp = (perEur: string) =>
  sequelize.query(`UPDATE currency_rates SET per_eur = :perEur WHERE currency = 'GBP'`, { replacements: { perEur } });

beforeAll(async () => {
  gbpBefore = await gbp();
  await setGbp("0.86");
  const accounts: [keyof typeof cookies, Role[]][] = [
    ["admin", ["admin"]],
    ["moderator", ["moderator"]],
    ["buyer", []],
  ];
  for (const [who, roles] of accounts) {
    const u = await createAccount({ email: testEmail(`rates-${who}`), displayName: `Rates page ${who}`, roles, emailVerified: true });
    cookies[who] = await signedInCookie(u);
  }
});

afterAll(async () => {
  if (gbpBefore) await setGbp(gbpBefore);
  await sequelize.query(`DELETE FROM users WHERE email LIKE :p`, { replacements: { p: TEST_EMAIL_PATTERN } });
  await sequelize.close();
});

describe("/admin/rates", () => {
  const open = (cookie?: string) =>
    run(() => rates.loader(routeArgs(new Request(`${BASE}/admin/rates`, { headers: cookie ? { Cookie: cookie } : {} }), {})));
  const save = (fields: [string, string][], cookie = cookies.admin) =>
    run(() => rates.action(routeArgs(post("/admin/rates", fields, cookie), {})));

  it("opens for admins only: visitors sign in, moderators and buyers are refused", async () => {
    expect(await open()).toMatchObject({ status: 302, location: "/sign-in?redirectTo=%2Fadmin%2Frates" });
    expect((await open(cookies.moderator)).status).toBe(403);
    expect((await open(cookies.buyer)).status).toBe(403);
    const page = await open(cookies.admin);
    expect(page.status).toBe(200);
    expect((page.body as { rates: { currency: string; perEur: string }[] }).rates).toContainEqual(
      expect.objectContaining({ currency: "GBP", perEur: "0.86" }),
    );
  });

  it("refuses a moderator's change without saving it", async () => {
    expect((await save([["rate.GBP", "0.87"]], cookies.moderator)).status).toBe(403);
    expect(await gbp()).toBe("0.86");
  });

  it("puts a bad rate's message next to its field and keeps what was typed", async () => {
    const result = await save([
      ["rate.GBP", "0,87"],
      ["rate.USD", "1.08"],
    ]);
    expect(result.status).toBe(400);
    expect(result.body).toEqual({
      kind: "invalid",
      errors: { GBP: "Type the rate as a plain number with a point, e.g. 0.86." },
      values: { "rate.GBP": "0,87", "rate.USD": "1.08" },
    });
    expect(await gbp()).toBe("0.86");
  });

  it("asks again before a change of more than a fifth, and saves it when confirmed", async () => {
    const asked = await save([["rate.GBP", "1.2"]]);
    expect(asked.status).toBe(409);
    expect(asked.body).toMatchObject({ kind: "confirm", confirm: [{ currency: "GBP", from: "0.86", perEur: "1.2" }] });
    expect(await gbp()).toBe("0.86");

    const saved = await save([
      ["rate.GBP", "1.2"],
      ["confirm", "yes"],
    ]);
    expect(saved).toMatchObject({ status: 200, body: { kind: "saved", saved: [{ currency: "GBP", perEur: "1.2" }] } });
    expect(await gbp()).toBe("1.2");
  });

  it("refuses a post from another site", async () => {
    const request = post("/admin/rates", [["rate.GBP", "0.9"]], cookies.admin, { Origin: "https://elsewhere.example" });
    expect((await run(() => rates.action(routeArgs(request, {})))).status).toBe(403);
  });
});

describe("the display currency", () => {
  const request = (headers: Record<string, string>) => new Request(`${BASE}/market`, { headers });

  it("is guessed from the browser's language until the buyer chooses", async () => {
    expect(await displayCurrency(request({ "Accept-Language": "en-GB,en;q=0.9" }))).toBe("GBP");
    expect(await displayCurrency(request({ "Accept-Language": "sv" }))).toBe("SEK");
    expect(await displayCurrency(request({ "Accept-Language": "de-AT,de;q=0.9" }))).toBe("EUR");
    expect(await displayCurrency(request({}))).toBe("EUR");
  });

  it("is kept in a cookie by the footer's form, which goes back where the buyer was", async () => {
    const chosen = await run(() =>
      currency.action(
        routeArgs(
          post("/currency", [
            ["currency", "JPY"],
            ["returnTo", "/market?category=turntables"],
          ]),
          {},
        ),
      ),
    );
    expect(chosen).toMatchObject({ status: 302, location: "/market?category=turntables" });
    const cookie = chosen.headers!.get("Set-Cookie")!.split(";")[0];
    expect(await displayCurrency(request({ Cookie: cookie, "Accept-Language": "en-GB" }))).toBe("JPY");
    const pricing = await pricingFor(request({ Cookie: cookie }));
    expect(pricing.display).toBe("JPY");
    expect(pricing.rates.JPY).toMatchObject({ minorDigits: 0 });
  });

  it("follows a signed-in buyer to another browser; this browser's own choice comes first", async () => {
    const chosen = await run(() => currency.action(routeArgs(post("/currency", [["currency", "CHF"]], cookies.buyer), {})));
    expect(chosen).toMatchObject({ status: 302, location: "/" });
    // Another browser: the session only, no currency cookie.
    expect(await displayCurrency(request({ Cookie: cookies.buyer!, "Accept-Language": "en-GB" }))).toBe("CHF");
    const here = chosen.headers!.get("Set-Cookie")!.split(";")[0];
    const other = await run(() => currency.action(routeArgs(post("/currency", [["currency", "SEK"]]), {})));
    const sek = other.headers!.get("Set-Cookie")!.split(";")[0];
    expect(await displayCurrency(request({ Cookie: `${cookies.buyer!}; ${sek}` }))).toBe("SEK");
    expect(await displayCurrency(request({ Cookie: here }))).toBe("CHF");
    // Someone else's account is untouched.
    expect(await displayCurrency(request({ Cookie: cookies.moderator!, "Accept-Language": "en-GB" }))).toBe("GBP");
  });

  it("is what the market's price bounds are typed in, unless the link names one or carries bounds in euros", async () => {
    const market = (qs: string) => marketCurrency(new Request(`${BASE}/market${qs}`, { headers: { "Accept-Language": "en-GB" } }));
    expect(await market("")).toBe("GBP");
    expect(await market("?category=turntables")).toBe("GBP");
    expect(await market("?currency=jpy&priceMax=200000")).toBe("JPY");
    expect(await market("?priceMax=1200")).toBe("EUR");
    expect(await market("?currency=XAU")).toBe("GBP");
  });

  it("refuses an unknown currency and never sends the buyer off the site", async () => {
    expect((await run(() => currency.action(routeArgs(post("/currency", [["currency", "XAU"]]), {})))).status).toBe(400);
    const away = await run(() =>
      currency.action(
        routeArgs(
          post("/currency", [
            ["currency", "EUR"],
            ["returnTo", "//elsewhere.example/"],
          ]),
          {},
        ),
      ),
    );
    expect(away).toMatchObject({ status: 302, location: "/" });
  });
});
