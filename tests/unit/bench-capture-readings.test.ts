import { describe, expect, it } from "vitest";
import { analyseCapture } from "~/bench/captures.server";
import { readConditions } from "~/bench/capture-form.server";
import { parseBenchSheet } from "@shared/bench/schema";
import { RIAA_IEC_TABLE } from "../support/published-tables";
import { singlePoleSquareCsv, toneWav } from "../support/capture-files";

// Capture results become bench-sheet readings the sheet schema accepts, marked as coming from the capture.

const enc = (s: string) => new TextEncoder().encode(s);

describe("capture analyses as bench-sheet readings", () => {
  it("a mono sine capture of the right channel: voltage, power, THD, THD+N, noise and SNR with their conditions", () => {
    const bytes = toneWav({
      sampleRate: 48_000,
      seconds: 1,
      f0: 1000,
      harmonics: [1, 1e-3],
      noiseRms: 1e-6,
      peak: 0.5,
      bits: "24",
      channels: 1,
    });
    const r = analyseCapture(
      bytes,
      "r.wav",
      {
        kind: "sine",
        scale: { kind: "volts-per-full-scale", volts: 40, basis: "peak" },
        loadOhm: 4,
        weighting: "A",
        window: "blackman-harris-7",
        channel: "right",
        channelsDriven: "both",
      },
      "cap-7",
    );
    const byQuantity = Object.fromEntries(r.readings.map((x) => [x.quantity, x]));
    expect(Object.keys(byQuantity).sort()).toEqual(["noise", "output_power", "output_voltage", "snr", "thd", "thd_n"]);
    for (const x of r.readings) expect(x).toMatchObject({ channel: "right", basis: "measured", origin: "capture", captureId: "cap-7" });
    // 20 V peak = 14.14 V rms; into 4 Ω that is 50 W (P = Vrms²/R).
    expect(byQuantity.output_power.value).toBeCloseTo(50, 3);
    expect(byQuantity.output_power.conditions).toMatchObject({ loadOhm: 4, frequencyHz: 1000, channelsDriven: "both" });
    expect(byQuantity.thd).toMatchObject({
      value: expect.closeTo(1e-3, 6),
      unit: "%",
      conditions: { powerW: expect.closeTo(50, 3), bandwidth: { lowHz: 20, highHz: 20_000 } },
    });
    expect(byQuantity.thd_n.conditions.weighting).toBe("A");
    expect(parseBenchSheet({ category: "power_amplifier", readings: r.readings, sweeps: [] })).toMatchObject({ ok: true });
  });

  it("a square-wave capture gives a rise time with the overshoot and implied bandwidth noted", () => {
    const r = analyseCapture(
      enc(singlePoleSquareCsv({ f3dB: 100e3, period: 200e-6, dt: 20e-9 })),
      "sq.csv",
      { kind: "square", loadOhm: 8 },
      "cap-8",
    );
    expect(r.readings).toHaveLength(1);
    const [rise] = r.readings;
    expect(rise).toMatchObject({ quantity: "rise_time", unit: "µs", origin: "capture", conditions: { loadOhm: 8 } });
    expect(rise.value).toBeCloseTo(0.3497 / 100e3, 9);
    expect(rise.note).toMatch(/implies about 100 kHz single-pole bandwidth/);
    expect(parseBenchSheet({ category: "integrated_amplifier", readings: r.readings, sweeps: [] })).toMatchObject({ ok: true });
  });

  it("a phono stage's sweep gives an RIAA sweep for the sheet plus deviation and −3 dB readings", () => {
    // Typed from IEC 60098's table with the 7950 µs pole (tests/support/published-tables.ts), 0.4 dB low at 20 kHz.
    const freqs = RIAA_IEC_TABLE.map(([f]) => f);
    const rows = RIAA_IEC_TABLE.map(([f, db]) => `${f},${(30 + db + (f === 20_000 ? -0.4 : 0)).toFixed(2)}`);
    const r = analyseCapture(
      enc(["frequency,level", ...rows].join("\n")),
      "riaa.csv",
      { kind: "sweep", reference: "riaa", iecPole: true },
      "cap-9",
    );
    if (r.kind !== "sweep") throw new Error("expected a sweep");
    expect(r.sweep).toMatchObject({ kind: "riaa", variant: "riaa_iec", origin: "capture", captureId: "cap-9" });
    expect(r.sweep.points).toHaveLength(freqs.length);
    const dev = r.readings.find((x) => x.quantity === "riaa_deviation")!;
    // The table is rounded to 0.01 dB: the deviation reads 0.4 dB to within 0.006 dB.
    expect(Math.abs(dev.value - 0.4)).toBeLessThanOrEqual(0.006);
    expect(dev.note).toBe("worst -0.40 dB at 20000 Hz, re 1 kHz");
    expect(parseBenchSheet({ category: "phono_stage", readings: r.readings, sweeps: [r.sweep] })).toMatchObject({ ok: true });
  });
});

describe("stated conditions from a multipart form", () => {
  const form = (fields: Record<string, string>) => {
    const f = new FormData();
    for (const [k, v] of Object.entries(fields)) f.append(k, v);
    return f;
  };

  it("plain fields build the same conditions as JSON", () => {
    const r = readConditions(
      form({
        scale: "analyser",
        fullScaleVolts: "2",
        basis: "rms",
        attenuation: "10",
        loadOhm: "8",
        weighting: "A",
        bandwidthLowHz: "20",
        bandwidthHighHz: "80000",
        reference: "riaa",
      }),
      "sine",
    );
    expect(r).toEqual({
      ok: true,
      conditions: {
        kind: "sine",
        scale: { kind: "analyser", fullScaleVolts: 2, basis: "rms", attenuation: 10 },
        loadOhm: 8,
        bandwidth: { lowHz: 20, highHz: 80_000 },
        weighting: "A",
        window: "blackman-harris-7",
      },
    });
  });

  it("names each problem with its path", () => {
    const r = readConditions(
      form({
        conditions: JSON.stringify({ kind: "sine", scale: { kind: "volts-per-full-scale", volts: -1, basis: "peak" }, loadOhm: "eight" }),
      }),
      null,
    );
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.issues.map((i) => i.path).sort()).toEqual(["loadOhm", "scale.volts"]);
  });

  it("names a missing full-scale voltage by the form's own label and says what to type", () => {
    const r = readConditions(form({ scale: "volts-per-full-scale", basis: "peak", loadOhm: "8" }), "sine");
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.message).toBe(
      "The stated conditions do not fit. Full scale stands for: type the voltage a full-scale sample stands for, e.g. 40.",
    );
  });

  it("asks for the kind when the file cannot tell, and refuses JSON that does not parse", () => {
    const noKind = readConditions(form({ levelUnit: "dB" }), null);
    expect(noKind).toMatchObject({ ok: false, issues: [{ path: "kind", message: "required" }] });
    expect(readConditions(form({ conditions: "{kind: sine" }), "sine")).toMatchObject({
      ok: false,
      message: "The conditions field is not valid JSON.",
    });
  });
});
