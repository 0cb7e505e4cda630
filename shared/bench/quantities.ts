// The trade's quantities, what kind of value each is, and which categories use them.
import type { Kind } from "./units";

export const CATEGORIES = [
  "integrated_amplifier",
  "power_amplifier",
  "preamplifier",
  "receiver",
  "phono_stage",
  "loudspeaker",
  "turntable",
  "tape_deck",
] as const;
export type Category = (typeof CATEGORIES)[number];

export const CATEGORY_LABELS: Record<Category, string> = {
  integrated_amplifier: "Integrated amplifier",
  power_amplifier: "Power amplifier",
  preamplifier: "Preamplifier",
  receiver: "Receiver (amplifier section)",
  phono_stage: "Phono stage",
  loudspeaker: "Loudspeaker",
  turntable: "Turntable",
  tape_deck: "Tape deck",
};

export const QUANTITIES = [
  "output_power",
  "output_voltage",
  "thd",
  "thd_n",
  "imd",
  "snr",
  "noise",
  "response_deviation",
  "f3db_low",
  "f3db_high",
  "power_bandwidth",
  "rise_time",
  "slew_rate",
  "damping_factor",
  "output_impedance",
  "input_impedance",
  "input_sensitivity",
  "gain",
  "channel_balance",
  "crosstalk",
  "rail_voltage",
  "dc_offset",
  "riaa_deviation",
  "overload_margin",
  "nominal_impedance",
  "impedance_minimum",
  "sensitivity",
  "power_handling",
  "speed_error",
  "wow_flutter",
  "rumble",
  "oscillation",
  "resonance_frequency",
] as const;
export type Quantity = (typeof QUANTITIES)[number];

export type QuantityInfo = {
  label: string;
  kind: Kind;
  /** Base unit the value is stored in, for API users. */
  baseUnit: string;
  /** Signed values allowed (speed error, gain, balance); otherwise the value must be > 0 (or ≥ 0 for ratios/dB). */
  signed?: boolean;
  /** Plain "V" means DC for this quantity. */
  dc?: boolean;
};

export const QUANTITY_INFO: Record<Quantity, QuantityInfo> = {
  output_power: { label: "Output power", kind: "power", baseUnit: "W" },
  output_voltage: { label: "Output voltage", kind: "voltage", baseUnit: "V rms" },
  thd: { label: "THD", kind: "ratio", baseUnit: "fraction (0.0001 = 0.01 %)" },
  thd_n: { label: "THD+N", kind: "ratio", baseUnit: "fraction" },
  imd: { label: "Intermodulation distortion", kind: "ratio", baseUnit: "fraction" },
  snr: { label: "Signal-to-noise ratio", kind: "decibel", baseUnit: "dB" },
  noise: { label: "Output noise", kind: "voltage", baseUnit: "V rms" },
  response_deviation: { label: "Frequency response deviation (±)", kind: "decibel", baseUnit: "dB" },
  f3db_low: { label: "Low −3 dB point", kind: "frequency", baseUnit: "Hz" },
  f3db_high: { label: "High −3 dB point", kind: "frequency", baseUnit: "Hz" },
  power_bandwidth: { label: "Full-power bandwidth, upper end", kind: "frequency", baseUnit: "Hz" },
  rise_time: { label: "Rise time (10–90 %)", kind: "time", baseUnit: "s" },
  slew_rate: { label: "Slew rate", kind: "slewRate", baseUnit: "V/s" },
  damping_factor: { label: "Damping factor", kind: "number", baseUnit: "" },
  output_impedance: { label: "Output impedance", kind: "resistance", baseUnit: "Ω" },
  input_impedance: { label: "Input impedance", kind: "resistance", baseUnit: "Ω" },
  input_sensitivity: { label: "Input sensitivity", kind: "voltage", baseUnit: "V rms" },
  gain: { label: "Gain", kind: "decibel", baseUnit: "dB", signed: true },
  channel_balance: { label: "Channel balance", kind: "decibel", baseUnit: "dB", signed: true },
  crosstalk: { label: "Channel separation", kind: "decibel", baseUnit: "dB" },
  rail_voltage: { label: "Supply rail voltage", kind: "voltage", baseUnit: "V DC", dc: true },
  dc_offset: { label: "DC offset at the output", kind: "voltage", baseUnit: "V DC", dc: true, signed: true },
  riaa_deviation: { label: "RIAA deviation (±)", kind: "decibel", baseUnit: "dB" },
  overload_margin: { label: "Overload margin", kind: "decibel", baseUnit: "dB" },
  nominal_impedance: { label: "Rated impedance", kind: "resistance", baseUnit: "Ω" },
  impedance_minimum: { label: "Impedance minimum", kind: "resistance", baseUnit: "Ω" },
  sensitivity: { label: "Sensitivity", kind: "decibel", baseUnit: "dB SPL" },
  power_handling: { label: "Power handling", kind: "power", baseUnit: "W" },
  speed_error: { label: "Speed error", kind: "ratio", baseUnit: "fraction (+0.002 = 0.2 % fast)", signed: true },
  wow_flutter: { label: "Wow & flutter", kind: "ratio", baseUnit: "fraction" },
  rumble: { label: "Rumble", kind: "decibel", baseUnit: "dB" },
  /** An output seen oscillating on the bench (scope or analyser), at this frequency: a fault, never a rating. */
  oscillation: { label: "Oscillation at the output", kind: "frequency", baseUnit: "Hz" },
  resonance_frequency: { label: "Resonance frequency (impedance peak)", kind: "frequency", baseUnit: "Hz" },
};

/** Never empty: a category's readings form a zod enum. */
type QuantityList = readonly [Quantity, ...Quantity[]];

const AMP: QuantityList = [
  "output_power",
  "output_voltage",
  "thd",
  "thd_n",
  "imd",
  "snr",
  "noise",
  "response_deviation",
  "f3db_low",
  "f3db_high",
  "power_bandwidth",
  "rise_time",
  "slew_rate",
  "damping_factor",
  "output_impedance",
  "input_impedance",
  "input_sensitivity",
  "gain",
  "channel_balance",
  "crosstalk",
  "rail_voltage",
  "dc_offset",
  "oscillation",
];
const PHONO_INPUT: QuantityList = ["riaa_deviation", "overload_margin"];
const LINE: QuantityList = [
  "output_voltage",
  "thd",
  "thd_n",
  "imd",
  "snr",
  "noise",
  "response_deviation",
  "f3db_low",
  "f3db_high",
  "rise_time",
  "slew_rate",
  "output_impedance",
  "input_impedance",
  "input_sensitivity",
  "gain",
  "channel_balance",
  "crosstalk",
  "rail_voltage",
  "dc_offset",
  "oscillation",
];

export const CATEGORY_QUANTITIES: Record<Category, QuantityList> = {
  integrated_amplifier: [...AMP, ...PHONO_INPUT],
  power_amplifier: AMP,
  receiver: [...AMP, ...PHONO_INPUT],
  preamplifier: [...LINE, ...PHONO_INPUT],
  phono_stage: [...LINE, ...PHONO_INPUT],
  loudspeaker: [
    "nominal_impedance",
    "impedance_minimum",
    "sensitivity",
    "response_deviation",
    "f3db_low",
    "f3db_high",
    "thd",
    "power_handling",
    "channel_balance",
    "resonance_frequency",
  ],
  turntable: ["speed_error", "wow_flutter", "rumble", "channel_balance", "crosstalk"],
  tape_deck: [
    "speed_error",
    "wow_flutter",
    "snr",
    "noise",
    "thd",
    "thd_n",
    "response_deviation",
    "f3db_low",
    "f3db_high",
    "channel_balance",
    "crosstalk",
    "output_voltage",
  ],
};

/** Categories whose electronics carry two channels that should match. */
export const STEREO_ELECTRONICS: readonly Category[] = [
  "integrated_amplifier",
  "power_amplifier",
  "receiver",
  "preamplifier",
  "phono_stage",
  "tape_deck",
];
export const AMPLIFIER_CATEGORIES: readonly Category[] = ["integrated_amplifier", "power_amplifier", "receiver"];
/** Categories whose sheets may hold RIAA sweeps. */
export const RIAA_CATEGORIES: readonly Category[] = ["integrated_amplifier", "receiver", "preamplifier", "phono_stage"];
