import { Sequelize } from "sequelize";
import { createMigrator } from "./migrator";

// `tsx db/migrate.ts up|down|status` against DATABASE_URL (down without --all undoes the latest one).
const [command = "up", flag] = process.argv.slice(2);
const url = process.env.DATABASE_URL ?? "postgres://loadline@127.0.0.1:54329/loadline";
const sequelize = new Sequelize(url, { logging: false, dialect: "postgres" });
const migrator = createMigrator(sequelize);

try {
  if (command === "up") {
    const done = await migrator.up();
    console.log(done.length ? `Applied ${done.map((m) => m.name).join(", ")}` : "Schema is up to date");
  } else if (command === "down") {
    const undone = await migrator.down(flag === "--all" ? { to: 0 } : undefined);
    console.log(undone.length ? `Rolled back ${undone.map((m) => m.name).join(", ")}` : "Nothing to roll back");
  } else if (command === "status") {
    for (const m of await migrator.executed()) console.log(`applied  ${m.name}`);
    for (const m of await migrator.pending()) console.log(`pending  ${m.name}`);
  } else {
    console.error("usage: tsx db/migrate.ts up|down [--all]|status");
    process.exitCode = 2;
  }
} finally {
  await sequelize.close();
}
