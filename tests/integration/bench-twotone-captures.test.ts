import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { randomUUID } from "node:crypto";
import { User } from "~/models/user.server";
import { Capture } from "~/models/capture.server";
import { signedInCookie } from "../support/sessions";
import { ensureBucket } from "~/services/storage.server";
import { analyseCaptureJob } from "~/bench/capture-job.server";
import { action as analyze } from "~/routes/api.v1.captures.analyze";
import { loader as show } from "~/routes/api.v1.captures.$id";
import { parseBenchSheet } from "@shared/bench/schema";
import { wavFromSamples } from "../support/capture-files";
import { routeArgs } from "../support/route-args";

// Separation, intermodulation and output-impedance captures through the real upload path: the
// multipart API, object storage, the queued analysis job, and the capture as the API shows it.

const BASE = "http://127.0.0.1";
const TAU = 2 * Math.PI;
let owner: User;
let cookie: string;

function tone(seconds: number, f: (t: number) => number, fs = 48_000): Float64Array {
  const x = new Float64Array(Math.round(seconds * fs));
  for (let i = 0; i < x.length; i++) x[i] = f(i / fs);
  return x;
}

async function send(channels: Float64Array[], fields: Record<string, string>, fs = 48_000) {
  const form = new FormData();
  form.append("file", new Blob([new Uint8Array(wavFromSamples(channels, fs, "24"))], { type: "audio/wav" }), "capture.wav");
  for (const [k, v] of Object.entries(fields)) form.append(k, v);
  const request = new Request(`${BASE}/api/v1/captures/analyze?wait=0`, { method: "POST", body: form, headers: { Cookie: cookie } });
  const res = await analyze(routeArgs(request, {})).catch((thrown: unknown) => {
    if (thrown instanceof Response) return thrown;
    throw thrown;
  });
  expect(res.status).toBe(202);
  const { id } = (await res.json()) as { id: string };
  await analyseCaptureJob({ captureId: id });
  const got = await show(routeArgs(new Request(`${BASE}/api/v1/captures/${id}`, { headers: { Cookie: cookie } }), { id }));
  const body = (await got.json()) as {
    id: string;
    status: string;
    kind: string;
    readings: { quantity: string; value: number; captureId: string }[];
  };
  return { id, body, row: await Capture.findByPk(id) };
}

beforeAll(async () => {
  await ensureBucket();
  owner = await User.create({
    email: `twotone-${randomUUID().slice(0, 8)}@example.test`,
    displayName: "Two-tone bench",
    passwordHash: null,
    emailVerifiedAt: new Date(),
    lastSignInAt: null,
  });
  cookie = await signedInCookie(owner);
});

afterAll(async () => {
  await Capture.destroy({ where: { ownerId: owner.id } });
  await User.destroy({ where: { id: owner.id } });
});

describe("captures of the new kinds through the capture API", () => {
  it("separation: a stereo WAV sent with plain form fields gives a channel-separation reading per tone", async () => {
    // Leak 1/3162 of the driven tone: 20·log10(3162.3) = 70 dB.
    const left = tone(1, (t) => 0.5 * Math.sin(TAU * 1000 * t));
    const right = tone(1, (t) => (0.5 / 3162.28) * Math.sin(TAU * 1000 * t + 0.3));
    const { body, row } = await send([left, right], { kind: "separation", loadOhm: "8" });
    expect(body.status).toBe("done");
    expect(row?.kind).toBe("separation");
    expect(body.readings).toHaveLength(1);
    expect(body.readings[0]).toMatchObject({ quantity: "crosstalk", channel: "right", origin: "capture", captureId: body.id });
    expect(body.readings[0].value).toBeCloseTo(70, 1);
    expect(parseBenchSheet({ category: "integrated_amplifier", readings: body.readings, sweeps: [] }).ok).toBe(true);
  });

  it("imd: a SMPTE two-tone WAV sent with JSON conditions gives an intermodulation reading per channel", async () => {
    // 7 kHz amplitude-modulated 0.2 % deep at 60 Hz: SMPTE d_m = 0.002 (each sideband A2·m/2, pair A2·m).
    const x = tone(1, (t) => 0.4 * Math.sin(TAU * 60 * t) + 0.1 * (1 + 0.002 * Math.cos(TAU * 60 * t)) * Math.sin(TAU * 7000 * t));
    const conditions = JSON.stringify({
      kind: "imd",
      method: "smpte",
      scale: { kind: "volts-per-full-scale", volts: 40, basis: "peak" },
      loadOhm: 8,
    });
    const { body } = await send([x, x], { conditions });
    expect(body.status).toBe("done");
    expect(body.readings.map((r) => r.quantity)).toEqual(["imd", "imd"]);
    for (const r of body.readings) expect(r.value).toBeCloseTo(0.002, 5);
    // Level: a sine of the same peak as 0.4 + 0.1 full scale of 40 V peak is 20 V peak, 14.1 V rms: 25 W into 8 Ω.
    expect(body.readings[0]).toMatchObject({ conditions: { loadOhm: 8, powerW: expect.closeTo(25, 1) } });
    expect(parseBenchSheet({ category: "power_amplifier", readings: body.readings, sweeps: [] }).ok).toBe(true);
  });

  it("output_impedance: a tone open then loaded gives output impedance and damping factor", async () => {
    // Z_out = 8·(8.1/8 − 1) = 0.1 Ω; DF = 8/0.1 = 80.
    const x = tone(2, (t) => (t < 1 ? 1 : 8 / 8.1) * 0.5 * Math.sin(TAU * 1000 * t));
    const { body } = await send([x], { kind: "output_impedance", loadOhm: "8", nominalLoadOhm: "8", channel: "left" });
    expect(body.status).toBe("done");
    const byQuantity = Object.fromEntries(body.readings.map((r) => [r.quantity, r.value]));
    expect(byQuantity.output_impedance).toBeCloseTo(0.1, 4);
    expect(byQuantity.damping_factor).toBeCloseTo(80, 1);
    expect(parseBenchSheet({ category: "integrated_amplifier", readings: body.readings, sweeps: [] }).ok).toBe(true);
  });

  it("a refused two-tone capture ends failed with its reason", async () => {
    const x = tone(1, (t) => 0.4 * Math.sin(TAU * 60 * t));
    const { body } = await send([x], { kind: "imd", method: "smpte" });
    expect(body.status).toBe("failed");
    expect(JSON.stringify(body)).toMatch(/high tone/);
  });
});
