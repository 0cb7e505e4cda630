import type { Migration } from "../migrator";

// The bench reads captures for every category: a test tone for wow, flutter and speed; a stereo
// capture with one side driven for channel separation; a two-tone capture for intermodulation; a
// loudspeaker's impedance sweep; and a loaded/unloaded pair for output impedance.

const KINDS = ["sine", "square", "sweep", "wow_flutter", "separation", "imd", "impedance", "output_impedance"];
const OLD_KINDS = ["sine", "square", "sweep"];

const check = (kinds: string[]) =>
  `ALTER TABLE captures ADD CONSTRAINT captures_kind_known CHECK (kind IN (${kinds.map((k) => `'${k}'`).join(", ")}))`;

export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`ALTER TABLE captures DROP CONSTRAINT captures_kind_known`);
  await qi.sequelize.query(check(KINDS));
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`DELETE FROM captures WHERE kind NOT IN (${OLD_KINDS.map((k) => `'${k}'`).join(", ")})`);
  await qi.sequelize.query(`ALTER TABLE captures DROP CONSTRAINT captures_kind_known`);
  await qi.sequelize.query(check(OLD_KINDS));
};
