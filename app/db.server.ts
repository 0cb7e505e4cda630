import { Sequelize } from "sequelize";
import { env } from "~/env.server";

// One pool per process; route modules and jobs share it.
const globalForDb = globalThis as unknown as { __loadlineSequelize?: Sequelize };

export const sequelize: Sequelize =
  globalForDb.__loadlineSequelize ??
  (globalForDb.__loadlineSequelize = new Sequelize(env().databaseUrl, {
    dialect: "postgres",
    logging: false,
    pool: { max: 8, min: 0, idle: 10_000 },
    define: { underscored: true, timestamps: true },
    timezone: "+00:00",
  }));
