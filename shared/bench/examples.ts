// Demo bench sheets (invented maker, model and workshop) for the docs, tests and seeds.
import type { BenchSheet, BenchSheetInput, Conditions, Reading } from "./schema";

const SQRT2 = Math.SQRT2;
const band = { lowHz: 20, highHz: 20_000 };
const bench: Conditions = {
  frequencyHz: 1000,
  atDistortion: { ratio: 0.001, measure: "thd" },
  channelsDriven: "both",
  mainsV: 230,
  warmUpS: 1800,
};

function r(quantity: Reading["quantity"], value: number, unit: string, rest: Partial<Reading> = {}): Reading {
  return { quantity, value, unit, basis: "measured", origin: "typed", conditions: {}, ...rest };
}

/**
 * A restored 2 × 60 W integrated amplifier whose sheet passes every rule: plausible figures for a late-1970s
 * class-AB design on ±42 V rails, distortion and rise time from captures.
 */
export function exampleIntegratedAmplifierSheet(): BenchSheet {
  return {
    category: "integrated_amplifier",
    equipment: { maker: "Tallowmere Audio", model: "Ostry 60", year: 1979 },
    channelCount: 2,
    measuredOn: "2025-03-14",
    measuredBy: "Kestrel Lane Workshop",
    readings: [
      r("output_power", 60, "W", {
        basis: "rated",
        channel: "both",
        text: "2 × 60 W",
        conditions: { loadOhm: 8, frequencyRange: band, atDistortion: { ratio: 0.001, measure: "thd" }, channelsDriven: "both" },
      }),
      r("output_power", 90, "W", {
        basis: "rated",
        channel: "both",
        text: "2 × 90 W",
        conditions: { loadOhm: 4, frequencyRange: band, atDistortion: { ratio: 0.001, measure: "thd" }, channelsDriven: "both" },
      }),
      r("thd", 0.0005, "%", { basis: "rated", text: "0.05 %", conditions: { powerW: 60, loadOhm: 8, frequencyRange: band } }),
      r("output_power", 66, "W", { channel: "left", conditions: { ...bench, loadOhm: 8 } }),
      r("output_power", 65, "W", { channel: "right", conditions: { ...bench, loadOhm: 8 } }),
      r("output_power", 98, "W", { channel: "left", conditions: { ...bench, loadOhm: 4 } }),
      r("output_power", 96, "W", { channel: "right", conditions: { ...bench, loadOhm: 4 } }),
      r("output_voltage", 65 / (2 * SQRT2), "Vpp", { channel: "left", text: "65 Vpp", conditions: { ...bench, loadOhm: 8 } }),
      r("rail_voltage", 42, "V", {
        text: "±42 V",
        conditions: { supply: "split" },
        note: "Measured at idle on the main filter capacitors.",
      }),
      r("thd", 0.00012, "%", {
        channel: "left",
        origin: "capture",
        captureId: "cap_demo_1k_left",
        conditions: { powerW: 60, loadOhm: 8, frequencyHz: 1000 },
      }),
      r("thd_n", 0.00018, "%", {
        channel: "left",
        origin: "capture",
        captureId: "cap_demo_1k_left",
        conditions: { powerW: 60, loadOhm: 8, frequencyHz: 1000, bandwidth: band },
      }),
      r("thd", 0.00014, "%", {
        channel: "right",
        origin: "capture",
        captureId: "cap_demo_1k_right",
        conditions: { powerW: 60, loadOhm: 8, frequencyHz: 1000 },
      }),
      r("thd_n", 0.00021, "%", {
        channel: "right",
        origin: "capture",
        captureId: "cap_demo_1k_right",
        conditions: { powerW: 60, loadOhm: 8, frequencyHz: 1000, bandwidth: band },
      }),
      r("snr", 98, "dB(A)", { channel: "both", conditions: { powerW: 60, loadOhm: 8, weighting: "A" } }),
      r("f3db_low", 7, "Hz", { channel: "both", conditions: { powerW: 1, loadOhm: 8 } }),
      r("f3db_high", 95_000, "kHz", { channel: "both", conditions: { powerW: 1, loadOhm: 8 } }),
      r("rise_time", 3.7e-6, "µs", {
        channel: "left",
        origin: "capture",
        captureId: "cap_demo_square_10k",
        conditions: { frequencyHz: 10_000, voltageV: 1, loadOhm: 8 },
      }),
      r("slew_rate", 22e6, "V/µs", { channel: "left", conditions: { loadOhm: 8 } }),
      r("damping_factor", 150, "", { channel: "left", conditions: { loadOhm: 8, frequencyHz: 1000 } }),
      r("output_impedance", 0.053, "Ω", { channel: "left", conditions: { frequencyHz: 1000 } }),
      r("dc_offset", 0.004, "mV", { channel: "left" }),
      r("dc_offset", -0.006, "mV", { channel: "right" }),
    ],
    sweeps: [],
    notes: "Recapped, new output-stage bias trimmers, relay cleaned. Demo sheet: invented unit.",
  };
}

/** The same sheet with the 4 Ω power tripled: the half-load rule calls it implausible. */
export function doctoredIntegratedAmplifierSheet(): BenchSheet {
  const sheet = exampleIntegratedAmplifierSheet();
  sheet.readings = sheet.readings.map((x) =>
    x.quantity === "output_power" && x.basis === "measured" && x.conditions.loadOhm === 4
      ? { ...x, value: x.channel === "left" ? 198 : 195 }
      : x,
  );
  return sheet;
}

/** The example as an API client would send it: defaults left out. */
export function exampleIntegratedAmplifierRequest(): BenchSheetInput {
  const { sweeps: _defaulted, ...sheet } = exampleIntegratedAmplifierSheet();
  return {
    ...sheet,
    readings: sheet.readings.map(({ origin, conditions, ...rest }) => ({
      ...rest,
      ...(origin === "capture" ? { origin } : {}),
      ...(Object.keys(conditions).length ? { conditions } : {}),
    })),
  };
}
