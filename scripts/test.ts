import fs from "node:fs";
import path from "node:path";
import type { ChildProcess } from "node:child_process";
import pg from "pg";
import { bin, bringUp, finished, launch, profile, stopChild, waitForHttp } from "./stack";

// `npm test`: a throw-away cluster and stand-ins on their own ports, then typecheck, lint, the unit,
// reference and integration suites, and the browser suite against the built app. The last line is
// the totals over all of them.
// `npm test -- [--skip-typecheck] [--skip-lint] [--skip-browser] [file filters…]` narrows a run while
// working; with no arguments everything runs (CI). Lint needs the route types the typecheck
// generates, so --skip-typecheck skips it too.
const argv = process.argv.slice(2);
const skipTypecheck = argv.includes("--skip-typecheck");
const skipLint = skipTypecheck || argv.includes("--skip-lint");
const filters = argv.filter((a) => !a.startsWith("--"));
const skipBrowser = argv.includes("--skip-browser") || (filters.length > 0 && !filters.some((f) => f.includes("e2e")));
const p = profile("test");
fs.rmSync(p.dir, { recursive: true, force: true });
const reports = path.join(p.dir, "reports");

type Tally = { passed: number; failed: number; skipped: number };
const total: Tally = { passed: 0, failed: 0, skipped: 0 };
const failures: string[] = [];
const retried: string[] = [];

function count(name: string, file: string, exitCode: number) {
  if (!fs.existsSync(file)) {
    total.failed += 1;
    failures.push(`${name}: the runner exited ${exitCode} without a report`);
    return;
  }
  const r = JSON.parse(fs.readFileSync(file, "utf8"));
  total.passed += r.numPassedTests;
  total.failed += r.numFailedTests;
  total.skipped += (r.numPendingTests ?? 0) + (r.numTodoTests ?? 0);
  if (r.numFailedTests > 0) failures.push(`${name}: ${r.numFailedTests} failed`);
  // Name each failed test (and each that passed only on CI's retry), so the summary at the end of a
  // long log says which, without scrolling back through it.
  type Assertion = { status: string; fullName: string; failureMessages: string[] | null };
  for (const t of (r.testResults ?? []) as { name: string; assertionResults: Assertion[] }[]) {
    const where = path.relative(process.cwd(), t.name);
    for (const a of t.assertionResults) {
      if (a.status === "failed") failures.push(`${name}: ${where} > ${a.fullName}`);
      else if (a.status === "passed" && a.failureMessages?.length) retried.push(`${where} > ${a.fullName}`);
    }
  }
  // A suite that fails to load counts as a failure even when no test in it ran.
  const broken = (r.testResults ?? []).filter(
    (t: { status: string; assertionResults: unknown[] }) => t.status === "failed" && t.assertionResults.length === 0,
  );
  if (broken.length) {
    total.failed += broken.length;
    failures.push(`${name}: ${broken.length} file(s) failed to load`);
  }
  if (exitCode !== 0 && r.numFailedTests === 0 && broken.length === 0) {
    total.failed += 1;
    failures.push(`${name}: the runner exited ${exitCode}`);
  }
}

async function vitest(name: string, projects: string[], env: Record<string, string>) {
  const file = path.join(reports, `${name}.json`);
  const args = [
    "run",
    ...projects.flatMap((pr) => ["--project", pr]),
    "--reporter=default",
    "--reporter=json",
    `--outputFile.json=${file}`,
    // On CI one retry, so a test that fails once under a loaded machine does not sink the run; the
    // summary names every test that needed it.
    ...(process.env.CI ? ["--retry", "1"] : []),
    ...(filters.length ? ["--passWithNoTests", ...filters] : []),
  ];
  const code = await finished(launch(bin("vitest"), args, env));
  count(name, file, code);
}

const children: ChildProcess[] = [];
// Whatever crashes, stop what was started and still print the totals.
process.on("uncaughtException", (error) => void crashed(error));
async function crashed(error: Error) {
  console.error(error);
  for (const c of children) await stopChild(c);
  await stack?.stop();
  console.log(`\n${total.passed} passed, ${total.failed + 1} failed`);
  process.exit(1);
}
let stack: Awaited<ReturnType<typeof bringUp>> | undefined;
let exitCode = 1;
try {
  stack = await bringUp(p, { log: (l) => console.log(`[setup] ${l}`) });
  const env: Record<string, string> = { ...stack.env, NODE_ENV: "test" };
  fs.mkdirSync(reports, { recursive: true });

  if (!skipTypecheck) await typecheck(env);
  if (!skipLint) await lint(env);

  console.log("\n== Unit, reference and integration suites");
  await vitest("main", ["unit", "reference", "integration"], env);

  if (!skipBrowser) await browserSuite(env);
  exitCode = total.failed > 0 ? 1 : 0;
} catch (error) {
  console.error(error instanceof Error ? error.stack : error);
  total.failed += 1;
  failures.push(`setup: ${error instanceof Error ? error.message : String(error)}`);
} finally {
  for (const c of children) await stopChild(c);
  await stack?.stop();
}

async function typecheck(env: Record<string, string>) {
  console.log("\n== Typecheck");
  const typegen = await finished(launch(bin("react-router"), ["typegen"], env));
  const tsc = typegen === 0 ? await finished(launch(bin("tsc"), ["--noEmit", "-p", "."], env)) : 1;
  if (tsc === 0) total.passed += 1;
  else {
    total.failed += 1;
    failures.push("typecheck failed");
  }
}

// `npm run lint`: ESLint, then Prettier's check; one entry in the totals like the typecheck.
async function lint(env: Record<string, string>) {
  console.log("\n== Lint");
  const eslint = await finished(launch(bin("eslint"), ["--max-warnings", "0", "."], env));
  const prettier = await finished(launch(bin("prettier"), ["--check", "--log-level", "warn", "."], env));
  if (eslint === 0 && prettier === 0) total.passed += 1;
  else {
    total.failed += 1;
    failures.push(`lint failed (${[eslint && "eslint", prettier && "prettier --check"].filter(Boolean).join(", ")})`);
  }
}

// The integration suites queue jobs (mails, deadlines, photos) that no worker ran; left in place,
// the browser suite's worker would spend minutes on them before the jobs its own walkthroughs wait for.
async function dropQueuedJobs(databaseUrl: string) {
  const client = new pg.Client({ connectionString: databaseUrl });
  await client.connect();
  try {
    // No suite may have started pg-boss yet (a narrowed run): then there is nothing to drop.
    const { rows } = await client.query<{ t: string | null }>(`SELECT to_regclass('pgboss.job')::text AS t`);
    if (!rows[0]?.t) return;
    const { rowCount } = await client.query(`DELETE FROM pgboss.job WHERE state < 'completed'`);
    console.log(`[setup] dropped ${rowCount} jobs left queued by the integration suites`);
  } finally {
    await client.end();
  }
}

async function browserSuite(env: Record<string, string>) {
  console.log("\n== Browser suite");
  const build = await finished(launch(bin("react-router"), ["build"], { ...env, NODE_ENV: "production" }, true));
  if (build !== 0) {
    total.failed += 1;
    failures.push("react-router build failed");
  } else {
    await dropQueuedJobs(env.DATABASE_URL);
    const serverEnv = { ...env, NODE_ENV: "production", HOST: "127.0.0.1" };
    const web = launch(bin("tsx"), ["scripts/serve.ts"], serverEnv, true);
    children.push(web, launch(bin("tsx"), ["scripts/worker.ts"], env, true));
    const baseUrl = `http://127.0.0.1:${env.PORT}`;
    await waitForHttp(`${baseUrl}/healthz`, 90_000, web);
    await vitest("e2e", ["e2e"], {
      ...env,
      E2E_BASE_URL: baseUrl,
      E2E_MAIL_URL: `http://127.0.0.1:${env.FAKE_MAIL_HTTP_PORT}`,
    });
  }
}

if (retried.length) console.log(`\nPassed only on a retry:\n${retried.map((f) => `  - ${f}`).join("\n")}`);
if (failures.length) console.log(`\nFailures:\n${failures.map((f) => `  - ${f}`).join("\n")}`);
console.log(`\n${total.passed} passed, ${total.failed} failed${total.skipped ? `, ${total.skipped} skipped` : ""}`);
process.exit(exitCode || (total.failed > 0 ? 1 : 0));
