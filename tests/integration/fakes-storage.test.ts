import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { startS3Fake, type RunningS3Fake } from "../../fakes/s3";

// The app's object-storage client (app/services/storage.server.ts) against the s3rver stand-in,
// on a free port of its own so it never meets a running dev server.
describe("object storage stand-in", () => {
  const dir = mkdtempSync(path.join(tmpdir(), "loadline-s3-"));
  let fake: RunningS3Fake;
  let storage: typeof import("~/services/storage.server");

  beforeAll(async () => {
    fake = await startS3Fake({ port: 0, directory: dir, buckets: ["loadline-test-media"] });
    vi.stubEnv("S3_ENDPOINT", undefined);
    vi.stubEnv("FAKE_S3_PORT", new URL(fake.endpoint).port);
    vi.stubEnv("S3_BUCKET", "loadline-test-media");
    vi.resetModules();
    storage = await import("~/services/storage.server");
  });
  afterAll(async () => {
    await fake?.stop();
    vi.unstubAllEnvs();
    rmSync(dir, { recursive: true, force: true });
  });

  it("stores a photo and gives back the same bytes, type and size", async () => {
    const key = storage.randomKey("photos", ".JPG");
    expect(key).toMatch(/^photos\/\d{4}\/\d{2}\/[0-9a-f-]{36}\.jpg$/);
    const bytes = Buffer.from([0xff, 0xd8, 0xff, 0xe0, 1, 2, 3, 4, 0xff, 0xd9]);
    await storage.putObject(key, bytes, { contentType: "image/jpeg", metadata: { listing: "demo-1" } });

    const head = await storage.headObject(key);
    expect(head).toMatchObject({ contentType: "image/jpeg", contentLength: bytes.length, metadata: { listing: "demo-1" } });
    const got = await storage.getObject(key);
    expect(got?.contentType).toBe("image/jpeg");
    const chunks: Buffer[] = [];
    for await (const c of got!.body) chunks.push(Buffer.from(c));
    expect(Buffer.concat(chunks).equals(bytes)).toBe(true);
  });

  it("answers null for a key that does not exist", async () => {
    expect(await storage.getObject("photos/none.jpg")).toBeNull();
    expect(await storage.headObject("photos/none.jpg")).toBeNull();
  });

  it("deletes one object and a batch of objects", async () => {
    const keys = ["captures/a.wav", "captures/b.wav", "captures/c.wav"];
    for (const k of keys) await storage.putObject(k, "RIFF", { contentType: "audio/wav" });
    await storage.deleteObject(keys[0]);
    expect(await storage.headObject(keys[0])).toBeNull();
    await storage.deleteObjects(keys.slice(1));
    for (const k of keys) expect(await storage.getObjectBuffer(k)).toBeNull();
  });

  it("keeps objects in its folder across a restart, and ensureBucket leaves an existing bucket alone", async () => {
    await storage.putObject("photos/keep.png", "png-bytes", { contentType: "image/png" });
    const port = Number(new URL(fake.endpoint).port);
    await fake.stop();
    fake = await startS3Fake({ port, directory: dir, buckets: ["loadline-test-media"] });
    await storage.ping();
    await storage.ensureBucket();
    expect((await storage.getObjectBuffer("photos/keep.png"))?.toString()).toBe("png-bytes");
  });
});
