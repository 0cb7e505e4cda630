// `npx tsx db/seed.ts`: loads the demo scenario into DATABASE_URL (object storage must be up for the
// photos). Safe to run again: it adds only what is missing.
import { randomBytes } from "node:crypto";

// The seed signs no cookie, but the app's environment rules want a session secret: a throw-away one
// will do. Set before the app's modules are imported, since they read the environment on import.
process.env.SESSION_SECRET ||= randomBytes(48).toString("base64url");
const { sequelize } = await import("~/db.server");
const { seedDemo } = await import("./seeds/demo");
const { DEMO_PASSWORD } = await import("./seeds/demo-data");

const started = Date.now();
try {
  const result = await seedDemo();
  const secs = ((Date.now() - started) / 1000).toFixed(1);
  console.log(result.created ? `Demo scenario loaded in ${secs} s.` : `Demo scenario already present (checked in ${secs} s).`);
  console.log(`Demo accounts (password ${DEMO_PASSWORD}):`);
  for (const a of result.accounts) console.log(`  ${a.email.padEnd(26)} ${a.role}`);
} catch (error) {
  console.error("Seeding the demo scenario failed:", error);
  process.exitCode = 1;
} finally {
  // The demo sales queue jobs through pg-boss, which keeps its own connections open.
  await globalThis.__loadlineBoss?.then((boss) => boss.stop({ graceful: false })).catch(() => undefined);
  await sequelize.close();
}
