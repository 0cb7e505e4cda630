import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { Capture } from "~/models/capture.server";
import { ensureBucket, headObject } from "~/services/storage.server";
import { analyseCaptureJob } from "~/bench/capture-job.server";
import { HEADER_BYTES } from "~/bench/captures.server";
import { action as analyze } from "~/routes/api.v1.captures.analyze";
import { answer } from "../support/bodies";
import { toneWav } from "../support/capture-files";
import { cleanUp, makeAccount, type Seller } from "./listing-support";
import { routeArgs } from "../support/route-args";

// A capture upload only streams the file to storage and reads its header in the web process; the
// decoding and the analysis (seconds of CPU for a large file) run in the worker's job. The decoder
// and the analysis are watched here to show where they run.
const seen = vi.hoisted(() => {
  const headerBytes: number[] = [];
  return { decoded: 0, analysed: 0, headerBytes };
});
vi.mock("~/bench/wav.server", async (original) => {
  const real = await original<typeof import("~/bench/wav.server")>();
  return {
    ...real,
    readWavFormat: (bytes: Uint8Array) => {
      seen.headerBytes.push(bytes.length);
      return real.readWavFormat(bytes);
    },
    decodeWavData: (...args: Parameters<typeof real.decodeWavData>) => {
      seen.decoded += 1;
      return real.decodeWavData(...args);
    },
  };
});
vi.mock("@shared/bench/analysis/csv", async (original) => {
  const real = await original<typeof import("@shared/bench/analysis/csv")>();
  return {
    ...real,
    parseTwoColumnCsv: (...args: Parameters<typeof real.parseTwoColumnCsv>) => {
      seen.analysed += 1;
      return real.parseTwoColumnCsv(...args);
    },
  };
});

let seller: Seller;
beforeAll(async () => {
  await ensureBucket();
  seller = await makeAccount("capture-worker");
});
afterAll(cleanUp);
beforeEach(() => {
  seen.decoded = 0;
  seen.analysed = 0;
  seen.headerBytes = [];
});

const sine = JSON.stringify({
  kind: "sine",
  scale: { kind: "analyser", fullScaleVolts: 2, basis: "rms", attenuation: 10 },
  loadOhm: 8,
  fundamentalHz: 1000,
});

function post(file: Blob, name: string, fields: Record<string, string>) {
  const form = new FormData();
  form.append("file", file, name);
  for (const [k, v] of Object.entries(fields)) form.append(k, v);
  const request = new Request("http://127.0.0.1/api/v1/captures/analyze?wait=0", {
    method: "POST",
    body: form,
    headers: { Cookie: seller.cookie },
  });
  return answer(() => analyze(routeArgs(request, {})));
}

describe("the web process stores a capture and reads its header; the worker analyses it", { timeout: 60_000 }, () => {
  it("a clipped 10 s stereo WAV: queued without decoding a sample, then refused by the job as before", async () => {
    const clipped = toneWav({ sampleRate: 48_000, seconds: 10, f0: 1000, peak: 1.5, bits: "24", channels: 2 });
    const res = await post(new Blob([new Uint8Array(clipped)], { type: "audio/wav" }), "hot.wav", { conditions: sine });
    expect(res.status).toBe(202);
    expect(seen.decoded).toBe(0);
    expect(seen.headerBytes.every((n) => n <= HEADER_BYTES)).toBe(true);
    const row = await Capture.findByPk(res.body.id);
    expect(row).toMatchObject({ status: "queued", byteSize: clipped.length, format: { file: "wav" } });
    expect(await headObject(row!.storageKey!)).toMatchObject({ contentLength: clipped.length });

    await analyseCaptureJob({ captureId: row!.id });
    expect(seen.decoded).toBe(1);
    await row!.reload();
    expect(row).toMatchObject({ status: "failed", errorCode: "clipped", storageKey: null });
    expect(row!.errorMessage).toMatch(
      /^The left channel sits at digital full scale for \d+ samples from .+: the analyser input was overloaded\. Add attenuation and capture again\.$/,
    );
  });

  it("a sweep CSV: queued without reading its rows; the job reads them and fills in the format", async () => {
    const rows = Array.from({ length: 2000 }, (_, i) => `${(20 * 1000 ** (i / 1999)).toFixed(3)},${(-0.1 * Math.sin(i / 300)).toFixed(4)}`);
    const csv = `frequency,level\n${rows.join("\n")}\n`;
    const res = await post(new Blob([csv], { type: "text/csv" }), "sweep.csv", { reference: "flat", loadOhm: "8" });
    expect(res.status).toBe(202);
    expect(seen.analysed).toBe(0);
    await analyseCaptureJob({ captureId: res.body.id });
    expect(seen.analysed).toBe(1);
    const done = await Capture.findByPk(res.body.id);
    expect(done).toMatchObject({ status: "done", kind: "sweep", format: { file: "csv", rows: 2000, header: ["frequency", "level"] } });
  });
});
