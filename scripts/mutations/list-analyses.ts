// Realistic one-line slips in the capture analyses for wow & flutter, intermodulation, separation,
// output impedance and impedance sweeps, and their sheet readings. Part of MUTATIONS (list.ts).
import type { Mutation } from "./list";

const A = "shared/bench/analysis/";

export const ANALYSIS_MUTATIONS: Mutation[] = [
  // Wow & flutter (IEC 60386 / AES6-2008)
  {
    file: `${A}wow-flutter.ts`,
    from: "percentileAbs(weighted, 0.95)",
    to: "percentileAbs(weighted, 0.9)",
    why: "weighted two-sigma point 95 % → 90 %",
  },
  { file: `${A}wow-flutter.ts`, from: "minSeconds: 5,", to: "minSeconds: 2,", why: "wow & flutter read over 2 s instead of AES6's 5 s" },
  { file: `${A}wow-flutter.ts`, from: "maxOffset: 0.1,", to: "maxOffset: 0.3,", why: "a tone 30 % from the stated one still read as it" },
  {
    file: `${A}wow-flutter.ts`,
    from: 'fig(mean / opts.nominalHz - 1, "ratio")',
    to: 'fig(1 - mean / opts.nominalHz, "ratio")',
    why: "speed error sign flipped (fast reads slow)",
  },
  {
    file: `${A}wow-flutter.ts`,
    from: 'fig(percentileAbs(dev, 0.95), "ratio")',
    to: 'fig(percentileAbs(weighted, 0.95), "ratio")',
    why: "unweighted peak read from the weighted deviation",
  },
  {
    file: `${A}wow-flutter.ts`,
    from: "((phase[j + 1] - phase[j]) * rate) / (2 * Math.PI)",
    to: "((phase[j + 1] - phase[j]) * rate) / Math.PI",
    why: "phase advance to frequency without the 2π (deviation halved)",
  },
  {
    file: `${A}wow-flutter.ts`,
    from: "drift: fig(Number.isFinite(hi - lo) ? hi - lo : 0",
    to: "drift: fig(Number.isFinite(hi - lo) ? (hi - lo) / 2 : 0",
    why: "drift halved (read as ± instead of peak to peak)",
  },
  // Flutter weighting filter (IEC 60386 table)
  {
    file: `${A}flutter-weighting.ts`,
    from: "highPass2: { hz: 0.488, q: 0.551 }",
    to: "highPass2: { hz: 0.848, q: 0.551 }",
    why: "weighting high-pass corner mistyped 0.488 → 0.848 Hz",
  },
  {
    file: `${A}flutter-weighting.ts`,
    from: "shelf: { poleHz: 11.0, zeroHz: 282 }",
    to: "shelf: { poleHz: 16.0, zeroHz: 282 }",
    why: "weighting shelf pole 11 → 16 Hz",
  },
  {
    file: `${A}flutter-weighting.ts`,
    from: "gain: 1 / magnitude(sections, 4, sampleRate)",
    to: "gain: 1 / magnitude(sections, 3.15, sampleRate)",
    why: "weighting normalised at 3.15 Hz instead of 4 Hz",
  },
  {
    file: `${A}flutter-weighting.ts`,
    from: "return 20 * Math.log10(weighting.gain",
    to: "return 10 * Math.log10(weighting.gain",
    why: "weighting response in dB as 10·log10 of an amplitude",
  },
  {
    file: `${A}flutter-weighting.ts`,
    from: "const k = 2 * sampleRate;",
    to: "const k = sampleRate;",
    why: "bilinear transform constant 2·fs → fs",
  },
  {
    file: `${A}flutter-weighting.ts`,
    from: "for (let i = pre; i >= 1; i--) step(x[i]);",
    to: "",
    why: "weighting filter starts cold (no pre-roll)",
  },
  // Intermodulation (IEC 60268-3, SMPTE RP120)
  {
    file: `${A}imd.ts`,
    from: "smpte: { lowHz: 60, highHz: 7000, ratio: 4 }",
    to: "smpte: { lowHz: 60, highHz: 6000, ratio: 4 }",
    why: "SMPTE high tone 7 kHz → 6 kHz",
  },
  {
    file: `${A}imd.ts`,
    from: "if (n === 2) third = (ub + ua) / u2;",
    to: "if (n === 2) third = Math.hypot(ub, ua) / u2;",
    why: "SMPTE third-order sidebands summed as rms, not amplitude",
  },
  { file: `${A}imd.ts`, from: "second = ud / (2 * u2);", to: "second = ud / u2;", why: "DFD d_2 referred to U(f2), not 2·U(f2)" },
  {
    file: `${A}imd.ts`,
    from: "third = (u3lo + u3hi) / (2 * u2);",
    to: "third = Math.max(u3lo, u3hi) / (2 * u2);",
    why: "DFD d_3 from one product only",
  },
  {
    file: `${A}imd.ts`,
    from: "? Math.hypot(second, third) : second;",
    to: "? second + third : second;",
    why: "SMPTE d_m as the sum of orders, not rms",
  },
  {
    file: `${A}imd.ts`,
    from: "const peakFs = (u1 + u2) * Math.SQRT2;",
    to: "const peakFs = Math.hypot(u1, u2) * Math.SQRT2;",
    why: "two-tone peak from the rms sum, not the sum of amplitudes",
  },
  // Channel separation (IEC 60268-3 crosstalk attenuation)
  {
    file: `${A}separation.ts`,
    from: 'separation: fig(dBPower(pd / leak), "dB")',
    to: 'separation: fig(2 * dBPower(pd / leak), "dB")',
    why: "separation as 20·log10 of a power ratio",
  },
  {
    file: `${A}separation.ts`,
    from: "const belowNoise = !(pu > 10 * uNoise);",
    to: "const belowNoise = !(pu > uNoise);",
    why: "leak within 10 dB of the noise read as a leak",
  },
  {
    file: `${A}separation.ts`,
    from: '(total(left) >= total(right) ? "left" : "right")',
    to: '(total(left) >= total(right) ? "right" : "left")',
    why: "the quieter side taken as the driven one",
  },
  {
    file: `${A}separation.ts`,
    from: 'fig(Math.sqrt(pd) * vpfs, "V")',
    to: 'fig(Math.sqrt(pd) * vpfs * Math.SQRT2, "V")',
    why: "driven level in peak volts, not rms",
  },
  {
    file: `${A}separation.ts`,
    from: "t.power < f.power / 100",
    to: "t.power < f.power / 10",
    why: "a test tone within 10–20 dB of another dropped as its harmonic",
  },
  // Output impedance and damping factor
  {
    file: `${A}output-impedance.ts`,
    from: "const zOut = c.loadOhms * (ratio - 1);",
    to: "const zOut = c.loadOhms / (ratio - 1);",
    why: "Z_out = R / (Vo/Vl − 1) instead of R·(Vo/Vl − 1)",
  },
  {
    file: `${A}output-impedance.ts`,
    from: "dampingFactor: c.nominalLoadOhms ? c.nominalLoadOhms / zOut : null",
    to: "dampingFactor: c.nominalLoadOhms ? c.loadOhms / zOut : null",
    why: "damping factor against the test load, not the nominal load",
  },
  {
    file: `${A}output-impedance.ts`,
    from: "return (2 * Math.hypot(re, im)) / sw / Math.SQRT2;",
    to: "return (2 * Math.hypot(re, im)) / sw;",
    why: "block levels in peak, not rms",
  },
  {
    file: `${A}output-impedance.ts`,
    from: "&& upper[i - 1] === upper[i] && upper[i + 1] === upper[i]",
    to: "",
    why: "blocks beside the load switch counted as steady",
  },
  {
    file: `${A}output-impedance.ts`,
    from: "const live = amps.map((a) => a > 0.2 * loud);",
    to: "const live = amps.map((a) => a > 0.002 * loud);",
    why: "the pause while switching counted as a level",
  },
  // Tone measurement shared by the two-tone analyses
  {
    file: `${A}tones.ts`,
    from: "return Math.sqrt(zonePower(spec, zoneAt(spec, hz)));",
    to: "return zonePower(spec, zoneAt(spec, hz));",
    why: "a tone's rms as its power (sqrt dropped)",
  },
  {
    file: `${A}tones.ts`,
    from: "/ Math.LN2) * (2 * spec.toneHalfWidthBins + 1)",
    to: "* Math.LN2) * (2 * spec.toneHalfWidthBins + 1)",
    why: "noise mean as median × ln 2 instead of ÷ ln 2",
  },
  {
    file: `${A}tones.ts`,
    from: "if (2 * half < spacingHz) return;",
    to: "if (half < spacingHz) return;",
    why: "tones half a zone apart taken as separable",
  },
  {
    file: `${A}tones.ts`,
    from: "return { hz: (moment / sum) * spec.binHz, power: sum };",
    to: "return { hz: peak * spec.binHz, power: sum };",
    why: "tone frequency not refined between bins",
  },
  // Separation, IMD and output-impedance readings
  {
    file: `${A}twotone-readings.ts`,
    from: "const single = a.points.length === 1;",
    to: "const single = a.points.length >= 1;",
    why: "a stepped separation capture states one tone's level for all",
  },
  {
    file: `${A}twotone-readings.ts`,
    from: "{ powerW: sig((v * v) / c.loadOhm, 4) }",
    to: "{ powerW: sig(v / c.loadOhm, 4) }",
    why: "separation level P = V/R (square dropped)",
  },
  {
    file: `${A}twotone-readings.ts`,
    from: "channel: a.undriven,",
    to: "channel: a.driven,",
    why: "crosstalk reading on the driven channel",
  },
  {
    file: `${A}twotone-readings.ts`,
    from: "value: ch.imd.ratio,",
    to: "value: ch.imd.percent.value,",
    why: "IMD stored as percent, 100× the ratio",
  },
  {
    file: `${A}twotone-readings.ts`,
    from: "conditions: { loadOhm: c.nominalLoadOhm, frequencyHz: f },",
    to: "conditions: { loadOhm: c.loadOhm, frequencyHz: f },",
    why: "damping factor labelled with the test load",
  },
  // Impedance sweeps (IEC 60268-5 §16.1)
  {
    file: `${A}impedance.ts`,
    from: "IMPEDANCE_RATED_FLOOR = 0.8",
    to: "IMPEDANCE_RATED_FLOOR = 0.75",
    why: "sweep's rated-impedance floor 80 % → 75 %",
  },
  {
    file: `${A}impedance.ts`,
    from: "RESONANCE_PROMINENCE = 1.25",
    to: "RESONANCE_PROMINENCE = 2",
    why: "a resonance must stand 2× (not 1.25×) above its dip",
  },
  {
    file: `${A}impedance.ts`,
    from: "lowHz: Math.max(c.band?.lowHz ?? 20, lo)",
    to: "lowHz: Math.min(c.band?.lowHz ?? 20, lo)",
    why: "minimum sought below the rated range",
  },
  {
    file: `${A}impedance.ts`,
    from: "meets: min.z >= floor - 1e-9",
    to: "meets: min.z >= floor",
    why: "a minimum of exactly 80 % fails on float rounding",
  },
  {
    file: `${A}impedance.ts`,
    from: "if (phase[k] >= 0 && phase[k + 1] < 0) {",
    to: "if (phase[k] <= 0 && phase[k + 1] > 0) {",
    why: "resonance at a rising phase crossing, not a falling one",
  },
  { file: `${A}impedance.ts`, from: "const xv = -b / (2 * a);", to: "const xv = -b / a;", why: "parabola vertex at −b/a" },
  {
    file: `${A}impedance-readings.ts`,
    from: "value: sig(a.minimum.ohms.value),",
    to: "value: sig(a.maximum.ohms.value),",
    why: "impedance minimum reading takes the maximum",
  },
  {
    file: `${A}impedance-readings.ts`,
    from: "frequencyRange: { lowHz: sig(band.lowHz), highHz: sig(band.highHz) },",
    to: "frequencyRange: { lowHz: sig(a.conditions.sweepRange.lowHz), highHz: sig(a.conditions.sweepRange.highHz) },",
    why: "minimum's range stated as the whole sweep, not the rated range",
  },
  {
    file: `${A}impedance-readings.ts`,
    from: "value: sig(a.resonance.frequency.value),",
    to: "value: sig(a.resonance.peak.value),",
    why: "resonance reading takes the peak's ohms",
  },
  {
    file: `${A}impedance-readings.ts`,
    from: "const sig = (x: number, n = 4)",
    to: "const sig = (x: number, n = 2)",
    why: "impedance readings rounded to 2 figures",
  },
];
