import type { Migration } from "../migrator";

// The listing a capture was uploaded for or first used on: deleting a draft removes the captures it
// ever had, also those no longer on its sheet (docs/decisions/0036). A capture still belongs to its
// owner; the link is cleared, not cascaded, if the listing goes some other way.

export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`ALTER TABLE captures ADD COLUMN listing_id uuid REFERENCES listings(id) ON DELETE SET NULL`);
  await qi.sequelize.query(`CREATE INDEX captures_listing_idx ON captures (listing_id) WHERE listing_id IS NOT NULL`);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`DROP INDEX IF EXISTS captures_listing_idx`);
  await qi.sequelize.query(`ALTER TABLE captures DROP COLUMN IF EXISTS listing_id`);
};
