import type { Migration } from "../migrator";

// A failed capture's error code is one of the API's lower-case codes (docs/api.md); rows written
// before kept the old upper-case ones, and the lost-file code has a new name.
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`UPDATE captures SET error_code = 'file_lost' WHERE error_code = 'FILE_MISSING'`);
  await qi.sequelize.query(`UPDATE captures SET error_code = lower(error_code) WHERE error_code <> lower(error_code)`);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`UPDATE captures SET error_code = 'FILE_MISSING' WHERE error_code = 'file_lost'`);
  await qi.sequelize.query(`UPDATE captures SET error_code = upper(error_code) WHERE error_code <> upper(error_code)`);
};
