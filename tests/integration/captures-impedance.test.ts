import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { Capture } from "~/models/capture.server";
import { ensureBucket, headObject } from "~/services/storage.server";
import { analyseCaptureJob, CAPTURE_JOB_ATTEMPTS } from "~/bench/capture-job.server";
import { action as analyze } from "~/routes/api.v1.captures.analyze";
import { loader as getCapture } from "~/routes/api.v1.captures.$id";
import { action as retry } from "~/routes/api.v1.captures.$id.retry";
import { createDraft } from "~/listings/drafts.server";
import { impedancePlot } from "~/listings/plots-impedance.server";
import { saveBenchSheet } from "~/listings/bench.server";
import { answer } from "../support/bodies";
import { impedanceCsv, logFrequencies, motional, parallelRlc, sum } from "../support/impedance-model";
import { cleanUp, makeAccount, type Seller } from "./listing-support";
import { routeArgs } from "../support/route-args";

// An impedance sweep through the real upload path (multipart → storage → the analysis job →
// readings → a loudspeaker's sheet), and a capture whose job keeps failing on storage trouble: it
// ends failed with a reason once the retries run out, and the owner's retry analyses it.

const storage = vi.hoisted(() => ({ failReads: 0 }));
vi.mock("~/services/storage.server", async (original) => {
  const real = await original<typeof import("~/services/storage.server")>();
  return {
    ...real,
    getObjectBuffer: async (key: string) => {
      if (storage.failReads > 0) {
        storage.failReads -= 1;
        throw new Error("storage stand-in: connection reset");
      }
      return real.getObjectBuffer(key);
    },
  };
});

// A driver: Re 6.3 Ω plus a motional branch of 30 Ω at 45 Hz, Q 5 (tests/reference/bench-impedance.test.ts
// derives such a model's figures): the peak is Re + Res = 36.3 Ω at 45 Hz; above it |Z| falls towards
// Re, so over 20 Hz–20 kHz the minimum is 6.3 Ω at the top. 6.3 Ω ≥ 6.4 Ω? No: below 80 % of 8 Ω.
// Rated 7.5 Ω would need 6.0 Ω (IEC 60268-5 §16.1): met.
const M = motional(30, 45, 5);
const csv = impedanceCsv(logFrequencies(20, 20_000, 24), (f) => sum({ re: 6.3, im: 0 }, parallelRlc(f, 30, M.l, M.c)));

let seller: Seller;
let other: Seller;
beforeAll(async () => {
  await ensureBucket();
  seller = await makeAccount("impedance");
  other = await makeAccount("impedance-other");
});
afterAll(cleanUp);

function post(fields: Record<string, string>) {
  const form = new FormData();
  form.append("file", new Blob([csv], { type: "text/csv" }), "speaker-z.csv");
  for (const [k, v] of Object.entries(fields)) form.append(k, v);
  const request = new Request("http://127.0.0.1/api/v1/captures/analyze?wait=0", {
    method: "POST",
    body: form,
    headers: { Cookie: seller.cookie },
  });
  return answer(() => analyze(routeArgs(request, {})));
}

const get = (id: string, who: Seller) =>
  answer(() => getCapture(routeArgs(new Request(`http://127.0.0.1/api/v1/captures/${id}`, { headers: { Cookie: who.cookie } }), { id })));
const retryAs = (id: string, who: Seller) =>
  answer(() =>
    retry(
      routeArgs(
        new Request(`http://127.0.0.1/api/v1/captures/${id}/retry`, {
          method: "POST",
          headers: { Cookie: who.cookie, Origin: "http://127.0.0.1" },
        }),
        { id },
      ),
    ),
  );

describe("an impedance sweep through the capture API", { timeout: 60_000 }, () => {
  it("the kind is read from the header; the job gives the minimum and the resonance as readings; the sheet earns the mark", async () => {
    const res = await post({ ratedOhm: "8" });
    expect(res.status).toBe(202);
    const row = await Capture.findByPk(res.body.id);
    expect(row).toMatchObject({ kind: "impedance", status: "queued", conditions: { kind: "impedance", ratedOhm: 8 } });
    await analyseCaptureJob({ captureId: row!.id });
    const done = await get(row!.id, seller);
    expect(done.body).toMatchObject({ status: "done", kind: "impedance", analysis: { kind: "impedance", rated: { meets: false } } });
    const min = done.body.readings.find((r: { quantity: string }) => r.quantity === "impedance_minimum");
    expect(min.value).toBeCloseTo(6.3, 2);
    const fs = done.body.readings.find((r: { quantity: string }) => r.quantity === "resonance_frequency");
    expect(fs.value).toBeCloseTo(45, 0);

    // Its plot: the points against frequency, the floor at 80 % of the stated 8 Ω.
    const plot = impedancePlot((await Capture.findByPk(row!.id))!);
    expect(plot).toMatchObject({ floorOhm: 6.4, title: "Impedance against frequency" });
    expect(plot!.points.length).toBeGreaterThan(200);
    expect(plot!.points.every((p, i, all) => i === 0 || p.f > all[i - 1].f)).toBe(true);

    // On a loudspeaker's sheet: rated 7.5 Ω is met (floor 6.0 Ω) and earns the mark; rated 8 Ω is not (floor 6.4 Ω).
    const draft = await createDraft(seller.session, "loudspeaker");
    const sheet = (ratedOhm: number) => ({
      category: "loudspeaker",
      equipment: { maker: "Tarnwick", model: "Z-8" },
      measuredOn: "2026-11-30",
      measuredBy: "Bench 3",
      sweeps: [],
      readings: [
        { quantity: "nominal_impedance", value: ratedOhm, unit: "Ω", basis: "rated" },
        { quantity: "sensitivity", value: 87, unit: "dB SPL", basis: "measured", conditions: { voltageV: Math.sqrt(8), distanceM: 1 } },
        { ...min, captureId: row!.id },
      ],
    });
    const ok = await saveBenchSheet(draft.id, seller.user.id, sheet(7.5));
    expect(ok.sheet.readings.filter((r) => r.origin === "capture").map((r) => r.quantity)).toEqual([
      "impedance_minimum",
      "resonance_frequency",
    ]);
    expect(ok.verdict.benchVerified).toBe(true);
    const low = await saveBenchSheet(draft.id, seller.user.id, sheet(8));
    expect(low.verdict.benchVerified).toBe(false);
    const caught = low.verdict.results.find((r) => r.ruleId === "speaker-impedance-minimum");
    expect(caught?.outcome).toBe("questionable");
  });
});

describe("a capture whose job keeps failing on storage trouble", { timeout: 60_000 }, () => {
  it("stays queued through the retries, ends failed with a reason on the last, and the owner's retry analyses it", async () => {
    const res = await post({ kind: "impedance" });
    expect(res.status).toBe(202);
    const id: string = res.body.id;
    storage.failReads = CAPTURE_JOB_ATTEMPTS;
    // pg-boss runs the job once and retries it twice (retryLimit 2): the first two throw for a retry.
    for (let attempt = 1; attempt < CAPTURE_JOB_ATTEMPTS; attempt++) {
      await expect(analyseCaptureJob({ captureId: id })).rejects.toThrow("connection reset");
      expect(await Capture.findByPk(id)).toMatchObject({ status: "queued", attempts: attempt });
    }
    expect(await analyseCaptureJob({ captureId: id })).toEqual({ status: "failed" });
    const failed = await Capture.findByPk(id);
    expect(failed).toMatchObject({ status: "failed", errorCode: "analysis_failed", attempts: CAPTURE_JOB_ATTEMPTS });
    expect(failed!.errorMessage).toMatch(/after 3 attempts: storage or database trouble on our side/);
    // The file is kept for the retry.
    expect(await headObject(failed!.storageKey!)).toMatchObject({ contentLength: csv.length });

    const seen = await get(id, seller);
    expect(seen.body).toMatchObject({ status: "failed", error: { error: "analysis_failed" }, retry: `/api/v1/captures/${id}/retry` });

    expect((await retryAs(id, other)).status).toBe(404);
    const again = await retryAs(id, seller);
    expect(again.status).toBe(202);
    expect(await Capture.findByPk(id)).toMatchObject({ status: "queued", attempts: 0, errorCode: null });
    expect(await analyseCaptureJob({ captureId: id })).toEqual({ status: "done" });
    const done = await get(id, seller);
    expect(done.body.status).toBe("done");
    expect(done.body.retry).toBeUndefined();
    // A finished capture is not queued again.
    expect(await retryAs(id, seller)).toMatchObject({ status: 409, body: { error: "conflict" } });
  });
});
