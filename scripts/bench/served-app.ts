// The built app served on a throw-away test stack (PostgreSQL with the demo scenario, the stand-ins),
// as production runs it: `npm run bench` brings one up and hands it to each server figure in turn.
import { spawn, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { bin, bringUp, finished, launch, profile, root, stopChild, waitForHttp } from "../stack";

// A limit is a ceiling (the value must stay under it), or with atLeast a floor (Lighthouse scores).
export type Figure = { label: string; value: number; unit: string; limit?: number; atLeast?: boolean };

export interface ServedApp {
  base: string;
  env: Record<string, string>;
  databaseUrl: string;
  /** The web process (it changes on `restartWeb`). */
  web(): ChildProcess;
  /** A fresh web process: no warm caches, a memory baseline of its own. */
  restartWeb(): Promise<void>;
  stop(): Promise<void>;
}

/** Builds the app, serves it with `scripts/serve.ts` (and a worker when asked) on the test profile's ports. */
export async function serveApp({ worker = false } = {}): Promise<ServedApp> {
  const p = profile("test");
  fs.rmSync(p.dir, { recursive: true, force: true });
  const stack = await bringUp(p, { log: () => {} });
  const env = { ...stack.env };
  const base = `http://127.0.0.1:${env.PORT}`;
  let web: ChildProcess | undefined;
  let background: ChildProcess | undefined;
  const startWeb = async () => {
    // node --import tsx rather than the tsx binary: one process, so its memory is the server's.
    web = spawn(process.execPath, ["--import", "tsx", path.join(root, "scripts/serve.ts")], {
      cwd: root,
      env: { ...process.env, ...env, NODE_ENV: "production", HOST: "127.0.0.1" },
      stdio: ["ignore", "ignore", "inherit"],
    });
    await waitForHttp(`${base}/healthz`, 90_000, web);
  };
  const stop = async () => {
    await stopChild(web);
    await stopChild(background);
    await stack.stop();
  };
  try {
    if ((await finished(launch(bin("react-router"), ["build"], { ...env, NODE_ENV: "production" }, true))) !== 0)
      throw new Error("react-router build failed");
    if (worker) background = launch(bin("tsx"), ["scripts/worker.ts"], env, true);
    await startWeb();
  } catch (error) {
    await stop();
    throw error;
  }
  return {
    base,
    env,
    databaseUrl: env.DATABASE_URL,
    web: () => web!,
    restartWeb: async () => {
      await stopChild(web);
      await startWeb();
    },
    stop,
  };
}

/** Runs `measure` on an app of its own: for a bench file run alone. */
export async function withServedApp<T>(opts: { worker?: boolean }, measure: (app: ServedApp) => Promise<T>): Promise<T> {
  const app = await serveApp(opts);
  try {
    return await measure(app);
  } finally {
    await app.stop();
  }
}

/** The p-th percentile (nearest rank) of `values`. */
export const pct = (values: number[], p: number) => {
  const s = [...values].sort((x, y) => x - y);
  return s[Math.min(s.length - 1, Math.floor((p / 100) * s.length))];
};
export const ms = (x: number) => Math.round(x * 10) / 10;
