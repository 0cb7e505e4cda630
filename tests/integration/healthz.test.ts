import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { startMailCatcher, type RunningMailCatcher } from "../../fakes/mail-catcher";
import { startS3Fake, type RunningS3Fake } from "../../fakes/s3";
import { startStripeFake, type RunningStripeFake } from "../../fakes/stripe/index";

// Readiness (GET /healthz/ready, and /healthz) reports each service Loadline needs from checks kept
// for a few seconds; liveness (GET /healthz/live) answers without touching any of them.

// Every probe is counted: the storage, mail and payments pings here, database queries by a hook.
const probes = vi.hoisted(() => ({ storage: 0, mail: 0, payments: 0, database: 0 }));
vi.mock("~/services/storage.server", async (original) => {
  const m = await original<typeof import("~/services/storage.server")>();
  return { ...m, ping: () => (probes.storage++, m.ping()) };
});
vi.mock("~/services/mail.server", async (original) => {
  const m = await original<typeof import("~/services/mail.server")>();
  return { ...m, ping: () => (probes.mail++, m.ping()) };
});
vi.mock("~/services/payments.server", async (original) => {
  const m = await original<typeof import("~/services/payments.server")>();
  return { ...m, ping: () => (probes.payments++, m.ping()) };
});

const get = (path: string) => new Request(`http://127.0.0.1${path}`);

describe("health", () => {
  const dir = mkdtempSync(path.join(tmpdir(), "loadline-health-"));
  let s3: RunningS3Fake;
  let mail: RunningMailCatcher;
  let payments: RunningStripeFake;
  let ready: typeof import("~/routes/healthz").loader;
  let live: typeof import("~/routes/healthz.live").loader;
  let ttl: number;

  beforeAll(async () => {
    [s3, mail, payments] = await Promise.all([
      startS3Fake({ port: 0, directory: dir, buckets: ["loadline-health"] }),
      startMailCatcher({ smtpPort: 0, httpPort: 0 }),
      startStripeFake({ port: 0, secretKey: "sk_test_loadline_local" }),
    ]);
    for (const k of ["S3_ENDPOINT", "SMTP_URL", "STRIPE_SECRET_KEY", "STRIPE_WEBHOOK_SECRET"]) vi.stubEnv(k, undefined);
    vi.stubEnv("S3_BUCKET", "loadline-health");
    vi.stubEnv("FAKE_S3_PORT", new URL(s3.endpoint).port);
    vi.stubEnv("FAKE_SMTP_PORT", new URL(mail.smtpUrl).port);
    vi.stubEnv("FAKE_STRIPE_PORT", String(payments.port));
    vi.resetModules();
    ({ loader: ready } = await import("~/routes/healthz"));
    ({ loader: live } = await import("~/routes/healthz.live"));
    ttl = (await import("~/services/health.server")).CHECK_TTL_MS;
    const { sequelize } = await import("~/db.server");
    sequelize.addHook("beforeQuery", () => {
      probes.database++;
    });
    // Only Date is faked: the cache's clock moves on when told to, sockets and timers run as usual.
    vi.useFakeTimers({ toFake: ["Date"] });
  });
  afterAll(async () => {
    vi.useRealTimers();
    await Promise.all([s3?.stop(), mail?.stop(), payments?.stop()]);
    const { sequelize } = await import("~/db.server");
    await sequelize.close().catch(() => {});
    vi.unstubAllEnvs();
    rmSync(dir, { recursive: true, force: true });
  });
  const nextWindow = () => vi.setSystemTime(Date.now() + ttl + 1);
  const counted = () => ({ ...probes });

  it("readiness answers 200 when the database, storage, mail and payments all answer", async () => {
    const res = await ready();
    expect(res.status).toBe(200);
    expect(res.headers.get("Cache-Control")).toBe("no-store");
    const body = await res.json();
    expect(body.ok).toBe(true);
    for (const name of ["database", "storage", "mail", "payments"]) {
      expect(body.checks[name]).toMatchObject({ ok: true, ms: expect.any(Number), checkedAt: expect.any(String) });
    }
    expect(body.checks.storage.mode).toBe("fake");
    expect(body.checks.payments.mode).toBe("fake");
  });

  it("fifty concurrent readiness calls probe each service once; within the window, not at all", async () => {
    nextWindow();
    const before = counted();
    const answers = await Promise.all(Array.from({ length: 50 }, () => ready()));
    expect(answers.every((r) => r.status === 200)).toBe(true);
    const after = counted();
    for (const name of ["storage", "mail", "payments", "database"] as const) expect(after[name] - before[name]).toBe(1);

    await Promise.all(Array.from({ length: 50 }, () => ready()));
    expect(counted()).toEqual(after);

    nextWindow();
    await ready();
    for (const name of ["storage", "mail", "payments", "database"] as const) expect(probes[name] - after[name]).toBe(1);
  });

  it("readiness answers 503 and names the service once its next check fails", async () => {
    await mail.stop();
    nextWindow();
    const res = await ready();
    expect(res.status).toBe(503);
    const body = await res.json();
    expect(body.ok).toBe(false);
    expect(body.checks.mail).toMatchObject({ ok: false, mode: "fake", error: expect.any(String) });
    expect(body.checks.database.ok).toBe(true);
    expect(body.checks.storage.ok).toBe(true);
  });

  it("liveness does no I/O: 200 with the database pool closed, and nothing probed", async () => {
    const { sequelize } = await import("~/db.server");
    await sequelize.close();
    const before = counted();
    const res = live();
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ ok: true });
    expect(counted()).toEqual(before);
    // …while readiness, checking again, sees the database gone.
    nextWindow();
    expect((await (await ready()).json()).checks.database.ok).toBe(false);
  });
});
