import type { Migration } from "../migrator";

// Search at scale (docs/decisions/0026). Two things the plans at 100,000 listings asked for:
//
// - Statistics that know each facet belongs to a few categories. A facet is null outside its
//   categories, so the planner multiplied "category = amplifier" by "power ≥ 80 W" as if they were
//   independent and expected a fifth of the rows that come. With too few expected it read every
//   candidate through a bitmap and sorted them, where walking the category's price or newest index and
//   stopping at a page reads a few hundred rows. Facets are typed to a few hundred distinct values, so a
//   multi-column MCV list over (category, bench_verified, facet) holds nearly all of them and the
//   estimates come out right (ANALYZE builds them; the scale seed and autovacuum run it).
// - Words within a category: one GIN index over (category, search_doc) (btree_gin), so a text search in
//   a category reads only that category's matching rows instead of every category's. It serves words
//   without a category as well, so it replaces the GIN index on search_doc alone.
// - Counting: the per-filter counts read every live row the common filters leave. One narrow index
//   over live rows carries every column a count reads (not the text), so counting is an index-only scan
//   of about a tenth of the table's pages. (The price bounds are bound as euro figures for the same
//   reason: see EuroBounds in app/catalogue/search-sql.server.ts.)

const FACETS = [
  "power_8ohm_w",
  "power_4ohm_w",
  "thd_pct",
  "thdn_pct",
  "snr_db",
  "f3_low_hz",
  "f3_high_hz",
  "damping_factor",
  "riaa_deviation_db",
  "gain_db",
  "noise_uv",
  "sensitivity_db",
  "impedance_min_ohm",
  "speed_error_pct",
  "wow_flutter_pct",
];

/** What the counts read (countsQuery): the dimensions, the common filters but words, and every facet. */
const COUNTED = [
  "cosmetic_grade",
  "service_state",
  "workshop_id",
  "bench_verified",
  "price_eur_minor",
  "currency",
  "price_minor",
  "mains_switchable",
  "mains_voltage_v",
  "country",
  "courier_zones",
  ...FACETS,
];

/** Rows sampled and MCV items kept per statistics object (the default 100 keeps too few facet values). */
const STATISTICS_TARGET = 2000;

export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    const q = (text: string) => qi.sequelize.query(text, { transaction });
    for (const column of FACETS) {
      await q(`CREATE STATISTICS listings_${column}_stats (mcv) ON category, bench_verified, ${column} FROM listings`);
      await q(`ALTER STATISTICS listings_${column}_stats SET STATISTICS ${STATISTICS_TARGET}`);
    }
    await q(`CREATE EXTENSION IF NOT EXISTS btree_gin`);
    await q(`CREATE INDEX listings_live_category_search_idx ON listings USING gin (category, search_doc) WHERE status = 'live'`);
    await q(`DROP INDEX listings_live_search_idx`);
    await q(`CREATE INDEX listings_live_counts_idx ON listings (category) INCLUDE (${COUNTED.join(", ")}) WHERE status = 'live'`);
    await q(`ANALYZE listings`);
  });
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    const q = (text: string) => qi.sequelize.query(text, { transaction });
    await q(`DROP INDEX listings_live_counts_idx`);
    await q(`CREATE INDEX listings_live_search_idx ON listings USING gin (search_doc) WHERE status = 'live'`);
    await q(`DROP INDEX listings_live_category_search_idx`);
    // btree_gin stays: dropping it could take another schema's use of it along.
    for (const column of FACETS) await q(`DROP STATISTICS listings_${column}_stats`);
  });
};
