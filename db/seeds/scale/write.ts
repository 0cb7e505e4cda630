import pg from "pg";
import { benchSheetSchema } from "@shared/bench/schema";
import { checkBenchSheet } from "@shared/bench/verdict";
import { ShippingOptionsSchema } from "@shared/catalogue-schemas";
import { listingFacets, publishState } from "@shared/listing-facets";
import { SCALE_EMAIL_DOMAIN, scaleSellers, type ScaleSeller } from "./people";
import { scaleUnit, SellerPicker, type UnitContext } from "./units";

// Writes the scale seed. Everything it makes hangs off accounts at the scale domain; a run first
// removes what an earlier run made (and nothing else), then writes sellers, workshops, listings and
// sheets in one transaction, a few thousand rows per statement (one JSON parameter each, unpacked by
// json_populate_recordset, so the column list is the only SQL that grows with the schema).

export interface ScaleSeedOptions {
  databaseUrl: string;
  listings: number;
  seed?: number;
  /** Publish dates run back from here. */
  until?: Date;
  batch?: number;
  log?: (line: string) => void;
}

export interface ScaleSeedResult {
  listings: number;
  sheets: number;
  verified: number;
  byStatus: Record<string, number>;
  removed: number;
  seconds: number;
}

/** The default end of the publish dates: fixed, so a seed gives the same rows whenever it runs. */
export const SCALE_UNTIL = new Date("2026-12-01T00:00:00Z");

type Row = Record<string, unknown>;

/** Inserts rows whose keys are column names; the database reads them from one JSON array. */
async function insertRows(db: pg.ClientBase, table: string, rows: Row[]): Promise<void> {
  if (!rows.length) return;
  const cols = Object.keys(rows[0])
    .map((c) => `"${c}"`)
    .join(", ");
  await db.query(`INSERT INTO ${table} (${cols}) SELECT ${cols} FROM json_populate_recordset(NULL::${table}, $1::json)`, [
    JSON.stringify(rows),
  ]);
}

/**
 * Where each facet of `listingFacets` lives on `listings`: the column whose name, without underscores,
 * is the facet's key in lower case (power8ohmW → power_8ohm_w), as the model's fields are named.
 */
export async function facetColumnMap(db: pg.ClientBase): Promise<Map<string, string>> {
  const { rows } = await db.query<{ column_name: string }>(
    `SELECT column_name FROM information_schema.columns WHERE table_schema = current_schema() AND table_name = 'listings'`,
  );
  const byKey = new Map(rows.map((r) => [r.column_name.replace(/_/g, ""), r.column_name]));
  const map = new Map<string, string>();
  for (const key of Object.keys(listingFacets(null))) {
    const column = byKey.get(key.toLowerCase());
    if (!column) throw new Error(`listingFacets gives "${key}" but listings has no column for it (migrated?)`);
    map.set(key, column);
  }
  return map;
}

async function removePrevious(db: pg.ClientBase): Promise<number> {
  const scale = `SELECT id FROM users WHERE email LIKE '%@${SCALE_EMAIL_DOMAIN}'`;
  const { rowCount } = await db.query(`DELETE FROM listings WHERE seller_id IN (${scale})`);
  await db.query(`DELETE FROM workshops WHERE owner_id IN (${scale})`);
  await db.query(`DELETE FROM users WHERE email LIKE '%@${SCALE_EMAIL_DOMAIN}'`);
  return rowCount ?? 0;
}

function sellerRows(sellers: ScaleSeller[], at: Date): { users: Row[]; workshops: Row[] } {
  const users = sellers.map((s) => ({
    id: s.id,
    email: s.email,
    display_name: s.displayName,
    roles: `{${s.roles.join(",")}}`,
    email_verified_at: at,
    status: "active",
    created_at: at,
    updated_at: at,
  }));
  const workshops = sellers
    .filter((s) => s.workshop)
    .map((s) => ({
      id: s.workshop!.id,
      owner_id: s.id,
      name: s.workshop!.name,
      slug: s.workshop!.slug,
      about: s.workshop!.about,
      country: s.place.country,
      region: s.place.region,
      town: s.place.town,
      verification_status: s.workshop!.verified ? "verified" : "applied",
      verified_at: s.workshop!.verified ? at : null,
      created_at: at,
      updated_at: at,
    }));
  return { users, workshops };
}

interface Batch {
  listings: Row[];
  sheets: Row[];
  verified: number;
  byStatus: Record<string, number>;
}

function buildBatch(ctx: UnitContext, from: number, to: number, facetColumns: Map<string, string>): Batch {
  const batch: Batch = { listings: [], sheets: [], verified: 0, byStatus: {} };
  for (let i = from; i < to; i++) {
    const u = scaleUnit(ctx, i);
    // The same reading the app gives a seller's sheet: validated, checked, facets copied.
    const sheet = u.sheet ? benchSheetSchema.parse(u.sheet) : null;
    const verdict = sheet ? checkBenchSheet(sheet) : null;
    const state = publishState(verdict);
    const status = u.status !== "draft" && state.status === "held" ? "held" : u.status;
    const published = status !== "draft";
    const verified = published && status !== "held" && state.benchVerified;
    const facets = listingFacets(sheet);
    const row: Row = {
      id: u.id,
      seller_id: u.seller.id,
      workshop_id: u.seller.workshop?.id ?? null,
      status,
      category: u.model.category,
      maker: u.model.maker,
      model: u.model.model,
      year_from: u.years[0],
      year_to: u.years[1],
      serial_number: u.serial,
      mains_voltage_v: u.mains?.v ?? null,
      mains_frequency_hz: u.mains?.hz ?? null,
      mains_switchable: u.mains?.switchable ?? false,
      weight_g: u.weightG,
      boxed_length_mm: u.boxMm[0],
      boxed_width_mm: u.boxMm[1],
      boxed_height_mm: u.boxMm[2],
      includes_manual: u.includes.manual,
      includes_remote: u.includes.remote,
      includes_original_packing: u.includes.packing,
      price_minor: u.priceMinor,
      currency: u.currency,
      offers_welcome: u.offersWelcome,
      country: u.seller.place.country,
      region: u.seller.place.region,
      town: u.seller.place.town,
      postcode: u.seller.place.postcode,
      shipping_options: ShippingOptionsSchema.parse(u.shipping),
      handling_days: u.handlingDays,
      cosmetic_grade: u.grade,
      service_state: u.service,
      condition_note: u.note,
      bench_verified: verified,
      published_at: published ? u.publishedAt : null,
      held_reason: status === "held" ? state.heldReason : null,
      created_at: u.createdAt,
      updated_at: u.updatedAt,
    };
    for (const [key, column] of facetColumns) row[column] = facets[key as keyof typeof facets] ?? null;
    batch.listings.push(row);
    // Verdicts are left out (10 kB each); the listing page checks a sheet without one afresh.
    if (sheet)
      batch.sheets.push({
        id: u.sheetId,
        listing_id: u.id,
        sheet,
        verdict: null,
        checked_at: null,
        created_at: u.createdAt,
        updated_at: u.updatedAt,
      });
    if (verified) batch.verified++;
    batch.byStatus[status] = (batch.byStatus[status] ?? 0) + 1;
  }
  return batch;
}

export async function seedScale(opts: ScaleSeedOptions): Promise<ScaleSeedResult> {
  const started = performance.now();
  const log = opts.log ?? (() => {});
  const seed = opts.seed ?? 1;
  const until = opts.until ?? SCALE_UNTIL;
  const size = opts.batch ?? 2000;
  const db = new pg.Client({ connectionString: opts.databaseUrl });
  await db.connect();
  const result: ScaleSeedResult = { listings: 0, sheets: 0, verified: 0, byStatus: {}, removed: 0, seconds: 0 };
  try {
    const facetColumns = await facetColumnMap(db);
    const { workshops, privates } = scaleSellers(seed, opts.listings);
    const ctx = {
      seed,
      until,
      workshops: new SellerPicker(workshops),
      privates: new SellerPicker(privates),
    };
    await db.query("BEGIN");
    // New rows' text-search entries wait in the index's pending list until the vacuum below files them
    // all at once, rather than every 4 MB.
    await db.query("SET LOCAL gin_pending_list_limit = '64MB'");
    // One scale seeder at a time on a database.
    await db.query(`SELECT pg_advisory_xact_lock(hashtext('loadline-scale-seed'))`);
    result.removed = await removePrevious(db);
    if (result.removed) log(`Removed the ${result.removed.toLocaleString("en")} listings of an earlier scale seed`);
    const people = sellerRows([...workshops, ...privates], until);
    await insertRows(db, "users", people.users);
    await insertRows(db, "workshops", people.workshops);
    log(`${workshops.length} workshops and ${privates.length.toLocaleString("en")} private sellers`);

    // Build the next batch while the database writes this one.
    let pending: Promise<void> = Promise.resolve();
    for (let from = 0; from < opts.listings; from += size) {
      const to = Math.min(opts.listings, from + size);
      const batch = buildBatch(ctx, from, to, facetColumns);
      await pending;
      pending = (async () => {
        await insertRows(db, "listings", batch.listings);
        await insertRows(db, "bench_sheets", batch.sheets);
      })();
      pending.catch(() => undefined); // awaited below; keeps an early failure from going unhandled
      result.listings += batch.listings.length;
      result.sheets += batch.sheets.length;
      result.verified += batch.verified;
      for (const [s, n] of Object.entries(batch.byStatus)) result.byStatus[s] = (result.byStatus[s] ?? 0) + n;
      if (to === opts.listings || (to / size) % 5 === 0)
        log(
          `  ${to.toLocaleString("en")} / ${opts.listings.toLocaleString("en")} listings built (${((performance.now() - started) / 1000).toFixed(1)} s)`,
        );
    }
    await pending;
    await db.query("COMMIT");
    // Fresh statistics (or the planner guesses at the new rows) and the visibility map a market that
    // has settled would have (or index-only scans read the heap anyway).
    await db.query("VACUUM (ANALYZE) users, workshops, listings, bench_sheets");
  } catch (error) {
    await db.query("ROLLBACK").catch(() => undefined);
    throw error;
  } finally {
    await db.end();
  }
  result.seconds = Math.round((performance.now() - started) / 100) / 10;
  return result;
}
