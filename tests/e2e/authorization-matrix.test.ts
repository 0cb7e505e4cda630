import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { sequelize } from "~/db.server";
import { Agent, inParallel, type Answer, type Body } from "./support/http";
import { makeFixtures, PERSONAS, removeFixtures, signInAll, signInAs, type Fixtures, type Persona } from "./support/matrix-fixtures";
import { dataPath, fill, routeLeaves, type RouteLeaf } from "./support/route-table";
import {
  apiErrorShapeProblem,
  describeAnswer,
  describeOutcome,
  matches,
  METHODS,
  outcomeFor,
  outcomeOf,
  type ByPersona,
  type Case,
  type Outcome,
  type Write,
} from "./support/matrix";
import { MATRIX } from "./authorization-matrix.table";

// Proof of who may reach what, over real HTTP against the built app: every page (document and
// `.data`), page action and API method from app/routes.ts, for each persona, against the table in
// authorization-matrix.table.ts. A route without an entry there fails here, by name.

const leaves = routeLeaves();
const byPattern = new Map(leaves.map((l) => [l.pattern, l]));

interface Probe {
  route: string;
  label: string;
  persona: Persona;
  method: string;
  path: string;
  /** The address as the visitor asked for it (what sign-in should bring them back to). */
  returnTo: string;
  /** The case's params, for redirect targets written as patterns. */
  params: Record<string, string>;
  viaData: boolean;
  body?: Body;
  expected: Outcome;
  api: boolean;
  last?: boolean;
  fresh?: boolean;
}

function tableProblems(leaf: RouteLeaf): string[] {
  const entry = MATRIX[leaf.pattern];
  if (!entry) return [`${leaf.pattern} (app/${leaf.file}) has no entry in tests/e2e/authorization-matrix.table.ts: say who may reach it`];
  const problems: string[] = [];
  const has = (pick: (c: Case) => unknown) => entry.cases.some((c) => pick(c) !== undefined);
  if (leaf.kind === "page") {
    if (leaf.hasAction && !has((c) => c.post)) problems.push(`${leaf.pattern} has an action but its entry has no \`post\` row`);
    if (!leaf.hasAction && has((c) => c.post)) problems.push(`${leaf.pattern} has no action but its entry has a \`post\` row`);
    if (has((c) => c.writes)) problems.push(`${leaf.pattern} is a page: its action goes in \`post\`, not \`writes\``);
  } else {
    if (leaf.hasAction !== has((c) => c.writes))
      problems.push(
        `${leaf.pattern} ${leaf.hasAction ? "has an action but its entry lists no writes" : "has no action but its entry lists writes"}`,
      );
    // A loader that only answers 405 still needs its row (say so: everyone(405)).
    if (leaf.hasLoader !== has((c) => c.get))
      problems.push(
        `${leaf.pattern} ${leaf.hasLoader ? "has a loader but its entry has no `get` row" : "has no loader but its entry has a `get` row"}`,
      );
    if (has((c) => c.post)) problems.push(`${leaf.pattern} is a resource route: list its methods in \`writes\``);
  }
  for (const c of entry.cases) {
    for (const row of [c.get, c.post?.expect, ...Object.values(c.writes ?? {}).map((w) => w.expect)]) {
      const missing = row ? PERSONAS.filter((p) => outcomeFor(row, p) === undefined) : [];
      if (missing.length) problems.push(`${leaf.pattern}${c.name ? ` [${c.name}]` : ""}: no outcome for ${missing.join(", ")}`);
    }
  }
  return problems;
}

function probesFor(leaf: RouteLeaf, f: Fixtures): Probe[] {
  const entry = MATRIX[leaf.pattern];
  if (!entry || tableProblems(leaf).length) return [];
  const api = leaf.pattern.startsWith("/api/");
  const out: Probe[] = [];
  type At = { c: Case; path: string; params: Record<string, string> };
  type Rest = Pick<Probe, "method" | "path" | "viaData"> & Partial<Probe>;
  const at = (c: Case): At => {
    const params = c.params?.(f) ?? {};
    return { c, params, path: fill(leaf.pattern, params) };
  };
  const add = ({ c, path, params }: At, persona: Persona, expected: Outcome, rest: Rest) =>
    out.push({ route: leaf.pattern, label: c.name ? `[${c.name}] ` : "", returnTo: path, params, api, persona, expected, ...rest });
  const forEach = (where: At, row: ByPersona, rest: Rest) => {
    for (const persona of PERSONAS) add(where, persona, outcomeOf(row, persona), rest);
  };
  const writeOf = (w: Write) => ({ body: w.body?.(f), last: w.last, fresh: w.fresh });
  const declared = new Set<string>();
  for (const c of entry.cases) {
    const where = at(c);
    const { path } = where;
    if (leaf.kind === "page") {
      if (c.get) {
        forEach(where, c.get, { method: "GET", path, viaData: false });
        forEach(where, c.get, { method: "GET", path: dataPath(path), viaData: true });
      }
      if (c.post) {
        // Single fetch runs the action alone, so the answer is the action's own decision.
        forEach(where, c.post.expect, { method: "POST", path: dataPath(path), viaData: true, ...writeOf(c.post) });
        // A form posted without scripts: a visitor is sent to sign in and back, as for a GET.
        add(where, "anonymous", outcomeOf(c.post.expect, "anonymous"), { method: "POST", path, viaData: false, ...writeOf(c.post) });
      }
      continue;
    }
    if (c.get) forEach(where, c.get, { method: "GET", path, viaData: false });
    for (const [method, w] of Object.entries(c.writes ?? {})) forEach(where, w.expect, { method, path, viaData: false, ...writeOf(w) });
    if (c.get) declared.add("GET");
    for (const method of Object.keys(c.writes ?? {})) declared.add(method);
  }
  // Methods a route does not take: 405, asked once per route by a signed-in owner.
  const first = at(entry.cases[0]);
  const { path } = first;
  if (leaf.kind === "page" && !leaf.hasAction) add(first, "owner", 405, { method: "POST", path, viaData: false, body: { form: {} } });
  if (leaf.kind === "resource") {
    for (const method of METHODS.filter((m) => !declared.has(m))) {
      add(first, "owner", 405, { method, path, viaData: false, body: method === "GET" ? undefined : { json: {} } });
    }
  }
  return out;
}

function judge(probe: Probe, answer: Answer): string | null {
  const where = `${probe.label}${probe.method} ${probe.path} as ${probe.persona}`;
  if (!matches(probe.expected, answer, probe.returnTo, probe.viaData, (target) => fill(target, probe.params))) {
    return `${where}: expected ${describeOutcome(probe.expected)}, got ${describeAnswer(answer)}`;
  }
  if (probe.api && answer.status >= 400 && answer.status < 500) {
    const problem = apiErrorShapeProblem(answer);
    if (problem) return `${where}: ${answer.status} is not in the API's error shape {error, message}: ${problem}`;
  }
  return null;
}

describe("authorization matrix", () => {
  let f: Fixtures;
  const failures = new Map<string, string[]>();
  let probeCount = 0;

  beforeAll(async () => {
    f = await makeFixtures("matrix");
    const agents = await signInAll(f);
    const probes = leaves.flatMap((leaf) => probesFor(leaf, f));
    probeCount = probes.length;
    const run = (probe: Probe) => async () => {
      const agent = !probe.fresh
        ? agents[probe.persona]
        : probe.persona === "anonymous"
          ? new Agent("anonymous")
          : await signInAs(f, probe.persona);
      let problem: string | null;
      try {
        problem = judge(probe, await agent.request(probe.method, probe.path, { body: probe.body }));
      } catch (error) {
        problem = `${probe.label}${probe.method} ${probe.path} as ${probe.persona}: the request failed: ${String(error)}`;
      }
      if (problem) failures.set(probe.route, [...(failures.get(probe.route) ?? []), problem]);
    };
    // Others try first: were their refusal broken, the owner's delete would otherwise hide it.
    const last = (p: Probe) => p.last && p.persona === "owner";
    await inParallel(probes.filter((p) => !last(p)).map(run), 8);
    await inParallel(probes.filter(last).map(run), 8);
    console.log(
      `[matrix] ${probes.length} requests over ${leaves.length} routes; ${[...failures.values()].flat().length} differ from the table`,
    );
    // Every route is probed here, for every persona: the time grows with the route table.
  }, 300_000);

  afterAll(async () => {
    await removeFixtures(f);
    await sequelize.close();
  });

  it("has an entry for every route in app/routes.ts, and none for a route that is gone", () => {
    const missing = leaves.filter((l) => !MATRIX[l.pattern]).map((l) => `${l.pattern} (app/${l.file})`);
    const gone = Object.entries(MATRIX)
      .filter(([pattern, e]) => !byPattern.has(pattern) && !e.upcoming)
      .map(([pattern]) => pattern);
    expect(missing, `Routes without an entry in tests/e2e/authorization-matrix.table.ts: ${missing.join(", ")}`).toEqual([]);
    expect(gone, `Entries for routes app/routes.ts no longer has: ${gone.join(", ")}`).toEqual([]);
    expect(probeCount).toBeGreaterThan(leaves.length * PERSONAS.length);
  });

  for (const leaf of leaves) {
    it(`${leaf.pattern}: each persona gets what the table says`, () => {
      const problems = [...tableProblems(leaf), ...(failures.get(leaf.pattern) ?? [])];
      expect(problems, `\n${problems.join("\n")}\n`).toEqual([]);
    });
  }
});
