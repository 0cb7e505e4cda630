import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { ListObjectsV2Command } from "@aws-sdk/client-s3";
import { randomUUID } from "node:crypto";
import { sequelize } from "~/db.server";
import { env } from "~/env.server";
import { User } from "~/models/user.server";
import { Capture } from "~/models/capture.server";
import { signedInCookie } from "../support/sessions";
import { createStorageClient, ensureBucket, headObject } from "~/services/storage.server";
import { QUEUES, startBoss } from "~/services/jobs.server";
import { analyseCaptureJob } from "~/bench/capture-job.server";
import { action as analyze } from "~/routes/api.v1.captures.analyze";
import { loader as show } from "~/routes/api.v1.captures.$id";
import { parseBenchSheet } from "@shared/bench/schema";
import { prng, toneWav, wavFromSamples } from "../support/capture-files";
import { routeArgs } from "../support/route-args";

// The capture API against the real database, object storage stand-in and job queue.

const BASE = "http://127.0.0.1";
let owner: User;
let stranger: User;
let ownerCookie: string;
let strangerCookie: string;

function upload(parts: Record<string, string | Blob>, { cookie = ownerCookie, wait = 0, name = "capture.wav" } = {}) {
  const form = new FormData();
  for (const [k, v] of Object.entries(parts)) {
    if (v instanceof Blob) form.append(k, v, name);
    else form.append(k, v);
  }
  return new Request(`${BASE}/api/v1/captures/analyze?wait=${wait}`, {
    method: "POST",
    body: form,
    headers: cookie ? { Cookie: cookie } : {},
  });
}

async function post(req: Request): Promise<Response> {
  try {
    return await analyze(routeArgs(req, {}));
  } catch (thrown) {
    if (thrown instanceof Response) return thrown;
    throw thrown;
  }
}

async function get(id: string, cookie = ownerCookie): Promise<Response> {
  const request = new Request(`${BASE}/api/v1/captures/${id}`, { headers: { Cookie: cookie } });
  return await show(routeArgs(request, { id }));
}

async function storedCaptureKeys(): Promise<string[]> {
  const out = await createStorageClient().send(new ListObjectsV2Command({ Bucket: env().s3.bucket, Prefix: "captures/" }));
  return (out.Contents ?? []).map((o) => o.Key!);
}

const sineConditions = JSON.stringify({
  kind: "sine",
  scale: { kind: "analyser", fullScaleVolts: 2, basis: "rms", attenuation: 10 },
  loadOhm: 8,
  fundamentalHz: 1000,
});
const wavBlob = (bytes: Uint8Array) => new Blob([new Uint8Array(bytes)], { type: "audio/wav" });
const goodWav = () => toneWav({ sampleRate: 48_000, seconds: 1, f0: 1000, harmonics: [1, 0.001], peak: 0.5, bits: "24", channels: 2 });

beforeAll(async () => {
  await ensureBucket();
  const tag = randomUUID().slice(0, 8);
  owner = await User.create({
    email: `bench-owner-${tag}@example.test`,
    displayName: "Bench owner",
    passwordHash: null,
    emailVerifiedAt: new Date(),
    lastSignInAt: null,
  });
  stranger = await User.create({
    email: `bench-other-${tag}@example.test`,
    displayName: "Someone else",
    passwordHash: null,
    emailVerifiedAt: new Date(),
    lastSignInAt: null,
  });
  ownerCookie = await signedInCookie(owner);
  strangerCookie = await signedInCookie(stranger);
});

afterAll(async () => {
  await Capture.destroy({ where: { ownerId: [owner.id, stranger.id] } });
  await User.destroy({ where: { id: [owner.id, stranger.id] } });
});

describe("POST /api/v1/captures/analyze", () => {
  it("needs a signed-in account: 401 JSON", async () => {
    const res = await post(upload({ file: wavBlob(goodWav()), conditions: sineConditions }, { cookie: "" }));
    expect(res.status).toBe(401);
    expect(await res.json()).toMatchObject({ error: "unauthenticated" });
  });

  it("stores file, row and job together and answers 202 with where to poll; the job then fills in the analysis", async () => {
    const res = await post(upload({ file: wavBlob(goodWav()), conditions: sineConditions }));
    expect(res.status).toBe(202);
    const body = await res.json();
    expect(body).toEqual({ id: expect.any(String), status: "queued", poll: `/api/v1/captures/${body.id}` });

    const row = await Capture.findByPk(body.id);
    expect(row).toMatchObject({ ownerId: owner.id, kind: "sine", status: "queued", fileName: "capture.wav" });
    expect(await headObject(row!.storageKey!)).not.toBeNull();
    const [jobs] = await sequelize.query(`SELECT state FROM pgboss.job WHERE name = $1 AND data->>'captureId' = $2`, {
      bind: [QUEUES.captureAnalyze, body.id],
    });
    expect(jobs).toHaveLength(1);

    const queued = await (await get(body.id)).json();
    expect(queued.status).toBe("queued");
    expect(queued.analysis).toBeUndefined();

    await analyseCaptureJob({ captureId: body.id });
    const done = await (await get(body.id)).json();
    expect(done.status).toBe("done");
    expect(done.format).toMatchObject({ file: "wav", encoding: "pcm", bitDepth: 24, channels: 2, sampleRate: 48_000 });
    const left = done.analysis.channels[0];
    expect(left.fundamental.rms).toEqual({ value: expect.closeTo(10, 4), unit: "V" });
    expect(left.fundamental.power).toEqual({ value: expect.closeTo(12.5, 3), unit: "W" });
    expect(left.thd.ratio).toBeCloseTo(0.001, 5);
    // The readings are bench-sheet readings from a capture, and fit the sheet schema.
    expect(done.readings.every((r: { origin: string; captureId: string }) => r.origin === "capture" && r.captureId === body.id)).toBe(true);
    const sheet = parseBenchSheet({ category: "integrated_amplifier", readings: done.readings, sweeps: [] });
    expect(sheet.ok).toBe(true);
  });

  it("answers 200 with the analysis when a worker finishes within the wait", async () => {
    const boss = await startBoss({ supervise: false, schedule: false });
    try {
      await boss.work(QUEUES.captureAnalyze, { pollingIntervalSeconds: 0.5 }, async ([job]) => {
        await analyseCaptureJob(job.data);
      });
      const res = await post(upload({ file: wavBlob(goodWav()), conditions: sineConditions }, { wait: 10 }));
      expect(res.status).toBe(200);
      const body = await res.json();
      expect(body.status).toBe("done");
      expect(body.readings.find((r: { quantity: string }) => r.quantity === "thd")).toMatchObject({
        value: expect.closeTo(0.001, 5),
        unit: "%",
        basis: "measured",
      });
    } finally {
      await boss.stop({ graceful: false, wait: true });
    }
  });

  it("takes curl-style form fields and infers a sweep from the CSV header", async () => {
    const csv = "frequency,level\n20,-0.4\n1000,0\n20000,-0.6\n";
    const res = await post(upload({ file: new Blob([csv], { type: "text/csv" }), reference: "flat", loadOhm: "8" }, { name: "sweep.csv" }));
    expect(res.status).toBe(202);
    const { id } = await res.json();
    await analyseCaptureJob({ captureId: id });
    const done = await (await get(id)).json();
    expect(done.kind).toBe("sweep");
    expect(done.analysis.worstDeviation).toEqual({
      deviation: { value: expect.closeTo(-0.6, 9), unit: "dB" },
      frequency: { value: 20_000, unit: "Hz" },
    });
    expect(done.sweep).toMatchObject({ kind: "flat", origin: "capture", captureId: id });
  });

  it("refuses what the first bytes rule out with its code and message, and stores nothing", async () => {
    const before = await storedCaptureKeys();
    const rows = await Capture.count({ where: { ownerId: owner.id } });
    const res = await post(upload({ file: new Blob(["just some notes"], { type: "audio/wav" }), conditions: sineConditions }));
    expect(res.status).toBe(422);
    expect(await res.json()).toEqual({ error: "not_wav", message: '"capture.wav" is named as a WAV but holds text, not audio.' });
    const sweepOfWav = await post(upload({ file: wavBlob(goodWav()), conditions: JSON.stringify({ kind: "sweep", reference: "flat" }) }));
    expect(sweepOfWav.status).toBe(422);
    expect((await sweepOfWav.json()).error).toBe("kind_mismatch");
    expect(await Capture.count({ where: { ownerId: owner.id } })).toBe(rows);
    expect(await storedCaptureKeys()).toEqual(before);
  });

  it("a clipped capture is the job's to refuse: the upload is queued, then fails with the same code and message", async () => {
    const clipped = toneWav({ sampleRate: 48_000, seconds: 1, f0: 1000, peak: 1.5, bits: "16", channels: 1 });
    const res = await post(upload({ file: wavBlob(clipped), conditions: sineConditions }));
    expect(res.status).toBe(202);
    const { id } = await res.json();
    const key = (await Capture.findByPk(id))!.storageKey!;
    await analyseCaptureJob({ captureId: id });
    const failed = await (await get(id)).json();
    expect(failed).toMatchObject({
      status: "failed",
      error: { error: "clipped", message: expect.stringMatching(/^The mono channel sits at digital full scale for \d+ samples/) },
    });
    expect(await headObject(key)).toBeNull();
  });

  it("with ?wait=, a capture the job refuses answers 422 with the reason in the one shape (and where to read it again)", async () => {
    const boss = await startBoss({ supervise: false, schedule: false });
    try {
      await boss.work(QUEUES.captureAnalyze, { pollingIntervalSeconds: 0.5 }, async ([job]) => {
        await analyseCaptureJob(job.data);
      });
      const short = toneWav({ sampleRate: 48_000, seconds: 0.05, f0: 1000, peak: 0.5, bits: "16", channels: 1 });
      const res = await post(upload({ file: wavBlob(short), conditions: sineConditions }, { wait: 10 }));
      expect(res.status).toBe(422);
      const body = await res.json();
      expect(body).toEqual({
        error: "too_short",
        message: expect.stringContaining("a 5 Hz resolution needs at least 0.200 s"),
        id: expect.any(String),
        poll: `/api/v1/captures/${body.id}`,
      });
    } finally {
      await boss.stop({ graceful: false, wait: true });
    }
  });

  it("over 50 MB: 413, refused from the Content-Length before the body is read", async () => {
    const req = new Request(`${BASE}/api/v1/captures/analyze?wait=0`, {
      method: "POST",
      body: "x",
      headers: { Cookie: ownerCookie, "Content-Type": "multipart/form-data; boundary=b", "Content-Length": String(60 * 1024 * 1024) },
    });
    const res = await post(req);
    expect(res.status).toBe(413);
    expect(await res.json()).toEqual({ error: "file_too_large", message: "The upload is 60 MB; captures are limited to 50 MB." });
  });

  it("conditions that do not fit: 400 with the path of each problem", async () => {
    const res = await post(upload({ file: wavBlob(goodWav()), conditions: JSON.stringify({ kind: "sine", loadOhm: -8 }) }));
    expect(res.status).toBe(400);
    const body = await res.json();
    expect(body.error).toBe("invalid_conditions");
    expect(body.issues.map((i: { path: string }) => i.path)).toEqual(expect.arrayContaining(["scale", "loadOhm"]));
    const missing = await post(upload({ conditions: sineConditions }));
    expect(missing.status).toBe(400);
    expect((await missing.json()).error).toBe("no_file");
  });

  it("if the row cannot be written, the stored file is removed again", async () => {
    const before = await storedCaptureKeys();
    const spy = vi.spyOn(Capture, "create").mockRejectedValueOnce(new Error("database went away"));
    try {
      const res = await post(upload({ file: wavBlob(goodWav()), conditions: sineConditions }));
      expect(res.status).toBe(500);
      expect(await res.json()).toEqual({ error: "server_error", message: expect.stringContaining("try again") });
    } finally {
      spy.mockRestore();
    }
    expect(await storedCaptureKeys()).toEqual(before);
  });

  it("a capture the analysis refuses ends as failed with the reason, and its file is removed", async () => {
    const r = prng(9);
    const hiss = wavFromSamples([Float64Array.from({ length: 48_000 }, () => (r() - 0.5) * 0.01)], 48_000, "24");
    const res = await post(upload({ file: wavBlob(hiss), conditions: sineConditions }));
    expect(res.status).toBe(202);
    const { id } = await res.json();
    const key = (await Capture.findByPk(id))!.storageKey!;
    await analyseCaptureJob({ captureId: id });
    const failed = await (await get(id)).json();
    expect(failed.status).toBe("failed");
    expect(failed.error.error).toBe("no_fundamental");
    expect(failed.error.message).toContain("within ±10 % of the stated 1000 Hz");
    expect(await headObject(key)).toBeNull();
  });
});

describe("GET /api/v1/captures/:id", () => {
  it("is the owner's only: someone else, an unknown id and a malformed id all get 404", async () => {
    const res = await post(upload({ file: wavBlob(goodWav()), conditions: sineConditions }));
    const { id } = await res.json();
    expect((await get(id)).status).toBe(200);
    const other = await get(id, strangerCookie);
    expect(other.status).toBe(404);
    expect(await other.json()).toEqual({ error: "not_found", message: "No capture of yours has that id." });
    expect((await get(randomUUID())).status).toBe(404);
    expect((await get("not-an-id")).status).toBe(404);
  });
});
