import type { Migration } from "../migrator";

// A workshop's own stock number for a unit (the inventory CSV's `reference` column): how it finds the
// unit on its shelves and in its books. Private to the seller; not unique, since a workshop may reuse
// a number once a unit is sold.

export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(
    `ALTER TABLE listings ADD COLUMN stock_reference varchar(40) CHECK (stock_reference IS NULL OR length(btrim(stock_reference)) > 0)`,
  );
  await qi.sequelize.query(
    `CREATE INDEX listings_seller_stock_reference ON listings (seller_id, stock_reference) WHERE stock_reference IS NOT NULL`,
  );
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`DROP INDEX IF EXISTS listings_seller_stock_reference`);
  await qi.sequelize.query(`ALTER TABLE listings DROP COLUMN IF EXISTS stock_reference`);
};
