// The bench sheet: one unit's readings with the conditions that make each number mean something.
// Values are stored in base units (see QUANTITY_INFO[q].baseUnit); `unit` is the unit as typed, for display.
import { z } from "zod";
import {
  CATEGORIES,
  CATEGORY_QUANTITIES,
  QUANTITIES,
  QUANTITY_INFO,
  RIAA_CATEGORIES,
  AMPLIFIER_CATEGORIES,
  type Category,
  type Quantity,
} from "./quantities";
import { unitKind, kindName } from "./units";
import { freeText, nameText } from "../text";

export const CHANNELS = ["left", "right", "both", "mono"] as const;
export const BASES = ["rated", "measured"] as const;
export const ORIGINS = ["typed", "capture"] as const;
/** Noise and wow & flutter weightings as the trade names them. */
export const WEIGHTINGS = ["A", "CCIR-468", "unweighted", "IEC-60386-peak", "WRMS"] as const;
export const WEIGHTING_LABELS: Record<(typeof WEIGHTINGS)[number], string> = {
  A: "A-weighted",
  "CCIR-468": "CCIR-468 weighted",
  unweighted: "unweighted",
  "IEC-60386-peak": "weighted peak (IEC 60386 / DIN)",
  WRMS: "weighted rms (WRMS)",
};
export const CHANNELS_DRIVEN = ["one", "both", "all"] as const;

const hz = z.number().positive().max(10_000_000);
const band = z
  .strictObject({ lowHz: hz, highHz: hz })
  .refine((r) => r.lowHz < r.highHz, { message: "The low end must be below the high end.", path: ["highHz"] });

export const conditionsSchema = z.strictObject({
  /** Load the output drives (amplifiers), Ω. */
  loadOhm: z.number().positive().max(10_000_000).optional(),
  /** Single test frequency, Hz. */
  frequencyHz: hz.optional(),
  /** Frequency range the figure holds over (power band, response range), Hz. */
  frequencyRange: band.optional(),
  /** Output level as power, W (or drive power for a loudspeaker's sensitivity). */
  powerW: z.number().positive().max(100_000).optional(),
  /** Output level as rms voltage, V (or drive voltage for a loudspeaker's sensitivity: 2.83 V). */
  voltageV: z.number().positive().max(10_000).optional(),
  /** Distortion limit a power figure was taken at, e.g. 0.1 % THD. */
  atDistortion: z.strictObject({ ratio: z.number().positive().max(1), measure: z.enum(["thd", "thd_n"]) }).optional(),
  /** Measurement bandwidth (THD+N, noise), Hz. */
  bandwidth: band.optional(),
  weighting: z.enum(WEIGHTINGS).optional(),
  channelsDriven: z.enum(CHANNELS_DRIVEN).optional(),
  mainsV: z.number().positive().max(480).optional(),
  warmUpS: z
    .number()
    .nonnegative()
    .max(7 * 86_400)
    .optional(),
  /** Test tone, Hz (wow & flutter: 3150 Hz per IEC 60386). */
  testToneHz: hz.optional(),
  distanceM: z.number().positive().max(100).optional(),
  speedRpm: z.number().positive().max(100).optional(),
  tapeSpeedCmS: z.number().positive().max(500).optional(),
  /** Rails: "split" (± each rail, the default) or "single" (one rail to ground). */
  supply: z.enum(["split", "single"]).optional(),
  /** Source impedance the input was terminated with for a noise figure, Ω (thermal-noise floor). */
  sourceOhm: z.number().positive().max(100_000_000).optional(),
  /** Ambient temperature of the measurement, °C (thermal-noise floor; 290 K ≈ 17 °C unless told). */
  temperatureC: z.number().min(-50).max(150).optional(),
});
export type Conditions = z.infer<typeof conditionsSchema>;

function readingFields<Q extends readonly [Quantity, ...Quantity[]]>(quantities: Q) {
  return {
    /** Client-side key; not needed by the bench. */
    id: z.string().max(64).optional(),
    quantity: z.enum(quantities),
    value: z.number(),
    unit: z.string().max(24),
    /** The value exactly as typed, e.g. "80 Vpp". */
    text: z.string().max(80).optional(),
    channel: z.enum(CHANNELS).optional(),
    basis: z.enum(BASES),
    origin: z.enum(ORIGINS).default("typed"),
    captureId: z.string().min(1).max(64).optional(),
    conditions: conditionsSchema.default({}),
    note: freeText("The reading's note").max(500).optional(),
  };
}

type ReadingLike = { quantity: Quantity; value: number; unit: string; basis: string; origin: string; captureId?: string };

function checkReading(r: ReadingLike, ctx: z.RefinementCtx) {
  const info = QUANTITY_INFO[r.quantity];
  const kind = unitKind(r.unit, info.kind);
  if (kind !== info.kind)
    ctx.addIssue({
      code: "custom",
      path: ["unit"],
      message: `"${r.unit}" does not fit ${info.label}: expected ${kindName(info.kind)}.`,
    });
  const mustBePositive = !info.signed && info.kind !== "ratio" && info.kind !== "decibel";
  if (mustBePositive && !(r.value > 0)) ctx.addIssue({ code: "custom", path: ["value"], message: `${info.label} must be above zero.` });
  else if (!info.signed && r.value < 0) ctx.addIssue({ code: "custom", path: ["value"], message: `${info.label} cannot be negative.` });
  if (r.origin === "capture" && r.basis === "rated")
    ctx.addIssue({ code: "custom", path: ["basis"], message: "A figure from a capture is measured, not rated." });
  if (r.captureId && r.origin !== "capture")
    ctx.addIssue({ code: "custom", path: ["captureId"], message: 'A captureId needs origin "capture".' });
}

export const readingSchema = z.strictObject(readingFields(QUANTITIES)).superRefine(checkReading);
export type Reading = z.infer<typeof readingSchema>;
export type ReadingInput = z.input<typeof readingSchema>;

export const sweepPointSchema = z.strictObject({ frequencyHz: hz, levelDb: z.number().min(-300).max(300) });

export const sweepSchema = z
  .strictObject({
    id: z.string().max(64).optional(),
    /** "riaa": a phono stage's playback response, compared with the RIAA curve; "flat": a line response. */
    kind: z.enum(["riaa", "flat"]),
    /** RIAA variant the stage implements; if absent the bench tries both and says which fits. */
    variant: z.enum(["riaa", "riaa_iec"]).optional(),
    channel: z.enum(CHANNELS).optional(),
    origin: z.enum(ORIGINS).default("typed"),
    captureId: z.string().min(1).max(64).optional(),
    conditions: conditionsSchema.default({}),
    /** Level in dB on any reference (dBV, dBu, dB re input): the bench normalises at 1 kHz. */
    points: z.array(sweepPointSchema).min(3).max(4000),
  })
  .superRefine((s, ctx) => {
    for (let i = 1; i < s.points.length; i++)
      if (!(s.points[i].frequencyHz > s.points[i - 1].frequencyHz)) {
        ctx.addIssue({ code: "custom", path: ["points", i, "frequencyHz"], message: "Sweep frequencies must rise from point to point." });
        break;
      }
    if (s.captureId && s.origin !== "capture")
      ctx.addIssue({ code: "custom", path: ["captureId"], message: 'A captureId needs origin "capture".' });
  });
export type Sweep = z.infer<typeof sweepSchema>;

/** The analyser that took the sheet's distortion and noise figures, as its maker or its own loopback states it. */
export const analyserSchema = z.strictObject({
  /** Residual THD+N (loopback), as a fraction. */
  residualThdN: z.number().positive().max(1).optional(),
  /** Residual THD (loopback), as a fraction. */
  residualThd: z.number().positive().max(1).optional(),
  /** Noise floor in its measurement bandwidth, V rms. */
  noiseFloorV: z.number().positive().max(10).optional(),
  /** Bandwidth of the analyser or oscilloscope, Hz: nothing it shows is faster than 0.35 / this. */
  bandwidthHz: z.number().positive().max(100_000_000_000).optional(),
});

export const equipmentSchema = z.strictObject({
  maker: nameText("The equipment's maker").max(120).optional(),
  model: nameText("The equipment's model").max(120).optional(),
  serial: nameText("The equipment's serial number").max(120).optional(),
  year: z.int().min(1900).max(2100).optional(),
});

function sheetSchemaFor<C extends Category>(category: C) {
  const qs = CATEGORY_QUANTITIES[category];
  return z
    .strictObject({
      id: z.string().max(64).optional(),
      category: z.literal(category),
      equipment: equipmentSchema.optional(),
      analyser: analyserSchema.optional(),
      /** Channels the unit has; 2 unless told (1 for a mono block). */
      channelCount: z.int().min(1).max(8).optional(),
      /** Bridged (BTL) output: the peak swing may reach twice a rail. */
      bridged: z.boolean().optional(),
      measuredOn: z.iso.date().optional(),
      measuredBy: nameText("Measured by").max(120).optional(),
      readings: z.array(z.strictObject(readingFields(qs)).superRefine(checkReading)).max(300),
      sweeps: z.array(sweepSchema).max(16).default([]),
      notes: freeText("The notes").max(4000).optional(),
    })
    .superRefine((sheet, ctx) => {
      sheet.sweeps.forEach((s, i) => {
        if (s.kind === "riaa" && !RIAA_CATEGORIES.includes(category))
          ctx.addIssue({
            code: "custom",
            path: ["sweeps", i, "kind"],
            message: "RIAA sweeps belong to phono stages and amplifiers with a phono input.",
          });
      });
      if (sheet.bridged && !AMPLIFIER_CATEGORIES.includes(category))
        ctx.addIssue({ code: "custom", path: ["bridged"], message: "Only amplifiers have a bridged output." });
    });
}

export const categorySheetSchemas = {
  integrated_amplifier: sheetSchemaFor("integrated_amplifier"),
  power_amplifier: sheetSchemaFor("power_amplifier"),
  preamplifier: sheetSchemaFor("preamplifier"),
  receiver: sheetSchemaFor("receiver"),
  phono_stage: sheetSchemaFor("phono_stage"),
  loudspeaker: sheetSchemaFor("loudspeaker"),
  turntable: sheetSchemaFor("turntable"),
  tape_deck: sheetSchemaFor("tape_deck"),
} satisfies Record<Category, unknown>;

/** The general shape every category's sheet fits; the per-category schemas narrow `readings.quantity`. */
export const anySheetShape = z.strictObject({
  id: z.string().optional(),
  category: z.enum(CATEGORIES),
  equipment: equipmentSchema.optional(),
  analyser: analyserSchema.optional(),
  channelCount: z.int().optional(),
  bridged: z.boolean().optional(),
  measuredOn: z.string().optional(),
  measuredBy: z.string().optional(),
  readings: z.array(readingSchema),
  sweeps: z.array(sweepSchema).default([]),
  notes: z.string().optional(),
});
export type BenchSheet = z.infer<typeof anySheetShape>;
export type BenchSheetInput = z.input<typeof anySheetShape>;

const unionSchema = z.discriminatedUnion("category", [
  categorySheetSchemas.integrated_amplifier,
  categorySheetSchemas.power_amplifier,
  categorySheetSchemas.preamplifier,
  categorySheetSchemas.receiver,
  categorySheetSchemas.phono_stage,
  categorySheetSchemas.loudspeaker,
  categorySheetSchemas.turntable,
  categorySheetSchemas.tape_deck,
]);

/** Validates a bench sheet of any category (discriminated by `category`); typed as the general shape, which every category's sheet fits. */
export const benchSheetSchema: z.ZodType<BenchSheet, BenchSheetInput> = unionSchema;

export type SheetIssue = { path: string; message: string };

/** Parse unknown input; issues carry dotted paths such as "readings.0.value". */
export function parseBenchSheet(input: unknown): { ok: true; sheet: BenchSheet } | { ok: false; issues: SheetIssue[] } {
  const r = benchSheetSchema.safeParse(input);
  if (r.success) return { ok: true, sheet: r.data };
  return { ok: false, issues: r.error.issues.map((i) => ({ path: i.path.map(String).join("."), message: i.message })) };
}

export type { Category, Quantity };
