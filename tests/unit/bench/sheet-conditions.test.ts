// What a capture is taken as when the seller states nothing, and which sheets a figure may sit on.
import { describe, expect, it } from "vitest";
import { sineCaptureConditionsSchema } from "@shared/bench/analysis";
import { checkBenchSheet, parseBenchSheet } from "@shared/bench";
import { checkBenchSheetJson, MAX_BODY_BYTES } from "@shared/bench/api";
import { measured, riaaSweep, sheet } from "../bench-fixtures";

describe("a sine capture's unstated conditions", () => {
  it("are unweighted, through the 7-term Blackman-Harris window: A-weighting is only applied when asked for", () => {
    const c = sineCaptureConditionsSchema.parse({ kind: "sine", scale: { kind: "volts-per-full-scale", volts: 40, basis: "peak" } });
    expect(c.weighting).toBe("unweighted");
    expect(c.window).toBe("blackman-harris-7");
  });
});

describe("where a figure may stand", () => {
  it("a figure from a capture is a measurement, never the maker's rating", () => {
    const r = parseBenchSheet({
      category: "power_amplifier",
      readings: [{ ...measured("thd", 0.001, "%"), basis: "rated", origin: "capture", captureId: "cap-1" }],
    });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues.map((i) => i.message)).toContain("A figure from a capture is measured, not rated.");
  });
  it("an integrated amplifier's phono input is swept and held against the RIAA curve like a phono stage", () => {
    const s = sheet("integrated_amplifier", [], { sweeps: [riaaSweep({ offsetDb: 35 })] });
    expect(parseBenchSheet(s).ok).toBe(true);
    expect(
      checkBenchSheet(s)
        .results.filter((r) => r.ruleId === "riaa-deviation")
        .map((r) => r.outcome),
    ).toEqual(["consistent"]);
  });
});

describe("the check's body limit", () => {
  it("a body just over 512 KB is refused as too large before it is parsed", () => {
    expect(MAX_BODY_BYTES).toBe(512 * 1024);
    expect(checkBenchSheetJson(" ".repeat(512 * 1024 + 1)).status).toBe(413);
    expect(checkBenchSheetJson(" ".repeat(512 * 1024)).status).toBe(400);
  });
});
