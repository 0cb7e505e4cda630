import { spawn, type ChildProcess } from "node:child_process";
import net from "node:net";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { localSessionSecret } from "./local-secret";

// Brings up what Loadline runs on: the local PostgreSQL cluster, the stand-ins for hosted services,
// the schema and the demo scenario. Shared by `npm start`, `npm run dev` and `npm test`.

export const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");

export type Profile = {
  name: "dev" | "test";
  dir: string;
  pgPort: number;
  database: string;
  env: Record<string, string>;
};

export function profile(name: "dev" | "test"): Profile {
  if (name === "dev") {
    const port = process.env.PORT ?? "3000";
    return {
      name,
      dir: path.join(root, ".local/dev"),
      pgPort: 54329,
      database: "loadline",
      // The stand-ins' ports may be moved through the environment (FAKE_*_PORT), as may PORT.
      env: {
        PORT: port,
        ...Object.fromEntries(Object.entries(process.env).filter(([k, v]) => k.startsWith("FAKE_") && v)),
      } as Record<string, string>,
    };
  }
  // TEST_PORT_OFFSET moves every port of the throw-away stack, so two checkouts can test at once.
  const offset = Number(process.env.TEST_PORT_OFFSET ?? 0) || 0;
  const at = (port: number) => String(port + offset);
  return {
    name,
    dir: path.join(root, ".local/test"),
    pgPort: 54339 + offset,
    database: "loadline_test",
    env: {
      PORT: at(3100),
      FAKE_S3_PORT: at(4669),
      FAKE_SMTP_PORT: at(1125),
      FAKE_MAIL_HTTP_PORT: at(1180),
      FAKE_OAUTH_PORT: at(4110),
      FAKE_STRIPE_PORT: at(12211),
      LOADLINE_FAST_HASH: "1",
    },
  };
}

export type Stack = { env: Record<string, string>; lines: string[]; stop: () => Promise<void> };

function portFree(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const probe = net.createServer();
    probe.once("error", () => resolve(false));
    probe.listen(port, "127.0.0.1", () => probe.close(() => resolve(true)));
  });
}

// A clear message beats a crash deep inside a stand-in when another run still holds a port.
async function assertPortsFree(p: Profile) {
  const wanted: [string, number][] = [
    ["the app", Number(p.env.PORT)],
    ["object storage stand-in", Number(p.env.FAKE_S3_PORT ?? 4569)],
    ["SMTP stand-in", Number(p.env.FAKE_SMTP_PORT ?? 1025)],
    ["mail inbox", Number(p.env.FAKE_MAIL_HTTP_PORT ?? 1080)],
    ["sign-in provider stand-in", Number(p.env.FAKE_OAUTH_PORT ?? 4010)],
    ["payments stand-in", Number(p.env.FAKE_STRIPE_PORT ?? 12111)],
  ];
  // `npm start` may resume a cluster it left running; the test cluster is always new.
  if (p.name === "test") wanted.push(["PostgreSQL", p.pgPort]);
  const busy: string[] = [];
  for (const [what, port] of wanted) if (!(await portFree(port))) busy.push(`${port} (${what})`);
  if (busy.length) {
    throw new Error(
      `Port${busy.length > 1 ? "s" : ""} ${busy.join(", ")} already in use: is another \`npm ${p.name === "test" ? "test" : "start"}\` running?`,
    );
  }
}

export async function bringUp(p: Profile, { seed = true, log = console.log } = {}): Promise<Stack> {
  await assertPortsFree(p);
  const stops: (() => Promise<void>)[] = [];
  const stop = async () => {
    for (const s of stops.reverse()) await s().catch((e) => console.error(String(e)));
  };
  try {
    const { startCluster } = await import("../db/cluster");
    const cluster = await startCluster({
      dir: path.join(p.dir, "pg"),
      port: p.pgPort,
      database: p.database,
      fast: p.name === "test",
      log,
    });
    stops.push(cluster.stop);

    // Everything below reads the environment through app/env.server.ts, so set it before importing.
    // The profile keeps its own session secret unless one is given (app/env.server.ts has none).
    const secret = process.env.SESSION_SECRET || localSessionSecret(p.dir).secret;
    const env: Record<string, string> = {
      ...p.env,
      DATABASE_URL: process.env.DATABASE_URL ?? cluster.url,
      SESSION_SECRET: secret,
    };
    Object.assign(process.env, env);

    const { env: appEnv } = await import("../app/env.server");
    const settings = appEnv();
    const { startFakes } = await import("../fakes/index");
    // The sign-in provider offers the demo accounts, which exist only once the seed below has run.
    let suggestions: { email: string; name: string }[] = [];
    const fakes = await startFakes({
      oauthSuggestions: () => suggestions,
      env: settings,
      dataDir: path.join(p.dir, "fakes"),
      webhookUrl: `${settings.appUrl}/api/v1/webhooks/stripe`,
      log,
    });
    stops.push(fakes.stop);

    const { migrateUp } = await import("../db/migrator");
    const applied = await migrateUp(settings.databaseUrl);
    if (applied.length) log(`Applied ${applied.length} migration(s)`);

    const lines = [...fakes.lines];
    if (seed) {
      const { seedDemo } = await import("../db/seeds/demo");
      const result = await seedDemo();
      log(result.created ? "Loaded the demo scenario" : "Demo scenario already loaded");
      lines.push("", "Demo accounts (password: bench-demo-2026)");
      const width = Math.max(...result.accounts.map((a) => a.email.length));
      for (const a of result.accounts) lines.push(`  ${a.email.padEnd(width)}  ${a.role}`);
      suggestions = result.accounts.map((a) => ({ email: a.email, name: `Demo ${a.role}` }));
    }
    const { sequelize } = await import("../app/db.server");
    stops.push(() => sequelize.close());
    return { env, lines, stop };
  } catch (error) {
    await stop();
    throw error;
  }
}

export function bin(name: string) {
  return path.join(root, "node_modules/.bin", name);
}

export function launch(command: string, args: string[], env: Record<string, string>, quiet = false): ChildProcess {
  return spawn(command, args, {
    cwd: root,
    env: { ...process.env, ...env },
    stdio: quiet ? ["ignore", "ignore", "inherit"] : "inherit",
  });
}

export function finished(child: ChildProcess): Promise<number> {
  return new Promise((resolve) => {
    if (child.exitCode !== null) return resolve(child.exitCode);
    child.once("exit", (code, signal) => resolve(code ?? (signal ? 1 : 0)));
  });
}

export async function waitForHttp(url: string, timeoutMs = 60_000, child?: ChildProcess) {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (child && child.exitCode !== null) throw new Error(`${url}: the process exited (${child.exitCode})`);
    try {
      const res = await fetch(url);
      if (res.status < 500) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 300));
  }
  throw new Error(`${url} did not answer within ${timeoutMs / 1000} s`);
}

export async function stopChild(child: ChildProcess | undefined) {
  if (!child || child.exitCode !== null || child.signalCode) return;
  child.kill("SIGTERM");
  const timer = setTimeout(() => child.kill("SIGKILL"), 8_000);
  await finished(child);
  clearTimeout(timer);
}
