// The buyer's re-measurement as the server accepts it (contest and "accept with my figures"): readings in
// the bench sheet's own shape. Kept apart from remeasure.ts so pages that only show a comparison load no zod.
import { z } from "zod";
import { QUANTITIES, QUANTITY_INFO } from "./quantities";
import { BASES, CHANNELS, ORIGINS, conditionsSchema } from "./schema";
import { kindName, unitKind } from "./units";
import { freeText } from "../text";
import { REMEASURE_OUTCOMES, REMEASURE_ROW_OUTCOMES, type BuyerReading, type BuyerReadings, type Remeasurement } from "./remeasure";

export const MAX_BUYER_READINGS = 60;

export const buyerReadingSchema = z
  .strictObject({
    quantity: z.enum(QUANTITIES),
    /** Base units (W, V rms, fraction, dB, Hz, s, Ω, V/s). */
    value: z.number().refine(Number.isFinite, { message: "Enter a number." }),
    unit: z.string().max(24),
    text: z.string().max(80).optional(),
    channel: z.enum(CHANNELS).optional(),
    conditions: conditionsSchema.default({}),
    ref: z
      .string()
      .regex(/^(readings|sweeps)\.\d{1,3}$/, { message: 'A figure of the sheet is named like "readings.3".' })
      .optional(),
    origin: z.enum(ORIGINS).default("typed"),
    captureId: z.string().min(1).max(64).optional(),
    note: freeText("The reading's note").max(500).optional(),
  })
  .superRefine((r, ctx) => {
    const info = QUANTITY_INFO[r.quantity];
    if (unitKind(r.unit, info.kind) !== info.kind)
      ctx.addIssue({ code: "custom", path: ["unit"], message: `"${r.unit}" does not fit ${info.label}: expected ${kindName(info.kind)}.` });
    const mustBePositive = !info.signed && info.kind !== "decibel";
    if (mustBePositive && !(r.value > 0)) ctx.addIssue({ code: "custom", path: ["value"], message: `${info.label} must be above zero.` });
    if (r.captureId && r.origin !== "capture")
      ctx.addIssue({ code: "custom", path: ["captureId"], message: 'A captureId needs origin "capture".' });
  });

export const BuyerReadingsSchema = z.strictObject({
  readings: z
    .array(buyerReadingSchema)
    .min(1, { message: "Enter at least one figure." })
    .max(MAX_BUYER_READINGS, { message: `At most ${MAX_BUYER_READINGS} figures.` }),
  measuredOn: z.iso.date().optional(),
  equipment: freeText("What you measured with").max(300).optional(),
});

const sideSchema = z.object({
  value: z.number(),
  unit: z.string(),
  display: z.string(),
  conditionsText: z.string(),
  channel: z.enum(CHANNELS).optional(),
});

/** A stored comparison (order_contests.comparison, order_remeasurements.comparison), read back through this. */
export const remeasurementSchema = z.object({
  version: z.int(),
  outcome: z.enum(REMEASURE_OUTCOMES),
  rows: z.array(
    z.object({
      quantity: z.enum(QUANTITIES),
      label: z.string(),
      conditions: conditionsSchema,
      conditionsText: z.string(),
      listed: sideSchema.extend({ ref: z.string(), basis: z.enum(BASES) }).nullable(),
      measured: sideSchema.extend({ index: z.int() }),
      difference: z.object({ value: z.number(), display: z.string() }).nullable(),
      tolerance: z.object({ text: z.string(), source: z.string() }),
      outcome: z.enum(REMEASURE_ROW_OUTCOMES),
      direction: z.enum(["better", "worse", "same"]).optional(),
      reason: z.string().optional(),
    }),
  ),
  counts: z.object({ within: z.int(), outside: z.int(), not_comparable: z.int() }),
});

// The parsed shape is the comparison's own input type; this line fails to compile if the two drift apart.
type Parsed = z.infer<typeof BuyerReadingsSchema>;
const _fits: (p: Parsed) => BuyerReadings = (p) => p;
const _fitsReading: (p: z.infer<typeof buyerReadingSchema>) => BuyerReading = (p) => p;
const _fitsComparison: (p: z.infer<typeof remeasurementSchema>) => Remeasurement = (p) => p;
void _fits;
void _fitsReading;
void _fitsComparison;
