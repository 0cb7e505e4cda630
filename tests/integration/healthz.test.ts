import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { startMailCatcher, type RunningMailCatcher } from "../../fakes/mail-catcher";
import { startS3Fake, type RunningS3Fake } from "../../fakes/s3";
import { startStripeFake, type RunningStripeFake } from "../../fakes/stripe/index";

// GET /healthz reports each service Loadline needs, and turns 503 when one stops answering.
describe("GET /healthz", () => {
  const dir = mkdtempSync(path.join(tmpdir(), "loadline-health-"));
  let s3: RunningS3Fake;
  let mail: RunningMailCatcher;
  let payments: RunningStripeFake;
  let loader: typeof import("~/routes/healthz").loader;

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
    ({ loader } = await import("~/routes/healthz"));
  });
  afterAll(async () => {
    await Promise.all([s3?.stop(), mail?.stop(), payments?.stop()]);
    const { sequelize } = await import("~/db.server");
    await sequelize.close();
    vi.unstubAllEnvs();
    rmSync(dir, { recursive: true, force: true });
  });

  it("answers 200 when the database, storage, mail and payments all answer", async () => {
    const res = await loader();
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body.ok).toBe(true);
    for (const name of ["database", "storage", "mail", "payments"]) {
      expect(body.checks[name]).toMatchObject({ ok: true, ms: expect.any(Number) });
    }
    expect(body.checks.storage.mode).toBe("fake");
    expect(body.checks.payments.mode).toBe("fake");
  });

  it("answers 503 and names the service when one stops answering", async () => {
    await mail.stop();
    const res = await loader();
    expect(res.status).toBe(503);
    const body = await res.json();
    expect(body.ok).toBe(false);
    expect(body.checks.mail).toMatchObject({ ok: false, mode: "fake", error: expect.any(String) });
    expect(body.checks.database.ok).toBe(true);
    expect(body.checks.storage.ok).toBe(true);
  });
});
