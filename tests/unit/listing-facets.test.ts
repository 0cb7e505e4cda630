import { describe, expect, it } from "vitest";
import { exampleIntegratedAmplifierSheet } from "@shared/bench";
import { NO_FACETS, listingFacets } from "@shared/listing-facets";
import { full8, measured, rated, sheet } from "./bench-fixtures";

// The facet columns the market filters by: measured readings only, the weaker channel, in the units
// the column names say. A maker's rated figure never fills one.

describe("listingFacets", () => {
  it("fills every amplifier facet from measured readings, THD and THD+N apart", () => {
    expect(listingFacets(exampleIntegratedAmplifierSheet())).toEqual({
      ...NO_FACETS,
      power8ohmW: 65,
      power4ohmW: 96,
      thdPct: expect.closeTo(0.014, 9),
      thdnPct: expect.closeTo(0.021, 9),
      snrDb: 98,
      f3LowHz: 7,
      f3HighHz: 95_000,
      dampingFactor: 150,
    });
  });

  it("keeps a loudspeaker's measured impedance minimum, never its rated impedance", () => {
    const speaker = (readings: ReturnType<typeof measured>[]) => listingFacets(sheet("loudspeaker", readings));
    expect(
      speaker([rated("nominal_impedance", 8, "Ω"), measured("impedance_minimum", 5.1, "Ω", { frequencyHz: 120 })]).impedanceMinOhm,
    ).toBe(5.1);
    expect(speaker([rated("nominal_impedance", 8, "Ω")]).impedanceMinOhm).toBeNull();
  });

  it("counts THD+N as the THD bound where only THD+N was measured, and no rated distortion at all", () => {
    const amp = (readings: ReturnType<typeof measured>[]) => listingFacets(sheet("integrated_amplifier", readings));
    const at = { powerW: 60, loadOhm: 8, frequencyHz: 1000 };
    expect(amp([measured("thd_n", 0.0003, "%", at, { channel: "left" })])).toMatchObject({ thdPct: 0.03, thdnPct: 0.03 });
    expect(amp([rated("thd", 0.0005, "%", at), rated("output_power", 60, "W", full8)])).toEqual(NO_FACETS);
  });

  it("gives a phono stage's output noise in µV, the noisier channel", () => {
    const f = listingFacets(
      sheet("phono_stage", [
        measured("noise", 140e-6, "µV", { weighting: "A" }, { channel: "left" }),
        measured("noise", 180e-6, "µV", { weighting: "A" }, { channel: "right" }),
        measured("gain", 40, "dB", { frequencyHz: 1000 }),
      ]),
    );
    expect(f.noiseUv).toBeCloseTo(180, 9);
    expect(f.gainDb).toBe(40);
  });

  it("gives a turntable's speed error as a magnitude in %", () => {
    expect(listingFacets(sheet("turntable", [measured("speed_error", -0.003, "%")])).speedErrorPct).toBeCloseTo(0.3, 12);
  });
});
