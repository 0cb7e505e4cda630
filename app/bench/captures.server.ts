// Capture files in, measurements out: identify, refuse what cannot be measured, analyse, map to readings.
import {
  CaptureError,
  analyseSine,
  analyseSquare,
  analyseSweep,
  captureConditionsSchema,
  findClippedRun,
  parseTwoColumnCsv,
  headerUnit,
  sineToReadings,
  squareToReadings,
  sweepToSheet,
  analyseImd,
  analyseSeparation,
  analyseOutputImpedance,
  imdToReadings,
  separationToReadings,
  outputImpedanceToReadings,
  type ImdAnalysis,
  type SeparationAnalysis,
  type OutputImpedanceAnalysis,
  SQUARE_COLUMNS,
  SWEEP_COLUMNS,
  SINE_DEFAULTS,
  type CaptureConditions,
  type CaptureKind,
  type SineAnalysis,
  type SineCaptureConditions,
  type SquareAnalysis,
  type SweepAnalysis,
  type SweepCaptureConditions,
  type ImpedanceAnalysis,
  analyseWowFlutter,
  wowFlutterConvention,
  wowFlutterToReadings,
  type WowFlutterAnalysis,
  type WowFlutterCaptureConditions,
} from "@shared/bench/analysis";
import type { Reading, Sweep } from "@shared/bench/schema";
import { analyseImpedanceCsv } from "./impedance.server";
import { describeBinary, sniff } from "./sniff.server";
import { decodeWavData, readWavFormat, type DecodedWav, type WavFormat } from "./wav.server";

export { CaptureError, isCaptureError } from "@shared/bench/analysis";

export const CAPTURE_LIMITS = { maxBytes: 50 * 1024 * 1024, maxSeconds: 60 } as const;

export type CaptureFileKind = "wav" | "csv";

export type CaptureFormat = ({ file: "wav" } & WavFormat) | { file: "csv"; rows: number; header: [string, string] | null };

export type CaptureAnalysis =
  | { kind: "sine"; analysis: SineAnalysis; readings: Reading[]; format: CaptureFormat }
  | { kind: "impedance"; analysis: ImpedanceAnalysis; readings: Reading[]; format: CaptureFormat }
  | { kind: "square"; analysis: SquareAnalysis; readings: Reading[]; format: CaptureFormat }
  | { kind: "sweep"; analysis: SweepAnalysis; readings: Reading[]; sweep: Sweep; format: CaptureFormat }
  | { kind: "separation"; analysis: SeparationAnalysis; readings: Reading[]; format: CaptureFormat }
  | { kind: "imd"; analysis: ImdAnalysis; readings: Reading[]; format: CaptureFormat }
  | { kind: "output_impedance"; analysis: OutputImpedanceAnalysis; readings: Reading[]; format: CaptureFormat }
  | { kind: "wow_flutter"; analysis: WowFlutterAnalysis; readings: Reading[]; format: CaptureFormat };

const mb = (n: number) => `${(n / 1024 / 1024).toFixed(1)} MB`;

/** Refuse an empty file or one over the size limit (before reading it). */
export function checkSize(byteLength: number): void {
  if (byteLength === 0) throw new CaptureError("empty_file", "The file is empty.");
  if (byteLength > CAPTURE_LIMITS.maxBytes) {
    throw new CaptureError("file_too_large", `The file is ${mb(byteLength)}; captures are limited to ${mb(CAPTURE_LIMITS.maxBytes)}.`, {
      bytes: byteLength,
      limit: CAPTURE_LIMITS.maxBytes,
    });
  }
}

/**
 * WAV or CSV, judged by content; the name only sharpens the message. `description` names a binary file
 * (from `describeBinary`); `identifyCaptureFile` asks for it.
 */
export function identifyCapture(bytes: Uint8Array, filename: string, description?: string): CaptureFileKind {
  checkSize(bytes.length);
  const s = sniff(bytes, description);
  const namedWav = /\.wave?$/i.test(filename);
  if (s.kind === "wav") return "wav";
  if (s.kind === "text") {
    if (namedWav) throw new CaptureError("not_wav", `"${filename}" is named as a WAV but holds text, not audio.`);
    return "csv";
  }
  if (namedWav) throw new CaptureError("not_wav", `"${filename}" is named as a WAV but is ${s.description}.`);
  throw new CaptureError("unsupported_format", `The file is ${s.description}; upload a WAV (PCM or float) or a CSV.`);
}

/** `identifyCapture`, with a binary file named by its signature (file-type), as the upload checks it. */
export async function identifyCaptureFile(bytes: Uint8Array, filename: string): Promise<CaptureFileKind> {
  checkSize(bytes.length);
  const other = sniff(bytes).kind === "other";
  return identifyCapture(bytes, filename, other ? await describeBinary(bytes) : undefined);
}

/** The kind the file implies when the uploader did not say: WAV → sine; CSV by its header. */
export function inferKind(bytes: Uint8Array, file: CaptureFileKind): CaptureKind | null {
  if (file === "wav") return "sine";
  const head = new TextDecoder().decode(bytes.subarray(0, 2048)).toLowerCase();
  const firstLine = head.split(/\r?\n/).find((l) => l.trim() !== "" && !l.trim().startsWith("#")) ?? "";
  if (/\btime\b|^\s*t\s*[,;\t]/.test(firstLine)) return "square";
  if (/freq|hz/.test(firstLine) && /ohm|impedance|\u03a9|\u2126|\|z\|/.test(firstLine)) return "impedance";
  if (/freq|hz/.test(firstLine)) return "sweep";
  return null;
}

const FILE_FOR_KIND: Record<CaptureKind, CaptureFileKind> = {
  sine: "wav",
  square: "csv",
  sweep: "csv",
  impedance: "csv",
  separation: "wav",
  imd: "wav",
  output_impedance: "wav",
  wow_flutter: "wav",
};
const KIND_WORDS: Record<CaptureKind, string> = {
  sine: "a sine capture (WAV)",
  square: "a square-wave response (CSV time,volts)",
  sweep: "a frequency sweep (CSV frequency,level)",
  impedance: "an impedance sweep (CSV frequency,ohms[,phase])",
  separation: "a stereo capture with one channel driven (WAV)",
  imd: "a two-tone capture (WAV)",
  output_impedance: "a tone played open and then loaded (WAV)",
  wow_flutter: "a wow & flutter test tone (WAV)",
};

function checkKind(kind: CaptureKind, file: CaptureFileKind) {
  if (FILE_FOR_KIND[kind] !== file) {
    throw new CaptureError("kind_mismatch", `The conditions describe ${KIND_WORDS[kind]}, but the file is a ${file.toUpperCase()}.`, {
      kind,
      file,
    });
  }
}

function checkWav(w: WavFormat, c: Pick<SineCaptureConditions, "resolutionHz">) {
  if (w.durationS > CAPTURE_LIMITS.maxSeconds) {
    throw new CaptureError(
      "too_long",
      `The capture lasts ${w.durationS.toFixed(1)} s; captures are limited to ${CAPTURE_LIMITS.maxSeconds} s.`,
      {
        seconds: w.durationS,
      },
    );
  }
  const resolution = c.resolutionHz ?? SINE_DEFAULTS.resolutionHz;
  const need = Math.ceil(w.sampleRate / resolution);
  if (w.frames < need) {
    throw new CaptureError(
      "too_short",
      `The capture holds ${w.durationS.toFixed(3)} s (${w.frames} samples at ${w.sampleRate} Hz); a ${resolution} Hz resolution needs at least ${(need / w.sampleRate).toFixed(3)} s.`,
      { frames: w.frames, neededFrames: need },
    );
  }
}

const when = (s: number) => (s < 1 ? `${(s * 1000).toFixed(1)} ms` : `${s.toFixed(3)} s`);

/**
 * Refuse clipping on any channel; return the channels that are not digital silence. A stereo file
 * with one side left empty is analysed on the other.
 */
function checkSamples(d: DecodedWav): { samples: Float64Array[]; labels: string[] } {
  const names = d.channels === 1 ? ["mono"] : ["left", "right"];
  const live: number[] = [];
  d.samples.forEach((x, i) => {
    const run = findClippedRun(x, d.positiveFullScale);
    if (run) {
      throw new CaptureError(
        "clipped",
        `The ${names[i]} channel sits at digital full scale for ${run.length} samples from ${when(run.index / d.sampleRate)}: the analyser input was overloaded. Add attenuation and capture again.`,
        { channel: names[i], atSeconds: run.index / d.sampleRate, samples: run.length },
      );
    }
    let peak = 0;
    for (let k = 0; k < x.length; k++) peak = Math.max(peak, Math.abs(x[k]));
    if (peak >= 1e-7) live.push(i);
  });
  if (live.length === 0) {
    const which = names.length === 1 ? `the ${names[0]} channel is` : "both channels are";
    throw new CaptureError("no_fundamental", `No fundamental found: ${which} silent.`);
  }
  return { samples: live.map((i) => d.samples[i]), labels: live.map((i) => names[i]) };
}

/** How many of a capture's first bytes the web process reads to tell what it is. */
export const HEADER_BYTES = 64 * 1024;

/**
 * What can be refused from the first bytes alone, while the upload streams on to storage: what the
 * file is, whether it is the kind the conditions describe, and a WAV's encoding, depth, channels and
 * rate. Everything else (length, clipping, silence, a CSV's rows) is the analysis job's.
 */
export function checkHeader(head: Uint8Array, filename: string, conditions: CaptureConditions): void {
  const file = identifyCapture(head, filename);
  checkKind(conditions.kind, file);
  if (file !== "wav") return;
  try {
    readWavFormat(head);
  } catch (e) {
    // A header longer than the first bytes is the job's to read; only a format we cannot use is final.
    if (e instanceof CaptureError && e.code === "unsupported_format") throw e;
  }
}

function readCsv(bytes: Uint8Array, kind: "square" | "sweep") {
  const text = new TextDecoder("utf-8").decode(bytes);
  return parseTwoColumnCsv(text, kind === "square" ? SQUARE_COLUMNS : SWEEP_COLUMNS);
}

/** The sweep's level unit: as stated, else as the header says, else dB. */
function sweepLevelUnit(c: SweepCaptureConditions, header: [string, string] | null): "dB" | "V" {
  if (c.levelUnit) return c.levelUnit;
  const unit = header ? (headerUnit(header[1]) ?? header[1].toLowerCase()) : "";
  return /^(v|volts?|vrms|voltage)$/.test(unit.trim()) ? "V" : "dB";
}

/** A test tone from a test record or tape: the first live channel (or the one the conditions name) is read. */
function analyseWowFlutterWav(bytes: Uint8Array, c: WowFlutterCaptureConditions, captureId: string): CaptureAnalysis {
  const { format: wavFormat, data } = readWavFormat(bytes);
  if (wavFormat.durationS > CAPTURE_LIMITS.maxSeconds) {
    throw new CaptureError(
      "too_long",
      `The capture lasts ${wavFormat.durationS.toFixed(1)} s; captures are limited to ${CAPTURE_LIMITS.maxSeconds} s.`,
      {
        seconds: wavFormat.durationS,
      },
    );
  }
  const d = decodeWavData(wavFormat, data);
  const { samples, labels } = checkSamples(d);
  const pick = Math.max(0, c.channel ? labels.indexOf(c.channel) : 0);
  const analysis = analyseWowFlutter(samples[pick], d.sampleRate, {
    nominalHz: c.testToneHz,
    convention: wowFlutterConvention(c),
    channel: labels[pick],
  });
  const { samples: _omit, positiveFullScale: _pfs, ...format } = d;
  return { kind: "wow_flutter", analysis, readings: wowFlutterToReadings(analysis, c, captureId), format: { file: "wav", ...format } };
}

export function analyseCapture(bytes: Uint8Array, filename: string, conditions: CaptureConditions, captureId: string): CaptureAnalysis {
  const file = identifyCapture(bytes, filename);
  checkKind(conditions.kind, file);
  if (conditions.kind === "wow_flutter") return analyseWowFlutterWav(bytes, conditions, captureId);
  if (conditions.kind === "sine") {
    const { format: wavFormat, data } = readWavFormat(bytes);
    checkWav(wavFormat, conditions);
    const d = decodeWavData(wavFormat, data);
    const { samples, labels } = checkSamples(d);
    const analysis = analyseSine(
      samples,
      d.sampleRate,
      {
        scale: conditions.scale,
        loadOhms: conditions.loadOhm,
        fundamentalHz: conditions.fundamentalHz,
        bandwidth: conditions.bandwidth,
        weighting: conditions.weighting,
        window: conditions.window,
        resolutionHz: conditions.resolutionHz,
      },
      labels,
    );
    const { samples: _omit, positiveFullScale: _pfs, ...format } = d;
    return { kind: "sine", analysis, readings: sineToReadings(analysis, conditions, captureId), format: { file: "wav", ...format } };
  }
  if (conditions.kind === "impedance") return analyseImpedanceCsv(bytes, conditions, captureId);
  if (conditions.kind === "separation" || conditions.kind === "imd" || conditions.kind === "output_impedance") {
    return analyseTwoToneKinds(bytes, conditions, captureId);
  }
  const cols = readCsv(bytes, conditions.kind);
  const format: CaptureFormat = { file: "csv", rows: cols.x.length, header: cols.header };
  if (conditions.kind === "square") {
    const analysis = analyseSquare(cols.x, cols.y);
    return { kind: "square", analysis, readings: squareToReadings(analysis, conditions, captureId), format };
  }
  const levelUnit = sweepLevelUnit(conditions, cols.header);
  const analysis = analyseSweep(cols.x, cols.y, {
    levelUnit,
    reference: conditions.reference,
    iecPole: conditions.iecPole,
    band: conditions.band,
  });
  const { sweep, readings } = sweepToSheet(analysis, { ...conditions, levelUnit }, captureId);
  return { kind: "sweep", analysis, readings, sweep, format };
}

export { captureConditionsSchema };

type TwoToneKinds = Extract<CaptureConditions, { kind: "separation" | "imd" | "output_impedance" }>;

/** Separation, intermodulation and output impedance: WAV captures past the sine's checks. */
function analyseTwoToneKinds(bytes: Uint8Array, conditions: TwoToneKinds, captureId: string): CaptureAnalysis {
  const { format: wavFormat, data } = readWavFormat(bytes);
  checkWav(wavFormat, { resolutionHz: 5 });
  const d = decodeWavData(wavFormat, data);
  const { samples: _omit, positiveFullScale: _pfs, ...rest } = d;
  const format: CaptureFormat = { file: "wav", ...rest };
  if (conditions.kind === "separation") {
    // The undriven side is the point: keep it, silent or not; clipping is still refused.
    checkSamples(d);
    const analysis = analyseSeparation(d.samples, d.sampleRate, {
      driven: conditions.driven,
      frequenciesHz: conditions.frequenciesHz,
      scale: conditions.scale,
      loadOhms: conditions.loadOhm,
    });
    return { kind: "separation", analysis, readings: separationToReadings(analysis, conditions, captureId), format };
  }
  const { samples, labels } = checkSamples(d);
  if (conditions.kind === "imd") {
    const analysis = analyseImd(
      samples,
      d.sampleRate,
      {
        method: conditions.method,
        lowToneHz: conditions.lowToneHz,
        highToneHz: conditions.highToneHz,
        scale: conditions.scale,
        loadOhms: conditions.loadOhm,
      },
      labels,
    );
    return { kind: "imd", analysis, readings: imdToReadings(analysis, conditions, captureId), format };
  }
  const analysis = analyseOutputImpedance(
    samples,
    d.sampleRate,
    {
      loadOhms: conditions.loadOhm,
      nominalLoadOhms: conditions.nominalLoadOhm,
      frequencyHz: conditions.frequencyHz,
      scale: conditions.scale,
    },
    labels,
  );
  return { kind: "output_impedance", analysis, readings: outputImpedanceToReadings(analysis, conditions, captureId), format };
}
