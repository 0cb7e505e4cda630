import type { BenchSheet, Conditions, Reading, Sweep } from "@shared/bench/schema";
import { riaaPlaybackDb } from "@shared/bench/curves";
import type { Category } from "@shared/catalogue";

// Bench sheets for the demo units, built from a few figures per unit so the readings agree with each
// other the way a real bench's would (power, voltage and rails; THD+N above THD; a RIAA sweep that
// follows the curve). The `doctor` options break one relation on purpose, for the review desk.

const SQRT2 = Math.SQRT2;
const audioBand = { lowHz: 20, highHz: 20_000 };
const PCT = 0.01;

function r(quantity: Reading["quantity"], value: number, unit: string, rest: Partial<Reading> = {}): Reading {
  return { quantity, value, unit, basis: "measured", origin: "typed", conditions: {}, ...rest };
}
const rated = (q: Reading["quantity"], value: number, unit: string, rest: Partial<Reading> = {}) =>
  r(q, value, unit, { basis: "rated", ...rest });

const round = (x: number, digits = 1) => Number(x.toFixed(digits));

interface Who {
  maker: string;
  model: string;
  year?: number;
  measuredBy: string;
  measuredOn: string;
}

function head(category: Category, who: Who) {
  return {
    category,
    equipment: { maker: who.maker, model: who.model, ...(who.year ? { year: who.year } : {}) },
    measuredOn: who.measuredOn,
    measuredBy: who.measuredBy,
    sweeps: [],
  };
}

export interface AmpFigures {
  /** Maker's power per channel into 8 Ω (and 4 Ω), 20 Hz–20 kHz, both channels driven. */
  rated8: number;
  rated4?: number;
  ratedThdPct?: number;
  /** Measured per channel (left, right) at 1 kHz, 0.1 % THD, both channels driven. */
  meas8: [number, number];
  meas4?: [number, number];
  /** Measured THD at rated power into 8 Ω, 1 kHz, per channel, %. */
  thdPct: [number, number];
  snrDb: number;
  f3HighHz: number;
  f3LowHz: number;
  dampingFactor?: number;
  /** Only typed power and THD, as a private seller with a meter and a dummy load might have. */
  basic?: boolean;
  /** A typed response sweep at 1 W into 8 Ω whose corners are the −3 dB points above. */
  sweep?: boolean;
  doctor?: "half-load" | "rails" | "voltage";
}

/** Integrated, power amplifiers and receivers. */
export function amplifierSheet(category: Category, who: Who, f: AmpFigures): BenchSheet {
  const bench: Conditions = {
    frequencyHz: 1000,
    atDistortion: { ratio: 0.001, measure: "thd" },
    channelsDriven: "both",
    mainsV: 230,
    warmUpS: 1800,
  };
  const [l8, r8] = f.meas8;
  const [l4, r4] = f.doctor === "half-load" ? [round(l8 * 3, 0), round(r8 * 2.95, 0)] : (f.meas4 ?? [0, 0]);
  const vrms8 = Math.sqrt(l8 * 8);
  const vpp = round(vrms8 * 2 * SQRT2 * (f.doctor === "voltage" ? 0.62 : 1), 1);
  const peaks = [Math.sqrt(2 * Math.max(l8, r8) * 8), l4 ? Math.sqrt(2 * Math.max(l4, r4) * 4) : 0];
  const needed = Math.max(...peaks);
  // Real rails sit a few volts above the largest swing; the doctored sheet claims rails it cannot have.
  const rail = f.doctor === "rails" ? Math.round(needed * 0.78) : Math.ceil(needed * 1.12 + 2);
  const readings: Reading[] = [
    rated("output_power", f.rated8, "W", {
      channel: "both",
      text: `2 × ${f.rated8} W`,
      conditions: {
        loadOhm: 8,
        frequencyRange: audioBand,
        atDistortion: { ratio: (f.ratedThdPct ?? 0.1) * PCT, measure: "thd" },
        channelsDriven: "both",
      },
    }),
    r("output_power", l8, "W", { channel: "left", conditions: { ...bench, loadOhm: 8 } }),
    r("output_power", r8, "W", { channel: "right", conditions: { ...bench, loadOhm: 8 } }),
    r("thd", f.thdPct[0] * PCT, "%", { channel: "left", conditions: { powerW: f.rated8, loadOhm: 8, frequencyHz: 1000 } }),
    r("thd", f.thdPct[1] * PCT, "%", { channel: "right", conditions: { powerW: f.rated8, loadOhm: 8, frequencyHz: 1000 } }),
  ];
  if (f.rated4) {
    readings.push(
      rated("output_power", f.rated4, "W", {
        channel: "both",
        text: `2 × ${f.rated4} W`,
        conditions: {
          loadOhm: 4,
          frequencyRange: audioBand,
          atDistortion: { ratio: (f.ratedThdPct ?? 0.1) * PCT, measure: "thd" },
          channelsDriven: "both",
        },
      }),
    );
  }
  if (l4) {
    readings.push(
      r("output_power", l4, "W", { channel: "left", conditions: { ...bench, loadOhm: 4 } }),
      r("output_power", r4, "W", { channel: "right", conditions: { ...bench, loadOhm: 4 } }),
    );
  }
  if (!f.basic) {
    readings.push(
      r("output_voltage", vpp / (2 * SQRT2), "Vpp", { channel: "left", text: `${vpp} Vpp`, conditions: { ...bench, loadOhm: 8 } }),
      r("rail_voltage", rail, "V", {
        text: `±${rail} V`,
        conditions: { supply: "split" },
        note: "At idle, on the main filter capacitors.",
      }),
      r("thd_n", f.thdPct[0] * 1.35 * PCT, "%", {
        channel: "left",
        conditions: { powerW: f.rated8, loadOhm: 8, frequencyHz: 1000, bandwidth: audioBand },
      }),
      r("snr", f.snrDb, "dB(A)", { channel: "both", conditions: { powerW: f.rated8, loadOhm: 8, weighting: "A" } }),
      r("f3db_low", f.f3LowHz, "Hz", { channel: "both", conditions: { powerW: 1, loadOhm: 8 } }),
      r("f3db_high", f.f3HighHz, "kHz", { channel: "both", conditions: { powerW: 1, loadOhm: 8 } }),
      r("damping_factor", f.dampingFactor ?? 80, "", { channel: "left", conditions: { loadOhm: 8, frequencyHz: 1000 } }),
      r("dc_offset", 0.006, "mV", { channel: "left" }),
      r("dc_offset", -0.004, "mV", { channel: "right" }),
    );
  } else {
    readings.push(r("snr", f.snrDb, "dB(A)", { channel: "both", conditions: { powerW: 1, loadOhm: 8, weighting: "A" } }));
  }
  const sheet: BenchSheet = { ...head(category, who), channelCount: 2, readings };
  if (f.sweep && !f.basic) sheet.sweeps = [responseSweep(f.f3LowHz, f.f3HighHz)];
  return sheet;
}

// Third-octave centres (IEC 61260), 10 Hz–200 kHz.
const THIRD_OCTAVES = [10, 12.5, 16, 20, 25, 31.5, 40, 50, 63, 80]
  .flatMap((f) => [f, f * 10, f * 100, f * 1000, f * 10_000])
  .sort((a, b) => a - b);

/** A flat sweep at 1 W into 8 Ω through single-pole corners at `lowHz` and `highHz`, as a bench's sweep would show them. */
function responseSweep(lowHz: number, highHz: number): Sweep {
  const points = THIRD_OCTAVES.filter((hz) => hz <= 200_000).map((hz) => ({
    frequencyHz: hz,
    levelDb: round(-10 * Math.log10(1 + (lowHz / hz) ** 2) - 10 * Math.log10(1 + (hz / highHz) ** 2), 3),
  }));
  return { kind: "flat", channel: "left", origin: "typed", conditions: { loadOhm: 8, powerW: 1 }, points };
}

export interface LineFigures {
  gainDb: number;
  thdPct: number;
  snrDb: number;
  f3HighHz: number;
  f3LowHz?: number;
  outputOhm?: number;
  /** No noise figure: the sheet stays short of the mark. */
  noNoise?: boolean;
  doctor?: "thdn-below-thd";
}

export function preamplifierSheet(who: Who, f: LineFigures): BenchSheet {
  const at1V: Conditions = { voltageV: 1, frequencyHz: 1000, loadOhm: 10_000 };
  const thdn = f.doctor === "thdn-below-thd" ? f.thdPct * 0.4 : f.thdPct * 1.6;
  const readings: Reading[] = [
    r("gain", f.gainDb, "dB", { channel: "both", conditions: { frequencyHz: 1000, loadOhm: 10_000 } }),
    r("thd", f.thdPct * PCT, "%", { channel: "left", conditions: at1V }),
    r("thd_n", thdn * PCT, "%", { channel: "left", conditions: { ...at1V, bandwidth: audioBand } }),
    r("f3db_high", f.f3HighHz, "kHz", { channel: "both", conditions: { voltageV: 1, loadOhm: 10_000 } }),
    r("output_impedance", f.outputOhm ?? 120, "Ω", { channel: "left", conditions: { frequencyHz: 1000 } }),
    r("channel_balance", 0.1, "dB", { conditions: { frequencyHz: 1000 } }),
  ];
  if (f.f3LowHz) readings.push(r("f3db_low", f.f3LowHz, "Hz", { channel: "both", conditions: { voltageV: 1, loadOhm: 10_000 } }));
  if (!f.noNoise) readings.push(r("snr", f.snrDb, "dB(A)", { channel: "both", conditions: { voltageV: 0.5, weighting: "A" } }));
  return { ...head("preamplifier", who), channelCount: 2, readings };
}

export interface PhonoFigures {
  gainDb: number;
  snrDb: number;
  thdPct: number;
  /** Largest wobble of the sweep around the RIAA curve, dB. */
  wobbleDb: number;
  /** No sweep: the sheet stays short of the mark. */
  noSweep?: boolean;
  /** Output noise, A-weighted, input shorted, µV. */
  noiseUv?: number;
}

export function phonoSheet(who: Who, f: PhonoFigures): BenchSheet {
  const freqs = [20, 30, 50, 70, 100, 200, 300, 500, 700, 1000, 2000, 3000, 5000, 7000, 10_000, 15_000, 20_000];
  const points = freqs.map((hz, i) => ({
    frequencyHz: hz,
    levelDb: round(f.gainDb + riaaPlaybackDb(hz) + f.wobbleDb * Math.sin(i * 1.3) * (hz === 1000 ? 0 : 1), 2),
  }));
  const readings: Reading[] = [
    r("gain", f.gainDb, "dB", { channel: "both", conditions: { frequencyHz: 1000 } }),
    r("snr", f.snrDb, "dB(A)", {
      channel: "both",
      conditions: { voltageV: 0.005, weighting: "A" },
      note: "Re 5 mV at 1 kHz in, input shorted.",
    }),
    r("thd", f.thdPct * PCT, "%", { channel: "left", conditions: { voltageV: 1, frequencyHz: 1000 } }),
    r("channel_balance", 0.15, "dB", { conditions: { frequencyHz: 1000 } }),
  ];
  if (f.noiseUv !== undefined) {
    readings.push(r("noise", f.noiseUv * 1e-6, "µV", { channel: "left", conditions: { weighting: "A" }, note: "Input shorted." }));
  }
  const sheet: BenchSheet = { ...head("phono_stage", who), channelCount: 2, readings };
  if (!f.noSweep) sheet.sweeps = [{ kind: "riaa", channel: "left", origin: "typed", conditions: {}, points }];
  return sheet;
}

export interface TransportFigures {
  speedErrorPct: number;
  wowFlutterPct?: number;
  weighting?: "IEC-60386-peak" | "WRMS";
  rumbleDb?: number;
  ratedWowFlutterPct?: number;
}

export function turntableSheet(who: Who, f: TransportFigures): BenchSheet {
  const at = { speedRpm: 33.33 };
  const weighting = f.weighting ?? "IEC-60386-peak";
  const readings: Reading[] = [r("speed_error", f.speedErrorPct * PCT, "%", { conditions: { ...at, testToneHz: 3150 } })];
  if (f.wowFlutterPct !== undefined) {
    readings.push(
      r("wow_flutter", f.wowFlutterPct * PCT, "%", { conditions: { ...at, weighting, testToneHz: weighting === "WRMS" ? 3000 : 3150 } }),
    );
  }
  if (f.ratedWowFlutterPct !== undefined) {
    readings.push(rated("wow_flutter", f.ratedWowFlutterPct * PCT, "%", { conditions: { ...at, weighting } }));
  }
  // Rumble as the trade quotes it: dB below the reference level, a positive number.
  if (f.rumbleDb !== undefined) readings.push(r("rumble", f.rumbleDb, "dB", { conditions: { ...at, weighting: "unweighted" } }));
  return { ...head("turntable", who), readings };
}

export interface TapeFigures {
  speedErrorPct: number;
  wowFlutterPct: number;
  snrDb: number;
  f3HighHz: number;
  tapeSpeedCmS: number;
}

export function tapeSheet(who: Who, f: TapeFigures): BenchSheet {
  const tape = { tapeSpeedCmS: f.tapeSpeedCmS };
  return {
    ...head("tape_deck", who),
    channelCount: 2,
    readings: [
      r("speed_error", f.speedErrorPct * PCT, "%", { conditions: { ...tape, testToneHz: 3150 } }),
      r("wow_flutter", f.wowFlutterPct * PCT, "%", { conditions: { ...tape, weighting: "IEC-60386-peak", testToneHz: 3150 } }),
      r("snr", f.snrDb, "dB(A)", {
        channel: "both",
        conditions: { ...tape, voltageV: 0.775, weighting: "A" },
        note: "Re 250 nWb/m (0.775 V at the line output), noise reduction off.",
      }),
      r("f3db_high", f.f3HighHz, "kHz", { channel: "both", conditions: { ...tape }, note: "Record–play at −20 dB re 250 nWb/m." }),
      r("channel_balance", 0.3, "dB", { conditions: { ...tape, frequencyHz: 1000 } }),
    ],
  };
}

export interface SpeakerFigures {
  ratedOhm: number;
  minOhm: number;
  minAtHz: number;
  sensitivityDb?: number;
  f3LowHz: number;
}

export function loudspeakerSheet(who: Who, f: SpeakerFigures): BenchSheet {
  const readings: Reading[] = [
    rated("nominal_impedance", f.ratedOhm, "Ω"),
    r("impedance_minimum", f.minOhm, "Ω", { conditions: { frequencyHz: f.minAtHz } }),
    r("f3db_low", f.f3LowHz, "Hz", { conditions: { voltageV: 2.83, distanceM: 1 } }),
  ];
  if (f.sensitivityDb !== undefined) {
    readings.push(r("sensitivity", f.sensitivityDb, "dB SPL", { conditions: { voltageV: Math.sqrt(8), distanceM: 1 } }));
  }
  return { ...head("loudspeaker", who), channelCount: 1, readings };
}
