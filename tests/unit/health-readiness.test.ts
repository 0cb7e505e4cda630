import { describe, expect, it } from "vitest";
import { createReadiness, DEPENDENCIES, type Dependency, type Probe } from "~/services/health.server";

// The readiness cache with probes that count their calls and a clock the test moves.
function setup(ttlMs = 5_000, failedTtlMs = 1_000) {
  let clock = 1_000_000;
  const calls: Record<Dependency, number> = { database: 0, storage: 0, mail: 0, payments: 0 };
  const failing = new Set<Dependency>();
  const gates: (() => void)[] = [];
  const probe = (name: Dependency): Probe => ({
    mode: "fake",
    run: () => {
      calls[name] += 1;
      // Each probe waits until released, so concurrent callers really overlap it.
      return new Promise<void>((resolve, reject) => gates.push(() => (failing.has(name) ? reject(new Error(`${name} down`)) : resolve())));
    },
  });
  const probes = Object.fromEntries(DEPENDENCIES.map((n) => [n, probe(n)])) as Record<Dependency, Probe>;
  const readiness = createReadiness(() => probes, { ttlMs, failedTtlMs, now: () => clock });
  const release = async () => {
    await new Promise((r) => setImmediate(r));
    gates.splice(0).forEach((open) => open());
  };
  return { readiness, calls, failing, release, advance: (ms: number) => (clock += ms) };
}

describe("readiness checks", () => {
  it("a hundred concurrent calls share one probe per service", async () => {
    const { readiness, calls, release } = setup();
    const pending = Array.from({ length: 100 }, () => readiness());
    await release();
    const answers = await Promise.all(pending);
    expect(calls).toEqual({ database: 1, storage: 1, mail: 1, payments: 1 });
    expect(answers.every((a) => a.ok)).toBe(true);
  });

  it("reuses an answer within the window and probes again after it", async () => {
    const { readiness, calls, release, advance } = setup(5_000);
    const first = readiness();
    await release();
    await first;
    advance(4_999);
    await readiness();
    expect(calls.mail).toBe(1);
    advance(2);
    const again = readiness();
    await release();
    await again;
    expect(calls).toEqual({ database: 2, storage: 2, mail: 2, payments: 2 });
  });

  it("keeps a failure for its shorter window, and reports which service failed", async () => {
    const { readiness, calls, failing, release, advance } = setup(5_000, 1_000);
    failing.add("mail");
    const pending = Array.from({ length: 20 }, () => readiness());
    await release();
    const [answer] = await Promise.all(pending);
    expect(answer.ok).toBe(false);
    expect(answer.checks.mail).toMatchObject({ ok: false, error: "mail down" });
    expect(answer.checks.database.ok).toBe(true);
    await readiness();
    expect(calls.mail).toBe(1);
    // The recovered service is seen after the failure's window, while the others stay cached.
    failing.delete("mail");
    advance(1_001);
    const again = readiness();
    await release();
    expect((await again).ok).toBe(true);
    expect(calls).toEqual({ database: 1, storage: 1, mail: 2, payments: 1 });
  });
});
