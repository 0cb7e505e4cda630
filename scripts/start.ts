import { bin, bringUp, finished, launch, profile, stopChild, waitForHttp } from "./stack";
import type { ChildProcess } from "node:child_process";

// `npm start` (built app) and `npm run dev` (Vite dev server): database, stand-ins, schema, demo
// data, the web server and the background worker. Ctrl-C stops everything this started.
const dev = process.argv.includes("--dev");
const p = profile("dev");
const stack = await bringUp(p);
const children: ChildProcess[] = [];

let stopping = false;
async function shutdown(code = 0) {
  if (stopping) return;
  stopping = true;
  console.log("\nStopping Loadline…");
  for (const c of children) await stopChild(c);
  await stack.stop();
  process.exit(code);
}
process.on("SIGINT", () => void shutdown(0));
process.on("SIGTERM", () => void shutdown(0));
process.on("uncaughtException", (error) => {
  console.error(error);
  void shutdown(1);
});

try {
  const env = { ...stack.env };
  let web: ChildProcess;
  if (dev) {
    web = launch(bin("react-router"), ["dev", "--host", "127.0.0.1", "--port", env.PORT, "--strictPort"], env);
  } else {
    console.log("Building the app…");
    const build = launch(bin("react-router"), ["build"], env, true);
    if ((await finished(build)) !== 0) throw new Error("react-router build failed");
    web = launch(bin("tsx"), ["scripts/serve.ts"], {
      ...env,
      NODE_ENV: "production",
      HOST: "127.0.0.1",
    });
  }
  children.push(web);
  children.push(launch(bin("tsx"), ["scripts/worker.ts"], env));

  const url = `http://127.0.0.1:${env.PORT}`;
  await waitForHttp(`${url}/healthz`, 120_000, web);
  console.log(["", `Loadline is running at ${url}`, "", ...stack.lines, "", "Press Ctrl-C to stop."].join("\n"));
  const code = await finished(web);
  if (!stopping) await shutdown(code);
} catch (error) {
  console.error(error instanceof Error ? error.message : error);
  await shutdown(1);
}
