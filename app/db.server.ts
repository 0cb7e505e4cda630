import { Sequelize } from "sequelize";
import { env } from "~/env.server";

// One pool per process; route modules and jobs share it (kept on globalThis so a development
// module reload does not open another).
declare global {
  var __loadlineSequelize: Sequelize | undefined;
}

export const sequelize: Sequelize =
  globalThis.__loadlineSequelize ??
  (globalThis.__loadlineSequelize = new Sequelize(env().databaseUrl, {
    dialect: "postgres",
    logging: false,
    pool: { max: 8, min: 0, idle: 10_000 },
    define: { underscored: true, timestamps: true },
    timezone: "+00:00",
  }));
