// Values for display the way listings print them: "112 W", "0.010 %", "17.5 µs", "40 Vpk".
import { SQRT2, toUnit, type Kind, type VoltageForm } from "./units";

/** Three significant figures, trailing zeros dropped: 112, 17.5, 0.05, 5.03, 1234. */
export function formatNumber(x: number, sig = 3, keepZeros = false): string {
  if (!Number.isFinite(x)) return String(x);
  if (x === 0) return "0";
  const abs = Math.abs(x);
  if (abs >= 10 ** sig) return String(Math.round(x));
  let s = x.toPrecision(sig);
  if (s.indexOf("e") >= 0) s = String(Number(s));
  if (!keepZeros && s.indexOf(".") >= 0) {
    let end = s.length;
    while (s.charCodeAt(end - 1) === 48) end--; // "0"
    if (s.charCodeAt(end - 1) === 46) end--; // "."
    s = s.slice(0, end);
  }
  return s;
}

type Scale = [number, string];
const SCALES: Partial<Record<Kind, Scale[]>> = {
  power: [
    [1e3, "kW"],
    [0.1, "W"],
    [1e-3, "mW"],
    [1e-6, "µW"],
    [1e-9, "nW"],
    [0, "pW"],
  ],
  voltage: [
    [1, "V"],
    [1e-3, "mV"],
    [1e-6, "µV"],
    [0, "nV"],
  ],
  frequency: [
    [1e6, "MHz"],
    [1e3, "kHz"],
    [0, "Hz"],
  ],
  time: [
    [1, "s"],
    [1e-3, "ms"],
    [1e-6, "µs"],
    [0, "ns"],
  ],
  resistance: [
    [1e6, "MΩ"],
    [1e3, "kΩ"],
    [0, "Ω"],
  ],
};
const SCALE_FACTOR: Record<string, number> = {
  kW: 1e3,
  W: 1,
  mW: 1e-3,
  µW: 1e-6,
  nW: 1e-9,
  pW: 1e-12,
  V: 1,
  mV: 1e-3,
  µV: 1e-6,
  nV: 1e-9,
  MHz: 1e6,
  kHz: 1e3,
  Hz: 1,
  s: 1,
  ms: 1e-3,
  µs: 1e-6,
  ns: 1e-9,
  MΩ: 1e6,
  kΩ: 1e3,
  Ω: 1,
};

export type FormatOptions = {
  /** Show in this typed unit ("Vpp", "dB", "ppm", "mW"...) instead of choosing one. */
  unit?: string;
  /** For voltages: show the peak, peak-to-peak or DC figure (value is rms unless "dc"). */
  form?: VoltageForm;
  signed?: boolean;
  sig?: number;
  /** Ratios keep trailing zeros ("0.010 %") unless told ("0.1 % THD" as a condition). */
  trimZeros?: boolean;
};

/** "112 W", "0.010 %", "17.5 µs", "28.3 V", "40 Vpk", "5.03 V/µs", "-80 dB". */
const NO_OPTS: FormatOptions = {};

export function formatValue(value: number, kind: Kind, opts: FormatOptions = NO_OPTS): string {
  const s = formatUnsigned(value, kind, opts);
  return opts.signed && value > 0 ? `+${s}` : s;
}

function formatUnsigned(value: number, kind: Kind, opts: FormatOptions): string {
  if (opts.unit !== undefined) {
    const n = toUnit(value, opts.unit, kind);
    const isRatioPct = kind === "ratio" && opts.unit !== "dB";
    const num = isRatioPct ? formatNumber(n, opts.sig ?? 2, !opts.trimZeros) : formatNumber(n, opts.sig ?? 3);
    return opts.unit ? `${num} ${opts.unit}` : num;
  }
  switch (kind) {
    case "ratio":
      return `${formatNumber(value * 100, opts.sig ?? 2, !opts.trimZeros)} %`;
    case "decibel":
      return `${formatNumber(value, opts.sig ?? 3)} dB`;
    case "slewRate":
      return `${formatNumber(value / 1e6, opts.sig ?? 3)} V/µs`;
    case "number":
      return formatNumber(value, opts.sig ?? 3);
    case "voltage": {
      const form = opts.form ?? "rms";
      const v = form === "peak" ? value * SQRT2 : form === "pp" ? value * 2 * SQRT2 : value;
      const s = scaled(v, "voltage", opts.sig);
      const suffix = form === "peak" ? "pk" : form === "pp" ? "pp" : "";
      return `${s.num} ${s.unit}${suffix}`;
    }
    default: {
      const s = scaled(value, kind, opts.sig);
      return `${s.num} ${s.unit}`;
    }
  }
}

function scaled(value: number, kind: Kind, sig = 3): { num: string; unit: string } {
  const scales = SCALES[kind] ?? [[0, ""]];
  const abs = Math.abs(value);
  for (const [min, unit] of scales) {
    if (abs >= min) {
      const f = SCALE_FACTOR[unit] ?? 1;
      const num = formatNumber(value / f, sig);
      // Rounding can reach 1000 (999.96 Hz → "1000 Hz"); that is still correct, just not re-scaled.
      return { num, unit };
    }
  }
  return { num: formatNumber(value, sig), unit: "" };
}
