import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Sequelize } from "sequelize";
import { createDatabase, dropDatabase } from "../../db/cluster";
import { createMigrator } from "../../db/migrator";

// Runs every migration on an empty database of its own, then rolls them all back, so a release can
// be undone step by step.
describe("migrations", () => {
  let sequelize: Sequelize;
  // A database of its own per run, so runs sharing a cluster do not see each other's tables.
  const name = `loadline_migration_check_${process.pid}`;

  beforeAll(async () => {
    const url = await createDatabase(process.env.DATABASE_URL!, name, { fresh: true });
    sequelize = new Sequelize(url, { logging: false, dialect: "postgres" });
  });
  afterAll(async () => {
    await sequelize?.close();
    await dropDatabase(process.env.DATABASE_URL!, name);
  });

  async function userTables() {
    const [rows] = await sequelize.query(
      `SELECT table_name FROM information_schema.tables WHERE table_schema = 'public' AND table_type = 'BASE TABLE'
       AND table_name <> 'schema_migrations' ORDER BY table_name`,
    );
    return (rows as { table_name: string }[]).map((r) => r.table_name);
  }

  it("apply to an empty database and create the core tables", async () => {
    expect(await userTables()).toEqual([]);
    const migrator = createMigrator(sequelize);
    const applied = await migrator.up();
    expect(applied.length).toBeGreaterThan(0);
    expect(await migrator.pending()).toEqual([]);
    const tables = await userTables();
    expect(tables).toEqual(expect.arrayContaining(["users"]));
  });

  it("roll back completely, leaving no table behind", async () => {
    const migrator = createMigrator(sequelize);
    await migrator.down({ to: 0 });
    expect(await migrator.executed()).toEqual([]);
    expect(await userTables()).toEqual([]);
  });

  it("apply again after a full rollback", async () => {
    const migrator = createMigrator(sequelize);
    await migrator.up();
    expect(await migrator.pending()).toEqual([]);
  });
});
