// Separation, intermodulation and output-impedance analyses as bench-sheet readings (origin "capture").
import { CHANNELS, type Conditions, type Reading } from "../schema";
import { isOneOf } from "../../one-of";
import type { ImdAnalysis } from "./imd";
import type { SeparationAnalysis } from "./separation";
import type { OutputImpedanceAnalysis } from "./output-impedance";
import type { ImdCaptureConditions, OutputImpedanceCaptureConditions, SeparationCaptureConditions } from "./conditions";

type Channel = NonNullable<Reading["channel"]>;

function clean<T extends object>(o: T): T {
  return Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as T;
}

function captured(captureId: string, r: Omit<Reading, "basis" | "origin" | "captureId">): Reading {
  return { ...r, conditions: clean(r.conditions ?? {}), basis: "measured", origin: "capture", captureId };
}

const hz = (f: number) => Math.round(f * 100) / 100;
const sig = (x: number, n = 3) => Number(x.toPrecision(n));

function channelOf(name: string, stated: Channel | undefined): Channel {
  return name === "mono" || !isOneOf(CHANNELS, name) ? (stated ?? "mono") : name;
}

/** One crosstalk reading (Loadline's "Channel separation") per test tone, on the undriven side. */
export function separationToReadings(a: SeparationAnalysis, c: SeparationCaptureConditions, captureId: string): Reading[] {
  // A stepped capture holds each tone for part of its length only, so a level is known for a single tone alone.
  const single = a.points.length === 1;
  return a.points.map((p) => {
    const v = single ? p.drivenRms?.value : undefined;
    const level: Conditions = v === undefined ? {} : c.loadOhm ? { powerW: sig((v * v) / c.loadOhm, 4) } : { voltageV: sig(v, 4) };
    const leak = p.belowNoise ? "below the noise, so at least this" : `−${p.separation.value.toFixed(1)} dB re the driven side`;
    return captured(captureId, {
      quantity: "crosstalk",
      value: Math.round(p.separation.value * 10) / 10,
      unit: "dB",
      channel: a.undriven,
      conditions: { loadOhm: c.loadOhm, frequencyHz: hz(p.frequency.value), channelsDriven: "one", ...level },
      note: `${a.driven} driven, leak into the ${a.undriven}: ${leak}`,
    });
  });
}

export function imdToReadings(a: ImdAnalysis, c: ImdCaptureConditions, captureId: string): Reading[] {
  const rc = a.conditions;
  return a.channels.map((ch) => {
    const v = ch.equivalentSineRms?.value;
    const level: Conditions = v === undefined ? {} : ch.power ? { powerW: sig(ch.power.value, 4) } : { voltageV: sig(v, 4) };
    const tones = `${sig(ch.lowTone.frequency.value, 4)} Hz + ${sig(ch.highTone.frequency.value, 4)} Hz at ${ch.amplitudeRatio.toFixed(2)}:1`;
    const note =
      rc.method === "smpte"
        ? `SMPTE RP120 / IEC 60268-3 modulation distortion, ${tones}: d_m2 ${(100 * ch.second).toPrecision(3)} %, d_m3 ${(100 * ch.third).toPrecision(3)} %, relative to the high tone`
        : `IEC 60268-3 difference-frequency distortion d_2, ${tones}, relative to twice the high tone; d_3 ${(100 * ch.third).toPrecision(3)} %`;
    return captured(captureId, {
      quantity: "imd",
      value: ch.imd.ratio,
      unit: "%",
      channel: channelOf(ch.channel, c.channel),
      conditions: { loadOhm: c.loadOhm, channelsDriven: c.channelsDriven, ...level },
      note,
    });
  });
}

export function outputImpedanceToReadings(a: OutputImpedanceAnalysis, c: OutputImpedanceCaptureConditions, captureId: string): Reading[] {
  const out: Reading[] = [];
  for (const ch of a.channels) {
    const channel = channelOf(ch.channel, c.channel);
    const f = hz(ch.frequency.value);
    const z = ch.outputImpedance.value;
    const ratio = ch.openRmsFs / ch.loadedRmsFs;
    out.push(
      captured(captureId, {
        quantity: "output_impedance",
        value: z,
        unit: z < 1 ? "mΩ" : z < 1000 ? "Ω" : "kΩ",
        channel,
        conditions: { frequencyHz: f },
        note: `open ${ratio.toFixed(5)} × loaded into ${c.loadOhm} Ω: Z_out = R_load · (V_open / V_loaded − 1)`,
      }),
    );
    if (ch.dampingFactor !== null && c.nominalLoadOhm)
      out.push(
        captured(captureId, {
          quantity: "damping_factor",
          value: ch.dampingFactor,
          unit: "",
          channel,
          conditions: { loadOhm: c.nominalLoadOhm, frequencyHz: f },
          note: `DF = ${c.nominalLoadOhm} Ω / Z_out`,
        }),
      );
  }
  return out;
}
