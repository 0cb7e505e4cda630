import { z } from "zod";
import { freeText, nameText } from "./text";

// The catalogue's schemas for what sellers type (shipping options, restoration parts and readings), kept
// apart from the vocabulary in catalogue.ts so the public pages that only show words load no zod.

const minor = z.number().int("must be a whole number of minor units").min(0, "cannot be negative").max(10_000_000);

const zonePrices = z
  .object({ domestic: minor.optional(), nearby: minor.optional(), worldwide: minor.optional() })
  .strict()
  .refine((p) => Object.values(p).some((v) => v !== undefined), { message: "give a price for at least one zone" });

export const ShippingOptionSchema = z.discriminatedUnion("method", [
  z.object({ method: z.literal("collection"), note: freeText("The collection note").trim().max(200).optional() }).strict(),
  z.object({ method: z.literal("parcel"), prices: zonePrices }).strict(),
  z.object({ method: z.literal("freight"), prices: zonePrices }).strict(),
]);
export type ShippingOption = z.infer<typeof ShippingOptionSchema>;

export const ShippingOptionsSchema = z
  .array(ShippingOptionSchema)
  .max(3)
  .refine((opts) => new Set(opts.map((o) => o.method)).size === opts.length, {
    message: "each shipping method may appear once",
  });

/** Parts replaced in one restoration step ("C401, C402 — 2 × 2200 µF 63 V"). */
export const RestorationPartSchema = z
  .object({
    part: nameText("The part").min(1, "name the part").max(160),
    quantity: z.number().int().min(1, "at least 1").max(999),
    reference: nameText("The reference").max(80).optional(),
  })
  .strict();
export type RestorationPart = z.infer<typeof RestorationPartSchema>;

/** A reading noted in the restoration log: always a value with its unit and the conditions it was taken in. */
export const RestorationReadingSchema = z
  .object({
    quantity: nameText("The quantity").min(1).max(120),
    value: z.number().finite(),
    unit: nameText("The unit").min(1, "give the unit").max(16),
    conditions: nameText("The conditions").min(1, "say how it was measured").max(200),
  })
  .strict();
export type RestorationReading = z.infer<typeof RestorationReadingSchema>;
