// `npm run seed:scale -- --listings 100000 [--seed 1] [--until 2026-12-01] [--allow-remote]`: fills a
// database with made-up listings and bench sheets for timing the market at scale. The database is
// DATABASE_URL, or the dev profile's (`npm start`'s cluster, started here if it is not running).
//
// It removes only what an earlier scale seed made (accounts at the scale domain and their listings),
// so it is safe on the dev database and on a throw-away test database alike; what it does not do is
// write to a server elsewhere by accident: a host other than this machine needs --allow-remote.
import path from "node:path";
import { parseArgs } from "node:util";
import { createDatabase, startCluster, type Cluster } from "./cluster";
import { migrateUp } from "./migrator";
import { profile } from "../scripts/stack";
import { seedScale, SCALE_UNTIL } from "./seeds/scale/write";

const { values } = parseArgs({
  options: {
    listings: { type: "string", default: "100000" },
    seed: { type: "string", default: "1" },
    until: { type: "string" },
    "allow-remote": { type: "boolean", default: false },
  },
});

const listings = Number(values.listings);
const seed = Number(values.seed);
const until = values.until ? new Date(`${values.until}T00:00:00Z`) : SCALE_UNTIL;
if (!Number.isInteger(listings) || listings < 1 || listings > 2_000_000) throw new Error("--listings: a whole number from 1 to 2,000,000");
if (!Number.isInteger(seed)) throw new Error("--seed: a whole number");
if (Number.isNaN(until.getTime())) throw new Error("--until: a date, YYYY-MM-DD");

let cluster: Cluster | undefined;
let url = process.env.DATABASE_URL;
if (!url) {
  const dev = profile("dev");
  cluster = await startCluster({ dir: path.join(dev.dir, "pg"), port: dev.pgPort, database: dev.database, log: console.log });
  url = cluster.url;
}
const host = new URL(url).hostname;
if (!["127.0.0.1", "localhost", "::1", "[::1]"].includes(host) && !values["allow-remote"]) {
  console.error(`${host} is not this machine: pass --allow-remote to fill a database there with made-up listings.`);
  process.exit(2);
}

try {
  console.log(`Scale seed: ${listings.toLocaleString("en")} listings into ${url.replace(/\/\/[^@]*@/, "//")} (seed ${seed})`);
  await createDatabase(url, decodeURIComponent(new URL(url).pathname.slice(1))); // a scratch database is made if missing
  const applied = await migrateUp(url);
  if (applied.length) console.log(`Applied ${applied.length} migration(s)`);
  const r = await seedScale({ databaseUrl: url, listings, seed, until, log: console.log });
  const statuses = Object.entries(r.byStatus)
    .map(([s, n]) => `${n.toLocaleString("en")} ${s}`)
    .join(", ");
  console.log(
    `Wrote ${r.listings.toLocaleString("en")} listings (${statuses}), ${r.sheets.toLocaleString("en")} bench sheets, ${r.verified.toLocaleString("en")} bench-verified, in ${r.seconds} s.`,
  );
} catch (error) {
  console.error("The scale seed failed:", error);
  process.exitCode = 1;
} finally {
  await cluster?.stop();
}
