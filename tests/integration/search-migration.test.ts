import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { QueryTypes, Sequelize } from "sequelize";
import { createDatabase, dropDatabase } from "../../db/cluster";
import { createMigrator } from "../../db/migrator";
import { exampleIntegratedAmplifierSheet } from "@shared/bench/examples";
import type { BenchSheet } from "@shared/bench/schema";

// The search migration on a database that already holds listings: facets recomputed from the sheets
// (measured only: a loudspeaker's rated impedance no longer counts), euro prices filled, and the
// triggers keeping them in step with prices and the admin's rates.

const SEARCH = "20261211-0100-search";
const name = `loadline_search_migration_${process.pid}`;
let db: Sequelize;

const one = async <T extends object>(text: string, replacements: Record<string, unknown> = {}) =>
  (await db.query<T>(text, { type: QueryTypes.SELECT, replacements }))[0];

function speakerSheet(): BenchSheet {
  const r = (quantity: string, value: number, unit: string, basis: "rated" | "measured") => ({
    quantity,
    value,
    unit,
    basis,
    origin: "typed",
    conditions: {},
  });
  return {
    category: "loudspeaker",
    equipment: { maker: "Hexlund", model: "12L" },
    measuredOn: "2026-11-20",
    measuredBy: "Ottilie Varn",
    channelCount: 1,
    readings: [r("nominal_impedance", 8, "Ω", "rated"), r("impedance_minimum", 5.2, "Ω", "measured")],
    sweeps: [],
  } as unknown as BenchSheet; // a literal in the stored JSON shape; the migration parses it through the schema
}

beforeAll(async () => {
  const url = await createDatabase(process.env.DATABASE_URL!, name, { fresh: true });
  db = new Sequelize(url, { logging: false, dialect: "postgres" });
  const migrator = createMigrator(db);
  const all = (await migrator.pending()).map((m) => m.name);
  await migrator.up({ to: all[all.indexOf(SEARCH) - 1] });
  const user = await one<{ id: string }>(
    `INSERT INTO users (email, display_name, roles) VALUES ('m@loadline.test', 'Moss', '{buyer,seller}') RETURNING id`,
  );
  for (const [model, category, price, currency, sheet] of [
    ["WQ 46i", "integrated_amplifier", 68500, "GBP", exampleIntegratedAmplifierSheet()],
    ["12L", "loudspeaker", 40000, "EUR", speakerSheet()],
  ] as const) {
    const listing = await one<{ id: string }>(
      `INSERT INTO listings (seller_id, status, category, maker, model, price_minor, currency, country, cosmetic_grade, service_state,
         published_at, thd_pct, impedance_ohm)
       VALUES (:seller, 'live', :category, 'Carrowain', :model, :price, :currency, 'GB', 'clean', 'serviced_measured', now(), 9, 8)
       RETURNING id`,
      { seller: user.id, category, model, price, currency },
    );
    await db.query(`INSERT INTO bench_sheets (listing_id, sheet) VALUES (:id, :sheet)`, {
      replacements: { id: listing.id, sheet: JSON.stringify(sheet) },
    });
  }
  await migrator.up();
});

afterAll(async () => {
  await db?.close();
  await dropDatabase(process.env.DATABASE_URL!, name);
});

describe("search migration", () => {
  it("recomputes every facet of existing listings from their sheets, measured figures only", async () => {
    const amp = await one<Record<string, number | null>>(`SELECT * FROM listings WHERE model = 'WQ 46i'`);
    expect(amp.power_8ohm_w).toBe(65);
    expect(amp.thd_pct).toBeCloseTo(0.014, 9); // was 9: recomputed, THD alone now
    expect(amp.thdn_pct).toBeCloseTo(0.021, 9);
    expect(amp.f3_low_hz).toBe(7);
    expect(amp.f3_high_hz).toBe(95_000);
    expect(amp.damping_factor).toBe(150);
    const speaker = await one<Record<string, number | null>>(`SELECT * FROM listings WHERE model = '12L'`);
    expect(speaker.impedance_min_ohm).toBe(5.2); // not the rated 8 Ω
  });

  it("prices existing listings in euro cents at the starting rates", async () => {
    const rows = await db.query<{ model: string; price_eur_minor: string }>(`SELECT model, price_eur_minor FROM listings ORDER BY model`, {
      type: QueryTypes.SELECT,
    });
    expect(rows.map((r) => [r.model, Number(r.price_eur_minor)])).toEqual([
      ["12L", 40000],
      ["WQ 46i", Math.round(68500 / 0.86)],
    ]);
  });

  it("keeps the euro price in step with the listing's price and currency, and with the rates", async () => {
    await db.query(`UPDATE listings SET price_minor = 86000 WHERE model = 'WQ 46i'`);
    expect(Number((await one<{ p: string }>(`SELECT price_eur_minor AS p FROM listings WHERE model = 'WQ 46i'`)).p)).toBe(100000);
    await db.query(`UPDATE currency_rates SET per_eur = 0.8 WHERE currency = 'GBP'`);
    expect(Number((await one<{ p: string }>(`SELECT price_eur_minor AS p FROM listings WHERE model = 'WQ 46i'`)).p)).toBe(107500);
    await db.query(`UPDATE listings SET currency = 'JPY', price_minor = 16000 WHERE model = '12L'`);
    expect(Number((await one<{ p: string }>(`SELECT price_eur_minor AS p FROM listings WHERE model = '12L'`)).p)).toBe(10000);
  });

  it("finds listings by maker, model prefix and the category's words, unaccented", async () => {
    const hits = async (q: string) =>
      (
        await db.query<{ model: string }>(`SELECT model FROM listings WHERE search_doc @@ loadline_search_query(:q) ORDER BY model`, {
          type: QueryTypes.SELECT,
          replacements: { q },
        })
      ).map((r) => r.model);
    expect(await hits("carrowain")).toEqual(["12L", "WQ 46i"]);
    expect(await hits("WQ 4")).toEqual(["WQ 46i"]);
    expect(await hits("Cärrowäin loudspeakers")).toEqual(["12L"]);
  });
});
