import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { QueryTypes } from "sequelize";
import { testEmail, TEST_EMAIL_PATTERN } from "./auth-support";
import { parseMarketFilters, type MarketFilters } from "@shared/market-filters";

// The market's price filter and price sort across currencies, through the search itself, before and
// after the admin changes a rate: three units priced in pounds, euros and yen, expectations worked by hand.

const { sequelize } = await import("~/db.server");
const { createAccount } = await import("~/auth/accounts.server");
const { saveRates } = await import("~/currencies/rates.server");
const { listingsMatching, searchListings } = await import("~/catalogue/search.server");

const TOKEN = `Qx${Date.now().toString(36)}`;
const ids: Record<"gbp" | "eur" | "jpy", string> = { gbp: "", eur: "", jpy: "" };
let before: Record<string, string> = {};

const rows = <T extends object>(text: string, replacements: Record<string, unknown> = {}) =>
  sequelize.query<T>(text, { type: QueryTypes.SELECT, replacements });
const setRate = (currency: string, perEur: string) =>
  sequelize.query(`UPDATE currency_rates SET per_eur = :perEur WHERE currency = :currency`, { replacements: { perEur, currency } });
const filters = (qs: string): MarketFilters => {
  const { filters: f, issues } = parseMarketFilters(new URLSearchParams(qs), { strict: true });
  expect(issues).toEqual([]);
  return f;
};
const names = (found: string[]) => found.map((id) => Object.entries(ids).find(([, v]) => v === id)?.[0] ?? id);

/** Ours among those the price filter keeps, cheapest first in euros. */
async function kept(qs: string): Promise<string[]> {
  const matched = new Set(await listingsMatching(filters(qs), Object.values(ids)));
  return (await sorted("price_asc")).filter((k) => matched.has(ids[k as keyof typeof ids]));
}
/** Ours on the market's page for a price filter, cheapest first (the page converts the bounds to euros once). */
async function paged(qs: string): Promise<string[]> {
  const page = await searchListings(filters(`q=${TOKEN}&sort=price_asc&${qs}`), { limit: 10 });
  return names(page.items.map((i) => i.id));
}
/** Ours in the market's price order (found by a word only they carry). */
async function sorted(sort: string): Promise<string[]> {
  const page = await searchListings(filters(`q=${TOKEN}&sort=${sort}`), { limit: 10 });
  return names(page.items.map((i) => i.id));
}

beforeAll(async () => {
  const table = await rows<{ currency: string; per_eur: string }>(`SELECT currency, per_eur::text AS per_eur FROM currency_rates`);
  before = Object.fromEntries(table.map((r) => [r.currency, r.per_eur]));
  await setRate("GBP", "0.86");
  await setRate("JPY", "160");
  const seller = await createAccount({ email: testEmail("fx-seller"), displayName: "Fx seller", roles: ["seller"], emailVerified: true });
  for (const [key, price, currency] of [
    ["gbp", 100_000, "GBP"], // £1,000
    ["eur", 110_000, "EUR"], // €1,100
    ["jpy", 200_000, "JPY"], // ¥200,000
  ] as const) {
    const [row] = await rows<{ id: string }>(
      `INSERT INTO listings (seller_id, status, category, maker, model, price_minor, currency, country, cosmetic_grade, service_state, published_at)
       VALUES (:seller, 'live', 'integrated_amplifier', 'Carrowain', :model, :price, :currency, 'GB', 'clean', 'serviced_measured', now())
       RETURNING id`,
      { seller: seller.id, model: `${TOKEN} ${key}`, price, currency },
    );
    ids[key] = row.id;
  }
});

afterAll(async () => {
  for (const [currency, perEur] of Object.entries(before)) await setRate(currency, perEur);
  await sequelize.query(`DELETE FROM listings WHERE id IN (:ids)`, { replacements: { ids: Object.values(ids).filter(Boolean) } });
  await sequelize.query(`DELETE FROM users WHERE email LIKE :p`, { replacements: { p: TEST_EMAIL_PATTERN } });
  await sequelize.close();
});

describe("price filter and sort across currencies", () => {
  it("follow the admin's rate", async () => {
    // At 0.86 GBP and 160 JPY per euro: £1,000 = €1,162.79, ¥200,000 = €1,250.
    expect(await sorted("price_asc")).toEqual(["eur", "gbp", "jpy"]);
    expect(await sorted("price_desc")).toEqual(["jpy", "gbp", "eur"]);
    expect(await kept("priceMax=1200")).toEqual(["eur", "gbp"]);
    // In pounds: £950 = €1,104.65 keeps only the euro unit; £1,000 keeps the pound unit too (its own price, exactly).
    expect(await kept("priceMax=950&currency=GBP")).toEqual(["eur"]);
    expect(await kept("priceMax=1000&currency=GBP")).toEqual(["eur", "gbp"]);
    expect(await paged("priceMax=1000&currency=GBP")).toEqual(["eur", "gbp"]);
    expect(await paged("priceMax=1000&currency=GBP")).toEqual(["eur", "gbp"]); // the same bounds again, kept
    // In yen: ¥190,000 = €1,187.50.
    expect(await kept("priceMin=190000&currency=JPY")).toEqual(["jpy"]);

    const admin = await createAccount({ email: testEmail("fx-admin"), displayName: "Fx admin", roles: ["admin"], emailVerified: true });
    const saved = await saveRates(
      { id: admin.id, email: admin.email, displayName: admin.displayName, roles: admin.roles, emailVerified: true },
      [{ currency: "GBP", perEur: "0.78" }],
      { confirmed: false },
    );
    expect(saved).toMatchObject({ ok: true });

    // At 0.78: £1,000 = €1,282.05, now the dearest.
    expect(await sorted("price_asc")).toEqual(["eur", "jpy", "gbp"]);
    expect(await kept("priceMax=1200")).toEqual(["eur"]);
    // £950 = €1,217.95: still only the euro unit; £1,000 = €1,282.05 takes all three.
    expect(await kept("priceMax=950&currency=GBP")).toEqual(["eur"]);
    expect(await kept("priceMax=1000&currency=GBP")).toEqual(["eur", "jpy", "gbp"]);
    // The page's bounds kept from before the change are not used at the new rate.
    expect(await paged("priceMax=1000&currency=GBP")).toEqual(["eur", "jpy", "gbp"]);
    // ¥190,000 = €1,187.50: the pound unit (€1,282.05) is above it now.
    expect(await kept("priceMin=190000&currency=JPY")).toEqual(["jpy", "gbp"]);
  });
});
