import path from "node:path";
import { fileURLToPath } from "node:url";
import { Sequelize, type QueryInterface } from "sequelize";
import { Umzug, SequelizeStorage } from "umzug";

// Migrations are TypeScript files in db/migrations named `YYYYMMDD-HHMM-what.ts`, each exporting
// `up` and `down` that receive Sequelize's QueryInterface. They run in name order.
export type Migration = (params: { context: QueryInterface }) => Promise<void>;

const here = path.dirname(fileURLToPath(import.meta.url));

export function createMigrator(sequelize: Sequelize) {
  return new Umzug({
    migrations: {
      glob: ["migrations/*.ts", { cwd: here }],
      resolve: ({ name, path: file, context }) => ({
        name: name.replace(/\.ts$/, ""),
        up: async () => (await import(file!)).up({ context }),
        down: async () => (await import(file!)).down({ context }),
      }),
    },
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, tableName: "schema_migrations" }),
    logger: undefined,
  });
}

export async function migrateUp(databaseUrl: string) {
  const sequelize = new Sequelize(databaseUrl, { logging: false, dialect: "postgres" });
  try {
    return await createMigrator(sequelize).up();
  } finally {
    await sequelize.close();
  }
}
