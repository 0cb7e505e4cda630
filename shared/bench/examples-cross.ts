// Demo sheets for the cross-checks (invented maker, model and workshop): one that every cross-check passes,
// its doctored twin that each of them catches, and a turntable running far off speed.
import type { BenchSheet, Conditions, Reading } from "./schema";

const band = { lowHz: 20, highHz: 20_000 };
const atLimit: Conditions = {
  loadOhm: 8,
  frequencyHz: 1000,
  atDistortion: { ratio: 0.001, measure: "thd" },
  channelsDriven: "both",
};
const at10W: Conditions = { powerW: 10, loadOhm: 8, frequencyHz: 1000 };

function r(quantity: Reading["quantity"], value: number, unit: string, conditions: Conditions = {}, rest: Partial<Reading> = {}): Reading {
  return { quantity, value, unit, basis: "measured", origin: "typed", conditions, ...rest };
}

/** A restored 2 × 100 W power amplifier whose figures tie together: every cross-check has something to check, and passes. */
export function exampleCrossCheckedSheet(): BenchSheet {
  return {
    category: "power_amplifier",
    equipment: { maker: "Brackwater Electric", model: "PA-100", year: 1983 },
    analyser: { residualThdN: 3e-6, residualThd: 2e-6, noiseFloorV: 1.5e-6, bandwidthHz: 500_000 },
    channelCount: 2,
    measuredOn: "2025-05-02",
    measuredBy: "Fenwick Yard Workshop",
    readings: [
      r("output_power", 100, "W", { ...atLimit, frequencyRange: band, frequencyHz: undefined }, { basis: "rated", channel: "both" }),
      r("input_sensitivity", 1, "V", {}, { basis: "rated" }),
      r("gain", 29, "dB", {}, { basis: "rated" }),
      r("output_power", 105, "W", atLimit, { channel: "left" }),
      r("output_power", 104, "W", atLimit, { channel: "right" }),
      r("thd", 0.000041, "%", at10W, { channel: "left", origin: "capture", captureId: "cap_demo_pa_10w_left" }),
      r("thd", 0.00004, "%", at10W, { channel: "left", text: "0.004 %" }),
      r("thd", 0.00005, "%", at10W, { channel: "right" }),
      r("thd_n", 0.00006, "%", { ...at10W, bandwidth: band }, { channel: "left" }),
      r("gain", 29, "dB", { frequencyHz: 1000, loadOhm: 8 }, { channel: "both" }),
      r("snr", 100, "dB(A)", { powerW: 1, loadOhm: 8, weighting: "A" }, { channel: "both" }),
      r("noise", 28.3e-6, "µV", { loadOhm: 8, weighting: "A" }, { channel: "both" }),
      r("noise", 60e-6, "µV", { loadOhm: 8, bandwidth: band, sourceOhm: 600, temperatureC: 22 }, { channel: "both", text: "60 µV" }),
      r("f3db_high", 140_000, "kHz", { powerW: 1, loadOhm: 8 }, { channel: "both" }),
      r("rise_time", 2.5e-6, "µs", { frequencyHz: 10_000, voltageV: 1, loadOhm: 8 }, { channel: "both" }),
      r("slew_rate", 25e6, "V/µs", { loadOhm: 8 }, { channel: "both" }),
      r("rail_voltage", 52, "V", { supply: "split" }, { text: "±52 V" }),
      r("dc_offset", 0.003, "mV", {}, { channel: "left" }),
      r("dc_offset", -0.005, "mV", {}, { channel: "right" }),
    ].map(withoutUndefined),
    sweeps: [],
    notes: "Recapped, bias and offset set after warm-up. Demo sheet: invented unit.",
  };
}

function withoutUndefined(x: Reading): Reading {
  return { ...x, conditions: Object.fromEntries(Object.entries(x.conditions).filter(([, v]) => v !== undefined)) };
}

/** The same sheet with figures no bench could have produced side by side: each cross-check catches one. */
export function doctoredCrossCheckedSheet(): BenchSheet {
  const s = exampleCrossCheckedSheet();
  const set = (i: number, value: number, unit?: string) => (s.readings[i] = { ...s.readings[i], value, ...(unit ? { unit } : {}) });
  set(2, 35); // rated gain: 1 V × 35 dB is 56 V, twice the 28.3 V of 100 W into 8 Ω
  set(6, 0.0002); // typed THD 0.02 % against 0.0041 % from the capture
  set(7, 0.0015); // right THD 0.15 % at 10 W, above the 0.1 % its 104 W is quoted at
  set(8, 0.000001); // THD+N 0.0001 %, below the analyser's 0.0003 % residual
  set(10, 110); // SNR 110 dB against 28.3 µV re 2.83 V (100 dB)
  set(12, 5e-6); // 5 µV over 20 kHz: under the 600 Ω source's thermal noise raised by 29 dB (12.4 µV)
  set(14, 0.5e-6); // a 0.5 µs edge on a 500 kHz analyser (0.7 µs at best)
  set(15, 0.2e6); // 0.2 V/µs, slower than the 0.32 V/µs edge it measured
  set(17, 0.08); // 80 mV at the left loudspeaker output
  return s;
}

/** A turntable whose 60 Hz synchronous motor runs on 50 Hz mains: 16.7 % slow. */
export function offSpeedTurntableSheet(): BenchSheet {
  return {
    category: "turntable",
    equipment: { maker: "Brackwater Electric", model: "TD-3", year: 1976 },
    measuredOn: "2025-05-02",
    measuredBy: "Fenwick Yard Workshop",
    readings: [
      r("speed_error", -0.167, "%", { speedRpm: 33.333, testToneHz: 3150 }),
      r("wow_flutter", 0.0012, "%", { weighting: "IEC-60386-peak", testToneHz: 3150, speedRpm: 33.333 }),
    ],
    sweeps: [],
  };
}
