import type { Migration } from "../migrator";

// How many times the analysis job has started on a capture: once the queue's retries are spent on
// storage or database trouble, the job ends the capture as failed with a reason instead of leaving it
// queued, and the seller may queue it again (which starts the count afresh).

export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`ALTER TABLE captures ADD COLUMN attempts integer NOT NULL DEFAULT 0 CHECK (attempts >= 0)`);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`ALTER TABLE captures DROP COLUMN IF EXISTS attempts`);
};
