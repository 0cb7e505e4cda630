import type { Migration } from "../migrator";

// The buyer's own figures entered when they accept a unit (a contest keeps its figures in
// order_contests): kept with the order beside the comparison with the listing's bench sheet as it came
// out then, so a later question about the sale has both sides' numbers. One per order.

export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TABLE order_remeasurements (
      order_id uuid PRIMARY KEY REFERENCES orders(id) ON DELETE RESTRICT,
      readings jsonb NOT NULL,
      comparison jsonb NOT NULL,
      entered_at timestamptz NOT NULL DEFAULT now()
    )`);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`DROP TABLE IF EXISTS order_remeasurements`);
};
