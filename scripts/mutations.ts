// `npm run mutations`: would the bench's tests notice a realistic one-line slip in shared/bench?
// Each mutation in scripts/mutations/list.ts is applied, one at a time, to a throw-away copy of the
// repository (the working tree is never touched), and the bench's unit and reference tests run once
// against it. A mutation is caught when any test fails. Prints caught/total and the survivors.
//
//   npm run mutations                 every mutation
//   npm run mutations -- --check      only check that each mutation still applies (no tests)
//   npm run mutations -- power phono  only mutations whose file or description contains a word
//   npm run mutations -- --workers=1  vitest workers (default 2; the machine is shared)
//   npm run mutations -- --tests=tests/unit/bench/rule   only test files whose path contains this
//   npm run mutations -- --survivors=<log>   only the mutations an earlier run's output lists as SURVIVED
//                                            (plus any chosen by words), to re-check after adding tests
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { spawnSync } from "node:child_process";
import { MUTATIONS, type Mutation } from "./mutations/list";

const ROOT = path.resolve(import.meta.dirname, "..");
/** The bench's fast suites: no database, no browser. */
const TEST_GLOBS = ["tests/unit/bench-", "tests/unit/bench/", "tests/reference/"];
/** Files that synthesise and analyse captures: seconds each, so they run second unless the mutation is in the analysis. */
const SLOW = /bench-(thd|fft|square-sweep|capture|remeasure|isomorphic)|analysis-/;
const PER_RUN_TIMEOUT_MS = 240_000;

const argv = process.argv.slice(2);
const checkOnly = argv.includes("--check");
const workers = Number(argv.find((a) => a.startsWith("--workers="))?.split("=")[1] ?? 2);
const onlyTests = argv.find((a) => a.startsWith("--tests="))?.split("=")[1];
const words = argv.filter((a) => !a.startsWith("--"));
const survivorsLog = argv.find((a) => a.startsWith("--survivors="))?.split("=")[1];
const survived = survivorsLog
  ? fs
      .readFileSync(survivorsLog, "utf8")
      .split("\n")
      .filter((l) => / SURVIVED /.test(l))
      .map((l) => l.replace(/^\[\d+\/\d+\] SURVIVED\s+/, "").replace(/ \([\d.]+ s\)$/, ""))
  : [];
const byWord = (m: Mutation) => words.some((w) => m.file.includes(w) || m.why.toLowerCase().includes(w.toLowerCase()));
const chosen = words.length || survivorsLog ? MUTATIONS.filter((m) => byWord(m) || survived.includes(`${m.file}: ${m.why}`)) : MUTATIONS;

/** Where `from` sits in the file: it must occur exactly once, so the mutation is unambiguous. */
function locate(text: string, m: Mutation): number | string {
  const at = text.indexOf(m.from);
  if (at < 0) return "original text not found";
  if (text.indexOf(m.from, at + 1) >= 0) return "original text occurs more than once";
  if (m.from === m.to) return "replacement equals the original";
  return at;
}

function check(): boolean {
  let ok = true;
  for (const m of MUTATIONS) {
    const where = locate(fs.readFileSync(path.join(ROOT, m.file), "utf8"), m);
    if (typeof where === "string") {
      ok = false;
      console.log(`STALE  ${m.file}: ${m.why} — ${where}`);
    }
  }
  const files = new Set(MUTATIONS.map((m) => m.file));
  const benchFiles = listBenchFiles().filter((f) => !files.has(f));
  console.log(`${MUTATIONS.length} mutations over ${files.size} files of shared/bench.`);
  if (benchFiles.length) console.log(`Files with no mutation: ${benchFiles.join(", ")}`);
  return ok;
}

function listBenchFiles(): string[] {
  const out: string[] = [];
  const walk = (dir: string) => {
    for (const e of fs.readdirSync(path.join(ROOT, dir), { withFileTypes: true })) {
      const rel = path.join(dir, e.name);
      if (e.isDirectory()) walk(rel);
      else if (e.name.endsWith(".ts")) out.push(rel);
    }
  };
  walk("shared/bench");
  return out.sort();
}

/** A copy of the repository without node_modules (linked) or git history. */
function makeCopy(): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "loadline-mutations-"));
  const skip = new Set([".git", "node_modules", "build", ".react-router", "tmp", ".cache"]);
  for (const e of fs.readdirSync(ROOT, { withFileTypes: true })) {
    if (skip.has(e.name)) continue;
    fs.cpSync(path.join(ROOT, e.name), path.join(dir, e.name), { recursive: true, dereference: false });
  }
  fs.symlinkSync(fs.realpathSync(path.join(ROOT, "node_modules")), path.join(dir, "node_modules"), "dir");
  return dir;
}

function testFiles(copy: string): string[] {
  const out: string[] = [];
  for (const g of TEST_GLOBS) {
    const dir = path.join(copy, path.dirname(g.endsWith("/") ? `${g}x` : g));
    const prefix = g.endsWith("/") ? "" : path.basename(g);
    const walk = (d: string) => {
      if (!fs.existsSync(d)) return;
      for (const e of fs.readdirSync(d, { withFileTypes: true })) {
        const full = path.join(d, e.name);
        if (e.isDirectory() && g.endsWith("/")) walk(full);
        else if (e.name.startsWith(prefix) && /\.test\.tsx?$/.test(e.name)) out.push(path.relative(copy, full));
      }
    };
    walk(dir);
  }
  return [...new Set(out)].filter((f) => !onlyTests || f.includes(onlyTests)).sort();
}

type Run = { pass: boolean; timedOut: boolean; ms: number };

/** One vitest run over `files` in the copy, stopping at the first failure. */
function vitest(copy: string, files: string[]): Run {
  const t0 = Date.now();
  const r = spawnSync(
    path.join(copy, "node_modules/.bin/vitest"),
    [
      "run",
      "--project",
      "unit",
      "--project",
      "reference",
      "--pool=threads",
      `--maxWorkers=${workers}`,
      // The bench's modules are pure; sharing them between files saves most of a run's start-up.
      "--no-isolate",
      "--bail=1",
      "--reporter=dot",
      ...files,
    ],
    { cwd: copy, encoding: "utf8", timeout: PER_RUN_TIMEOUT_MS, env: { ...process.env, NODE_ENV: "test", CI: "1" } },
  );
  const timedOut = r.error !== undefined && (r.error as NodeJS.ErrnoException).code === "ETIMEDOUT";
  return { pass: r.status === 0, timedOut, ms: Date.now() - t0 };
}

/**
 * Runs every bench test file in two batches, the ones likeliest to notice first, and stops at the
 * first failure: true only when every test passed.
 */
function testsPass(copy: string, files: string[], mutated?: string): Run {
  const slow = files.filter((f) => SLOW.test(f));
  const fast = files.filter((f) => !SLOW.test(f));
  const analysisFirst = mutated !== undefined && /analysis\/|curves\.ts/.test(mutated);
  let ms = 0;
  for (const batch of analysisFirst ? [slow, fast] : [fast, slow]) {
    if (!batch.length) continue;
    const r = vitest(copy, batch);
    ms += r.ms;
    if (!r.pass) return { ...r, ms };
  }
  return { pass: true, timedOut: false, ms };
}

function main() {
  if (checkOnly) process.exit(check() ? 0 : 1);
  const copy = makeCopy();
  const cleanup = () => fs.rmSync(copy, { recursive: true, force: true });
  process.on("SIGINT", () => {
    cleanup();
    process.exit(130);
  });
  try {
    const files = testFiles(copy);
    console.log(`Bench tests: ${files.length} files. Checking they pass unmutated…`);
    const base = testsPass(copy, files);
    if (!base.pass) {
      console.error("The bench tests fail without any mutation; fix them first.");
      process.exitCode = 1;
      return;
    }
    console.log(`Baseline green in ${(base.ms / 1000).toFixed(1)} s. ${chosen.length} mutations to run.\n`);
    const survivors: Mutation[] = [];
    const stale: Mutation[] = [];
    let caught = 0;
    for (const [i, m] of chosen.entries()) {
      const file = path.join(copy, m.file);
      const original = fs.readFileSync(file, "utf8");
      const at = locate(original, m);
      if (typeof at === "string") {
        stale.push(m);
        console.log(`[${i + 1}/${chosen.length}] STALE     ${m.file}: ${m.why} (${at})`);
        continue;
      }
      fs.writeFileSync(file, original.slice(0, at) + m.to + original.slice(at + m.from.length));
      let r: ReturnType<typeof testsPass>;
      try {
        r = testsPass(copy, files, m.file);
      } finally {
        fs.writeFileSync(file, original);
      }
      if (r.pass) survivors.push(m);
      else caught++;
      const tag = r.pass ? "SURVIVED" : r.timedOut ? "caught (timeout)" : "caught";
      console.log(`[${i + 1}/${chosen.length}] ${tag.padEnd(9)} ${m.file}: ${m.why} (${(r.ms / 1000).toFixed(1)} s)`);
    }
    const total = caught + survivors.length;
    console.log(`\n${caught}/${total} mutations caught (${total ? ((100 * caught) / total).toFixed(0) : 0} %).`);
    if (stale.length) console.log(`${stale.length} no longer apply (the code moved on): update scripts/mutations/list.ts.`);
    if (survivors.length) {
      console.log("\nSurvivors (the tests did not notice):");
      for (const m of survivors) console.log(`  ${m.file}: ${m.why}\n    - ${m.from}\n    + ${m.to}`);
    }
  } finally {
    cleanup();
  }
}

main();
