import { afterAll, beforeAll, describe, expect, it } from "vitest";
import pg from "pg";
import { Listing } from "~/models/index.server";
import { parseBenchSheet } from "@shared/bench/schema";
import { checkBenchSheet } from "@shared/bench/verdict";
import { ShippingOptionsSchema } from "@shared/catalogue-schemas";
import { isCurrency } from "@shared/listing-input";
import { listingFacets } from "@shared/listing-facets";
import { createDatabase, dropDatabase } from "../../db/cluster";
import { migrateUp } from "../../db/migrator";
import { MODEL_SCHEMES } from "../../db/seeds/demo-cast";
import { seedScale } from "../../db/seeds/scale/write";

// `npm run seed:scale` on a small scale, in a database of its own (the suite's shared database keeps
// the demo scenario the other tests count on): every row is one the app could have written.

const LISTINGS = 500;
type Row = Record<string, unknown> & { id: string; category: string; maker: string; model: string; status: string; sheet: unknown };

describe("scale seed", () => {
  const name = `loadline_scale_check_${process.pid}`;
  let url: string;
  let db: pg.Client;
  let rows: Row[];

  const readRows = async () =>
    (
      await db.query<Row>(
        `SELECT l.*, s.sheet FROM listings l LEFT JOIN bench_sheets s ON s.listing_id = l.id
         JOIN users u ON u.id = l.seller_id WHERE u.email LIKE '%@scale.loadline.test' ORDER BY l.id`,
      )
    ).rows;

  beforeAll(async () => {
    url = await createDatabase(process.env.DATABASE_URL!, name, { fresh: true });
    await migrateUp(url);
    const result = await seedScale({ databaseUrl: url, listings: LISTINGS });
    expect(result.listings).toBe(LISTINGS);
    db = new pg.Client({ connectionString: url });
    await db.connect();
    rows = await readRows();
  }, 120_000);
  afterAll(async () => {
    await db?.end();
    await dropDatabase(process.env.DATABASE_URL!, name);
  });

  it("writes the listings asked for, across every category and status", () => {
    expect(rows).toHaveLength(LISTINGS);
    expect(new Set(rows.map((r) => r.category)).size).toBe(8);
    expect(new Set(rows.map((r) => r.status))).toEqual(new Set(["live", "sold", "draft", "withdrawn", "held"]));
    expect(new Set(rows.map((r) => r.currency)).size).toBeGreaterThan(3);
    for (const r of rows) expect(isCurrency(String(r.currency)), String(r.currency)).toBe(true);
    expect(rows.some((r) => /[à-ÿ]/i.test(String(r.condition_note)))).toBe(true);
  });

  it("names every unit in its maker's own scheme", () => {
    for (const r of rows) {
      const scheme = MODEL_SCHEMES[r.maker];
      expect(scheme, `${r.maker} has a numbering scheme`).toBeDefined();
      expect(r.model, `${r.maker} ${r.model}`).toMatch(scheme.pattern);
      expect(r.model).not.toMatch(/^[A-Z][A-Za-z]{0,2}-\d/);
    }
  });

  it("stores bench sheets that parse for their listing's category and name the unit", () => {
    const withSheet = rows.filter((r) => r.sheet);
    expect(withSheet.length).toBeGreaterThan(LISTINGS / 3);
    for (const r of withSheet) {
      const parsed = parseBenchSheet(r.sheet);
      expect(parsed.ok ? [] : parsed.issues, r.id).toEqual([]);
      if (!parsed.ok) continue;
      expect(parsed.sheet.category).toBe(r.category);
      expect(parsed.sheet.equipment).toMatchObject({ maker: r.maker, model: r.model.replace(/ \(pair\)$/, "") });
    }
  });

  it("fills every facet column with what listingFacets reads from the sheet", () => {
    const fields = Listing.getAttributes();
    for (const r of rows) {
      const parsed = r.sheet ? parseBenchSheet(r.sheet) : null;
      const facets = listingFacets(parsed?.ok ? parsed.sheet : null);
      const stored = Object.fromEntries(Object.keys(facets).map((key) => [key, r[fields[key as keyof typeof fields].field!]]));
      expect(stored, r.id).toEqual(facets);
    }
    // Figures of every kind are there to filter by.
    for (const key of Object.keys(listingFacets(null)))
      expect(
        rows.some((r) => r[fields[key as keyof typeof fields].field!] !== null),
        key,
      ).toBe(true);
  });

  it("marks bench-verified only what the bench verifies, and holds what it finds implausible", () => {
    let verified = 0;
    for (const r of rows) {
      const parsed = r.sheet ? parseBenchSheet(r.sheet) : null;
      const verdict = parsed?.ok ? checkBenchSheet(parsed.sheet) : null;
      if (r.bench_verified) {
        verified++;
        expect(verdict?.benchVerified, r.id).toBe(true);
        expect(["live", "sold", "withdrawn"]).toContain(r.status);
      }
      if (r.status === "held") {
        expect(r.held_reason, r.id).toEqual(expect.any(String));
        expect(verdict?.counts.implausible, r.id).toBeGreaterThan(0);
      }
      if (r.status === "draft") expect(r.published_at).toBeNull();
      else expect(r.published_at).toBeInstanceOf(Date);
      expect(ShippingOptionsSchema.safeParse(r.shipping_options).success, r.id).toBe(true);
    }
    expect(verified).toBeGreaterThan(LISTINGS / 5);
  });

  it("gives the same rows again, replacing only what it made", async () => {
    const other = await db.query<{ id: string }>(
      `INSERT INTO users (email, display_name) VALUES ('someone@loadline.test', 'Someone Else') RETURNING id`,
    );
    await db.query(`INSERT INTO listings (seller_id, category, status) VALUES ($1, 'turntable', 'draft')`, [other.rows[0].id]);
    const again = await seedScale({ databaseUrl: url, listings: LISTINGS });
    expect(again.removed).toBe(LISTINGS);
    const second = await readRows();
    expect(second.map((r) => [r.id, r.model, r.price_minor, r.currency, r.published_at])).toEqual(
      rows.map((r) => [r.id, r.model, r.price_minor, r.currency, r.published_at]),
    );
    const kept = await db.query(`SELECT count(*)::int AS n FROM listings WHERE seller_id = $1`, [other.rows[0].id]);
    expect(kept.rows[0].n).toBe(1);
  });
});
