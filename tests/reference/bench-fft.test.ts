import { describe, expect, it } from "vitest";
import { fft as referenceFft, dft as referenceDft } from "fft-js";
import { bareFft, computeWindow, powerSpectrum, windowProperties, type WindowName } from "@shared/bench/analysis";
import { prng } from "../support/capture-files";

// The transform the analysis uses (fft.js) against a second general-purpose FFT package from the
// registry (fft-js, plain Cooley-Tukey) and its direct DFT; then the windows against their published figures.

function randomSignal(n: number, seed: number): Float64Array {
  const r = prng(seed);
  return Float64Array.from({ length: n }, () => r() * 2 - 1);
}

describe("fft.js against fft-js (general-purpose reference FFT)", () => {
  it.each([16, 1024, 4096])("N = %d: every bin 0 … N/2 agrees to 1e-9 of the largest", (n) => {
    const x = randomSignal(n, n);
    const ours = bareFft(x);
    const ref = referenceFft(Array.from(x));
    let scale = 0;
    for (const [re, im] of ref) scale = Math.max(scale, Math.hypot(re, im));
    for (let k = 0; k <= n / 2; k++) {
      expect(Math.abs(ours[2 * k] - ref[k][0])).toBeLessThan(1e-9 * scale);
      expect(Math.abs(ours[2 * k + 1] - ref[k][1])).toBeLessThan(1e-9 * scale);
    }
  });

  it("N = 64: agrees with fft-js's direct DFT as well", () => {
    const x = randomSignal(64, 7);
    const ours = bareFft(x);
    const ref = referenceDft(Array.from(x));
    for (let k = 0; k <= 32; k++) {
      expect(ours[2 * k]).toBeCloseTo(ref[k][0], 9);
      expect(ours[2 * k + 1]).toBeCloseTo(ref[k][1], 9);
    }
  });

  it("the power spectrum keeps Parseval: its bins sum to a sine's mean square A²/2 through any window", () => {
    // A sine of amplitude A has mean square A²/2 whatever the window, once the bins around it are summed.
    const n = 8192;
    const x = Float64Array.from({ length: n }, (_, i) => 0.8 * Math.sin((2 * Math.PI * 1234.5 * i) / 48_000));
    const windows: WindowName[] = ["blackman-harris-7", "blackman-harris-4", "hann", "flat-top"];
    for (const w of windows) {
      const s = powerSpectrum(x, 48_000, w);
      let sum = 0;
      for (let k = 1; k < s.power.length; k++) sum += s.power[k];
      expect(Math.abs(sum / 0.32 - 1)).toBeLessThan(1e-5);
    }
  });
});

/** |W(δ)| / W(0): the window's response to a tone δ bins from a bin centre (direct DTFT). */
function windowResponse(w: Float64Array, deltaBins: number): number {
  const n = w.length;
  let re = 0;
  let im = 0;
  let sum = 0;
  for (let i = 0; i < n; i++) {
    const ph = (-2 * Math.PI * deltaBins * i) / n;
    re += w[i] * Math.cos(ph);
    im += w[i] * Math.sin(ph);
    sum += w[i];
  }
  return Math.hypot(re, im) / sum;
}

describe("windows (coefficients per scipy 1.17.1; figures computed; Harris, Proc. IEEE 66(1), 1978; docs/references.md §8)", () => {
  const figures: [WindowName, number, number, number][] = [
    // name, coherent gain, ENBW (bins), scalloping loss (dB at half a bin)
    ["blackman-harris-4", 0.35875, 2.004, -0.826],
    ["flat-top", 0.21558, 3.77, -0.01],
    ["hann", 0.5, 1.5, -1.42],
  ];
  it.each(figures)("%s: coherent gain %f, ENBW %f bins, scalloping %f dB", (name, gain, enbw, scallop) => {
    const p = windowProperties(name);
    expect(p.coherentGain).toBeCloseTo(gain, 5);
    expect(p.enbwBins).toBeCloseTo(enbw, 3);
    const w = computeWindow(name, 1024);
    const mean = w.reduce((a, b) => a + b, 0) / w.length;
    expect(mean).toBeCloseTo(p.coherentGain, 12);
    expect(20 * Math.log10(windowResponse(w, 0.5))).toBeCloseTo(scallop, 2);
  });

  it("single-bin amplitude read 0.3 bin off: 0.9664 (BH4), 1.0003 (flat-top), 0.9433 (Hann) — computed worked example, docs/references.md §8", () => {
    // The flat-top's response is normalised the same way; its passband ripples slightly above 1.
    const read = (name: WindowName) => windowResponse(computeWindow(name, 48_000 / 8), 0.3);
    expect(read("blackman-harris-4")).toBeCloseTo(0.9664, 4);
    expect(read("flat-top")).toBeCloseTo(1.0003, 4);
    expect(read("hann")).toBeCloseTo(0.9433, 4);
  });

  function highestSidelobeDb(name: WindowName, fromBins: number): number {
    const w = computeWindow(name, 512);
    let worst = -Infinity;
    for (let d = fromBins; d <= 60; d += 0.05) worst = Math.max(worst, 20 * Math.log10(windowResponse(w, d)));
    return worst;
  }

  it("BH4's highest sidelobe is −92 dB (Harris, Proc. IEEE 66(1), 1978)", () => {
    expect(highestSidelobeDb("blackman-harris-4", 4.01)).toBeCloseTo(-92, 0);
  });

  it("the 7-term Blackman-Harris used for THD+N keeps every sidelobe below −170 dB (about −180 dB: from memory)", () => {
    expect(highestSidelobeDb("blackman-harris-7", 7.01)).toBeLessThan(-170);
  });
});
