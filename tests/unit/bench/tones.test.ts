// Tone and noise measurement on a power spectrum, shared by the two-tone, separation and output-impedance
// analyses. Signals of known answer; expected values derived by hand beside each test.
import { describe, expect, it } from "vitest";
import { powerSpectrum } from "@shared/bench/analysis/spectrum";
import { needSpacing, noisePerZone, zoneHalfWidthHz } from "@shared/bench/analysis/tones";
import { isCaptureError } from "@shared/bench/analysis";
import { prng } from "../../support/capture-files";

const FS = 48_000;

/** Seeded white noise, uniform, of the given rms (uniform on ±a has rms a/√3). */
function whiteNoise(n: number, rms: number, seed: number): Float64Array {
  const r = prng(seed);
  return Float64Array.from({ length: n }, () => (r() - 0.5) * rms * Math.sqrt(12));
}

describe("noisePerZone: the noise a tone's zone holds", () => {
  it("white noise of rms 1e-3 over 1 s at 48 kHz: 1e-6 spread over 32 768 bins, times the zone's width", () => {
    // Parseval: the spectrum's bins sum to the mean square, 1e-6, spread evenly over the nFft/2 = 32 768
    // bins of a 65 536-point transform (1 s zero-padded), whatever the window. A zone of 2h + 1 bins
    // therefore holds 1e-6 · (2h + 1) / 32 768. A noise bin's power is exponential (χ², two degrees of
    // freedom), so its median is ln 2 of its mean; the estimate from a median of thousands of bins is
    // within a few per cent.
    const spec = powerSpectrum(whiteNoise(FS, 1e-3, 21), FS, "blackman-harris-7");
    expect(spec.nFft).toBe(65_536);
    const expected = (1e-6 * (2 * spec.toneHalfWidthBins + 1)) / 32_768;
    const got = noisePerZone(spec, 20, 20_000);
    expect(got / expected).toBeGreaterThan(0.9);
    expect(got / expected).toBeLessThan(1.1);
  });
});

describe("needSpacing: tones whose zones would overlap are refused", () => {
  const spec = powerSpectrum(whiteNoise(FS / 4, 1e-3, 22), FS, "blackman-harris-7");
  const half = zoneHalfWidthHz(spec);
  const code = (spacingHz: number) => {
    try {
      needSpacing(spec, spacingHz, "the tones");
      return null;
    } catch (e) {
      return isCaptureError(e) ? e.code : "other";
    }
  };
  it("two zones of half-width h overlap when the tones are less than 2h apart", () => {
    // Each tone is summed over ±h around it: tones 1.5h apart share the stretch between them.
    expect(code(1.5 * half)).toBe("too_short");
    expect(code(1.99 * half)).toBe("too_short");
    expect(code(2.01 * half)).toBeNull();
  });
});
