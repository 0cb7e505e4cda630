import { describe, expect, it } from "vitest";
import { analyseCapture } from "~/bench/captures.server";
import type { Capture } from "~/models/capture.server";
import { imdPlots, outputImpedancePlots, separationPlots } from "~/listings/plots-twotone.server";
import { captureConditionsSchema, type CaptureConditionsInput } from "@shared/bench/analysis";
import { wavFromSamples } from "../../support/capture-files";

// The plots of the separation, intermodulation and output-impedance captures, from their stored analyses.

const TAU = 2 * Math.PI;
const make = (seconds: number, f: (t: number) => number) => Float64Array.from({ length: 48_000 * seconds }, (_, i) => f(i / 48_000));

function capture(channels: Float64Array[], input: CaptureConditionsInput): Capture {
  const conditions = captureConditionsSchema.parse(input);
  const r = analyseCapture(wavFromSamples(channels, 48_000, "24"), "c.wav", conditions, "cap-plot");
  const row = { id: "cap-plot", kind: conditions.kind, conditions, analysis: r.analysis };
  return row as unknown as Capture; // only the fields the plot functions read
}

describe("plots of the new capture kinds", () => {
  it("SMPTE: one bar per sideband around 7 kHz, dB re the high tone (AM 1 % deep: each first sideband −46.0 dB)", () => {
    // Each first sideband is A2·m/2 = 0.005·A2: 20·log10(0.005) = −46.02 dB.
    const x = make(1, (t) => 0.4 * Math.sin(TAU * 60 * t) + 0.1 * (1 + 0.01 * Math.cos(TAU * 60 * t)) * Math.sin(TAU * 7000 * t));
    const [plot] = imdPlots([capture([x], { kind: "imd", method: "smpte" })]);
    expect(plot.bars.map((b) => b.label)).toEqual(["−4·f1", "−3·f1", "−2·f1", "−1·f1", "+1·f1", "+2·f1", "+3·f1", "+4·f1"]);
    const first = plot.bars.filter((b) => b.label.endsWith("1·f1")).map((b) => b.levels.mono);
    expect(first).toEqual([-46, -46]);
    expect(plot.channels[0].thd).toMatch(/^IMD 1 %/);
    expect(plot.yLabel).toBe("Level re the high tone (dB)");
  });

  it("separation: one bar per test tone at minus the separation, on the undriven side", () => {
    const left = make(2, (t) => 0.5 * Math.sin(TAU * (t < 1 ? 1000 : 10_000) * t));
    const right = make(2, (t) => (t < 1 ? 0.5e-3 : 0.5e-2) * Math.sin(TAU * (t < 1 ? 1000 : 10_000) * t));
    const [plot] = separationPlots([capture([left, right], { kind: "separation" })]);
    expect(plot.bars.map((b) => b.levels.right)).toEqual([-60, -40]);
    expect(plot.channels[0].thd).toBe("least separation 40.0 dB at 10 kHz");
  });

  it("output impedance: the level over time in dB re open, and the figures", () => {
    const x = make(2, (t) => (t < 1 ? 1 : 8 / 8.1) * 0.5 * Math.sin(TAU * 1000 * t));
    const [plot] = outputImpedancePlots([capture([x], { kind: "output_impedance", loadOhm: 8, nominalLoadOhm: 8 })]);
    // 20·log10(8/8.1) = −0.108 dB once loaded.
    expect(plot.points[0].v).toBeCloseTo(0, 3);
    expect(plot.points[plot.points.length - 1].v).toBeCloseTo(-0.108, 3);
    expect(plot.figures.map((f) => f.label)).toEqual(["Output impedance", "Damping factor into 8 Ω"]);
    expect(plot.figures[1].display).toBe("80");
  });
});
