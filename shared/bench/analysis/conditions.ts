// The conditions a capture is uploaded with, validated the same way in the browser form and on the server.
import { z } from "zod";

const hz = z.number().positive().max(1_000_000);
const band = z
  .strictObject({ lowHz: hz, highHz: hz })
  .refine((b) => b.lowHz < b.highHz, { message: "The low end must be below the high end.", path: ["highHz"] });

export const captureScaleSchema = z.discriminatedUnion("kind", [
  z.strictObject({
    kind: z.literal("volts-per-full-scale"),
    /** Volts at the unit's output that a full-scale sample stands for. */
    volts: z.number({ error: "type the voltage a full-scale sample stands for, e.g. 40" }).positive().max(10_000),
    /** "peak": the full-scale sample's own value; "rms": the rms of a sine that just reaches full scale. */
    basis: z.enum(["peak", "rms"]),
  }),
  z.strictObject({
    kind: z.literal("analyser"),
    /** The analyser's full scale at its input, volts. */
    fullScaleVolts: z.number({ error: "type the analyser's full-scale voltage, e.g. 2" }).positive().max(1_000),
    basis: z.enum(["peak", "rms"]),
    /** Unit output ÷ analyser input: 1 direct, 10 for a 10:1 divider or probe. */
    attenuation: z.number().positive().max(10_000),
  }),
]);

const channel = z.enum(["left", "right", "mono", "both"]);

export const sineCaptureConditionsSchema = z.strictObject({
  kind: z.literal("sine"),
  scale: captureScaleSchema,
  loadOhm: z.number().positive().max(1_000_000).optional(),
  fundamentalHz: hz.optional(),
  bandwidth: band.optional(),
  weighting: z.enum(["unweighted", "A"]).default("unweighted"),
  window: z.enum(["blackman-harris-7", "blackman-harris-4", "flat-top", "hann"]).default("blackman-harris-7"),
  resolutionHz: z.number().positive().max(1_000).optional(),
  /** For a mono file: which of the unit's channels it holds. A stereo file is left, right. */
  channel: channel.optional(),
  channelsDriven: z.enum(["one", "both", "all"]).optional(),
  mainsV: z.number().positive().max(480).optional(),
  warmUpS: z
    .number()
    .nonnegative()
    .max(7 * 86_400)
    .optional(),
});

export const squareCaptureConditionsSchema = z.strictObject({
  kind: z.literal("square"),
  channel: channel.optional(),
  loadOhm: z.number().positive().max(1_000_000).optional(),
  /** Square-wave repetition frequency, for the record. */
  frequencyHz: hz.optional(),
});

export const sweepCaptureConditionsSchema = z.strictObject({
  kind: z.literal("sweep"),
  levelUnit: z.enum(["dB", "V"]).optional(),
  reference: z.enum(["flat", "riaa"]).default("flat"),
  iecPole: z.boolean().default(false),
  band: band.optional(),
  channel: channel.optional(),
  loadOhm: z.number().positive().max(1_000_000).optional(),
});

/** A loudspeaker's impedance sweep: frequency, ohms and optionally phase (CSV). */
export const impedanceCaptureConditionsSchema = z.strictObject({
  kind: z.literal("impedance"),
  /** The rated (nominal) impedance, for the 80 % check (IEC 60268-5 §16.1). */
  ratedOhm: z.number().positive().max(1_000).optional(),
  /** The rated frequency range: the minimum is sought within it. */
  band: band.optional(),
  channel: channel.optional(),
  /** Drive level of the sweep, volts rms, for the record. */
  driveV: z.number().positive().max(100).optional(),
});

/** A stereo WAV with one side driven: the leak into the other side at each test tone. */
export const separationCaptureConditionsSchema = z.strictObject({
  kind: z.literal("separation"),
  /** The driven side; by default the louder one. */
  driven: z.enum(["left", "right"]).optional(),
  /** The test tones; by default every harmonic-free tone on the driven side. */
  frequenciesHz: z.array(hz).min(1).max(24).optional(),
  /** Only for the driven level in volts; the separation itself is a ratio. */
  scale: captureScaleSchema.optional(),
  loadOhm: z.number().positive().max(1_000_000).optional(),
});

/** A two-tone WAV: SMPTE (60 Hz + 7 kHz, 4:1) or difference-frequency (19 + 20 kHz) intermodulation. */
export const imdCaptureConditionsSchema = z
  .strictObject({
    kind: z.literal("imd"),
    method: z.enum(["smpte", "dfd"]),
    /** The tones, when they are not the method's usual pair. */
    lowToneHz: hz.optional(),
    highToneHz: hz.optional(),
    scale: captureScaleSchema.optional(),
    loadOhm: z.number().positive().max(1_000_000).optional(),
    channel: channel.optional(),
    channelsDriven: z.enum(["one", "both", "all"]).optional(),
  })
  .refine((c) => c.lowToneHz === undefined || c.highToneHz === undefined || c.lowToneHz < c.highToneHz, {
    message: "The low tone must be below the high tone.",
    path: ["highToneHz"],
  });

/** A WAV of one tone, played with the output open and then into a known load (either order). */
export const outputImpedanceCaptureConditionsSchema = z.strictObject({
  kind: z.literal("output_impedance"),
  /** The load of the loaded reading, Ω. */
  loadOhm: z.number({ error: "type the load the second reading was taken into, e.g. 8" }).positive().max(1_000_000),
  /** The load a damping factor is quoted into (8 Ω); leave out for a line output. */
  nominalLoadOhm: z.number().positive().max(1_000).optional(),
  frequencyHz: hz.optional(),
  scale: captureScaleSchema.optional(),
  channel: channel.optional(),
});
/** A test tone played from a test record or tape: 3150 Hz read as a weighted peak (IEC 60386), or 3000 Hz as WRMS. */
export const wowFlutterCaptureConditionsSchema = z.strictObject({
  kind: z.literal("wow_flutter"),
  testToneHz: z.union([z.literal(3150), z.literal(3000)], { error: "the test tone is 3150 Hz (IEC 60386) or 3000 Hz (WRMS)" }),
  /** Which reading goes on the sheet; without it, the tone's own convention (`wowFlutterConvention`). */
  convention: z.enum(["IEC-60386-peak", "WRMS"]).optional(),
  speedRpm: z.number().positive().max(100).optional(),
  tapeSpeedCmS: z.number().positive().max(500).optional(),
  channel: channel.optional(),
});

/** The stated convention, else 3000 Hz → WRMS and 3150 Hz → weighted peak. */
export const wowFlutterConvention = (c: { testToneHz: number; convention?: "IEC-60386-peak" | "WRMS" }) =>
  c.convention ?? (c.testToneHz === 3000 ? "WRMS" : "IEC-60386-peak");

export const captureConditionsSchema = z.discriminatedUnion("kind", [
  sineCaptureConditionsSchema,
  squareCaptureConditionsSchema,
  sweepCaptureConditionsSchema,
  impedanceCaptureConditionsSchema,
  separationCaptureConditionsSchema,
  imdCaptureConditionsSchema,
  outputImpedanceCaptureConditionsSchema,
  wowFlutterCaptureConditionsSchema,
]);

export type CaptureConditions = z.infer<typeof captureConditionsSchema>;
export type CaptureConditionsInput = z.input<typeof captureConditionsSchema>;
export type SineCaptureConditions = z.infer<typeof sineCaptureConditionsSchema>;
export type SquareCaptureConditions = z.infer<typeof squareCaptureConditionsSchema>;
export type SweepCaptureConditions = z.infer<typeof sweepCaptureConditionsSchema>;
export type ImpedanceCaptureConditions = z.infer<typeof impedanceCaptureConditionsSchema>;
export type CaptureKind = CaptureConditions["kind"];
export type SeparationCaptureConditions = z.infer<typeof separationCaptureConditionsSchema>;
export type ImdCaptureConditions = z.infer<typeof imdCaptureConditionsSchema>;
export type OutputImpedanceCaptureConditions = z.infer<typeof outputImpedanceCaptureConditionsSchema>;
export type WowFlutterCaptureConditions = z.infer<typeof wowFlutterCaptureConditionsSchema>;
