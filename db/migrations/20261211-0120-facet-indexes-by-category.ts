import type { Migration } from "../migrator";

// The market's measured-figure filters mostly come with a category (the panel offers a category's
// figures), so each facet is indexed after the category: a filter within a category reads only the
// rows inside both bounds. Without a category, newest-first walks the recent index and filters.
// Price per watt likewise: within a category it starts at the category's cheapest watt instead of
// walking past every other category's units.

const PER_WATT = {
  measured: "loadline_per_watt(price_eur_minor, power_8ohm_w)",
  verified: "loadline_per_watt(price_eur_minor, CASE WHEN bench_verified THEN power_8ohm_w END)",
};

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

export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    for (const column of FACETS) {
      await qi.sequelize.query(`DROP INDEX listings_live_${column}_idx`, { transaction });
      await qi.sequelize.query(
        `CREATE INDEX listings_live_${column}_idx ON listings (category, ${column}) WHERE status = 'live' AND ${column} IS NOT NULL`,
        { transaction },
      );
    }
    for (const [name, expr] of Object.entries(PER_WATT)) {
      await qi.sequelize.query(
        `CREATE INDEX listings_live_category_per_${name}_watt_idx ON listings (category, ${expr}, id) WHERE status = 'live'`,
        {
          transaction,
        },
      );
    }
  });
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    for (const name of Object.keys(PER_WATT)) {
      await qi.sequelize.query(`DROP INDEX listings_live_category_per_${name}_watt_idx`, { transaction });
    }
    for (const column of FACETS) {
      await qi.sequelize.query(`DROP INDEX listings_live_${column}_idx`, { transaction });
      await qi.sequelize.query(
        `CREATE INDEX listings_live_${column}_idx ON listings (${column}) WHERE status = 'live' AND ${column} IS NOT NULL`,
        {
          transaction,
        },
      );
    }
  });
};
