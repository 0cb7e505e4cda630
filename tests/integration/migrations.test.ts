import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { QueryTypes, Sequelize } from "sequelize";
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
    // Read pg_tables, not information_schema: Sequelize rewrites the result of a query that looks
    // like its own "show tables" query.
    const rows = await sequelize.query<{ name: string }>(
      `SELECT tablename AS name FROM pg_catalog.pg_tables WHERE schemaname = 'public'
       AND tablename <> 'schema_migrations' ORDER BY tablename`,
      { type: QueryTypes.SELECT },
    );
    return rows.map((r) => r.name);
  }

  it("apply to an empty database and create the core tables", async () => {
    expect(await userTables()).toEqual([]);
    const migrator = createMigrator(sequelize);
    const applied = await migrator.up();
    expect(applied.length).toBeGreaterThan(0);
    expect(await migrator.pending()).toEqual([]);
    const tables = await userTables();
    expect(tables).toEqual(
      expect.arrayContaining(["users", "workshops", "listings", "listing_photos", "bench_sheets", "restoration_entries", "captures"]),
    );
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
