import { afterAll, beforeAll, describe, expect, it } from "vitest";
import fc from "fast-check";
import { QueryTypes } from "sequelize";
import { RUN, testEmail, TEST_EMAIL_PATTERN } from "./auth-support";
import { convertMinor } from "@shared/currency";
import type { Role } from "~/auth/roles";

// The admin's rates against the real database: a change is saved with its audit line in one
// transaction, the triggers re-price that currency's listings, the market's price order and price
// bounds follow, and the pages' cached rates are dropped at once.

const { sequelize } = await import("~/db.server");
const { createAccount } = await import("~/auth/accounts.server");
const { currentRates, saveRates, rateTable, recentRateChanges } = await import("~/currencies/rates.server");

let before: Record<string, string>;
const ids: Record<"gbp" | "eur" | "jpy", string> = { gbp: "", eur: "", jpy: "" };

const rows = <T extends object>(text: string, replacements: Record<string, unknown> = {}) =>
  sequelize.query<T>(text, { type: QueryTypes.SELECT, replacements });

async function adminNamed(label: string, roles: Role[] = ["admin"]) {
  const u = await createAccount({ email: testEmail(label), displayName: `Rates ${label}`, roles, emailVerified: true });
  return { id: u.id, email: u.email, displayName: u.displayName, roles: u.roles, emailVerified: true };
}

async function setRate(currency: string, perEur: string) {
  await sequelize.query(`UPDATE currency_rates SET per_eur = :perEur WHERE currency = :currency`, { replacements: { perEur, currency } });
}

async function euroPrices(): Promise<Record<string, number>> {
  const found = await rows<{ id: string; price_eur_minor: string }>(`SELECT id, price_eur_minor FROM listings WHERE id IN (:ids)`, {
    ids: Object.values(ids),
  });
  const by = new Map(found.map((r) => [r.id, Number(r.price_eur_minor)]));
  return { gbp: by.get(ids.gbp)!, eur: by.get(ids.eur)!, jpy: by.get(ids.jpy)! };
}

/** Our three listings, cheapest first in euros, as the market's price sort orders them. */
async function byPrice(): Promise<string[]> {
  const found = await rows<{ id: string }>(`SELECT id FROM listings WHERE id IN (:ids) ORDER BY price_eur_minor, id`, {
    ids: Object.values(ids),
  });
  const name = new Map(Object.entries(ids).map(([k, v]) => [v, k]));
  return found.map((r) => name.get(r.id)!);
}

/** Ours at or under a bound typed in `currency`, compared in euros as the market compares them. */
async function atMost(major: number, currency: string): Promise<string[]> {
  const found = await rows<{ id: string }>(
    `SELECT id FROM listings WHERE id IN (:ids)
        AND price_eur_minor <= loadline_eur_minor(:bound * power(10, (SELECT minor_digits FROM currency_rates WHERE currency = :currency))::bigint, :currency)
      ORDER BY price_eur_minor, id`,
    { ids: Object.values(ids), bound: major, currency },
  );
  const name = new Map(Object.entries(ids).map(([k, v]) => [v, k]));
  return found.map((r) => name.get(r.id)!);
}

beforeAll(async () => {
  const table = await rows<{ currency: string; per_eur: string }>(`SELECT currency, per_eur::text AS per_eur FROM currency_rates`);
  before = Object.fromEntries(table.map((r) => [r.currency, r.per_eur]));
  // Known starting rates for the hand-worked figures below.
  await setRate("GBP", "0.86");
  await setRate("JPY", "160");
  const seller = await adminNamed("seller", ["seller"]);
  for (const [key, price, currency] of [
    ["gbp", 100_000, "GBP"], // £1,000
    ["eur", 110_000, "EUR"], // €1,100
    ["jpy", 200_000, "JPY"], // ¥200,000
  ] as const) {
    const [row] = await rows<{ id: string }>(
      `INSERT INTO listings (seller_id, status, category, maker, model, price_minor, currency, country, cosmetic_grade, service_state, published_at)
       VALUES (:seller, 'live', 'integrated_amplifier', 'Carrowain', :model, :price, :currency, 'GB', 'clean', 'serviced_measured', now())
       RETURNING id`,
      { seller: seller.id, model: `RT-${RUN}-${key}`, price, currency },
    );
    ids[key] = row.id;
  }
});

afterAll(async () => {
  for (const [currency, perEur] of Object.entries(before ?? {})) await setRate(currency, perEur);
  await sequelize.query(`DELETE FROM listings WHERE id IN (:ids)`, { replacements: { ids: Object.values(ids).filter(Boolean) } });
  await sequelize.query(`DELETE FROM users WHERE email LIKE :p`, { replacements: { p: TEST_EMAIL_PATTERN } });
  await sequelize.close();
});

describe("a rate change", () => {
  it("re-prices that currency's listings; price order and price bounds follow", async () => {
    // £1,000 / 0.86 = €1,162.79; ¥200,000 / 160 = €1,250.
    expect(await euroPrices()).toEqual({ gbp: 116_279, eur: 110_000, jpy: 125_000 });
    expect(await byPrice()).toEqual(["eur", "gbp", "jpy"]);
    expect(await atMost(1_200, "EUR")).toEqual(["eur", "gbp"]);
    // A bound in pounds: £1,000 is €1,162.79, so the £1,000 unit is in and the €1,100 one too.
    expect(await atMost(1_000, "GBP")).toEqual(["eur", "gbp"]);

    const admin = await adminNamed("admin-a");
    // 0.86 → 0.78 is −9 %: no confirmation needed.
    const saved = await saveRates(admin, [{ currency: "GBP", perEur: "0.78" }], { confirmed: false });
    expect(saved).toMatchObject({ ok: true, saved: [{ currency: "GBP", perEur: "0.78" }] });

    // £1,000 / 0.78 = €1,282.05: now dearer than the yen unit; the others untouched.
    expect(await euroPrices()).toEqual({ gbp: 128_205, eur: 110_000, jpy: 125_000 });
    expect(await byPrice()).toEqual(["eur", "jpy", "gbp"]);
    expect(await atMost(1_200, "EUR")).toEqual(["eur"]);
    // £1,000 is now €1,282.05: the yen unit (€1,250) comes within it.
    expect(await atMost(1_000, "GBP")).toEqual(["eur", "jpy", "gbp"]);
  });

  it("is logged with who made it, and the table says who changed each rate last", async () => {
    const admin = await adminNamed("admin-b");
    await setRate("CHF", "0.95");
    expect(await saveRates(admin, [{ currency: "CHF", perEur: "0.96" }], { confirmed: false })).toMatchObject({ ok: true });
    const [line] = await recentRateChanges(1);
    expect(line).toMatchObject({ currency: "CHF", oldPerEur: "0.95", newPerEur: "0.96", changedBy: admin.displayName });
    expect((await rateTable()).find((r) => r.currency === "CHF")).toMatchObject({ perEur: "0.96", updatedBy: admin.displayName });
  });

  it("saves nothing when a change of more than a fifth is not confirmed", async () => {
    const admin = await adminNamed("admin-c");
    await setRate("GBP", "0.86");
    const logged = (await recentRateChanges(1000)).length;
    const result = await saveRates(
      admin,
      [
        { currency: "GBP", perEur: "1.2" },
        { currency: "SEK", perEur: "11.5" },
      ],
      { confirmed: false },
    );
    expect(result).toEqual({ ok: false, confirm: [{ currency: "GBP", perEur: "1.2", from: "0.86" }] });
    expect((await rateTable()).find((r) => r.currency === "GBP")!.perEur).toBe("0.86");
    expect((await recentRateChanges(1000)).length).toBe(logged);
    expect((await euroPrices()).gbp).toBe(116_279);

    expect(await saveRates(admin, [{ currency: "GBP", perEur: "1.2" }], { confirmed: true })).toMatchObject({ ok: true });
    // £1,000 / 1.2 = €833.33.
    expect((await euroPrices()).gbp).toBe(83_333);
  });

  it("saves all or nothing: one refused rate undoes the others", async () => {
    const admin = await adminNamed("admin-d");
    await setRate("GBP", "0.86");
    await setRate("USD", "1.08");
    const logged = (await recentRateChanges(1000)).length;
    // "0" passes no form; the database's own check refuses it after GBP was already written.
    await expect(
      saveRates(
        admin,
        [
          { currency: "GBP", perEur: "0.87" },
          { currency: "USD", perEur: "0" },
        ],
        { confirmed: true },
      ),
    ).rejects.toThrow();
    expect((await rateTable()).find((r) => r.currency === "GBP")!.perEur).toBe("0.86");
    expect((await recentRateChanges(1000)).length).toBe(logged);
    expect((await euroPrices()).gbp).toBe(116_279);
  });

  it("reaches the pages at once: the cached rates are dropped", async () => {
    const admin = await adminNamed("admin-e");
    await setRate("NOK", "11.6");
    await saveRates(admin, [{ currency: "NOK", perEur: "11.7" }], { confirmed: false });
    expect((await currentRates()).NOK?.perEur).toBe("11.7");
    await saveRates(admin, [{ currency: "NOK", perEur: "11.8" }], { confirmed: false });
    expect((await currentRates()).NOK?.perEur).toBe("11.8");
  });
});

describe("the change log", () => {
  it("is append-only", async () => {
    const admin = await adminNamed("admin-f");
    await setRate("DKK", "7.46");
    await saveRates(admin, [{ currency: "DKK", perEur: "7.5" }], { confirmed: false });
    const [line] = await recentRateChanges(1);
    await expect(
      sequelize.query(`UPDATE currency_rate_changes SET new_per_eur = 9 WHERE id = :id`, { replacements: { id: line.id } }),
    ).rejects.toThrow(/append-only/);
    await expect(sequelize.query(`DELETE FROM currency_rate_changes WHERE id = :id`, { replacements: { id: line.id } })).rejects.toThrow(
      /append-only/,
    );
    // Removing the admin's account keeps the line, with the name it was made under.
    await sequelize.query(`DELETE FROM users WHERE id = :id`, { replacements: { id: admin.id } });
    expect((await recentRateChanges(1000)).find((l) => l.id === line.id)).toMatchObject({ changedBy: admin.displayName });
  });
});

describe("the one conversion", () => {
  it("agrees with the database's euro prices, cent for cent", async () => {
    const rates = await currentRates(Date.now() + 60 * 60_000);
    const codes = Object.keys(rates);
    await fc.assert(
      fc.asyncProperty(fc.integer({ min: 0, max: 100_000_000 }), fc.constantFrom(...codes), async (amount, currency) => {
        const [{ eur }] = await rows<{ eur: string }>(`SELECT loadline_eur_minor(:amount, :currency) AS eur`, { amount, currency });
        return convertMinor(amount, currency, "EUR", rates) === Number(eur);
      }),
      { numRuns: 60 },
    );
  });
});
