import { z } from "zod";
import { CURRENCY_CODES, parsePrice, priceInputValue, type Currency } from "@shared/listing-input";

// The admin's marketplace settings form, read with zod: the fee as a percentage ("8" or "8.5") with a
// minimum per currency ("minimum.GBP" = "3.00"), and the timings of the buying path. Each bad field
// gets its own message; nothing is saved unless every field reads.

export interface MarketplaceSettingsInput {
  feeBasisPoints: number;
  feeMinimumMinor: Record<string, number>;
  auditionDays: number;
  arrivalAssumedDays: number;
  reservationMinutes: number;
  offerHours: number;
  offerCheckoutHours: number;
}

/** Bounds for each timing: outside them a slipped digit would strand buyers or sellers. */
export const SETTING_BOUNDS = {
  auditionDays: { min: 1, max: 30, unit: "days", short: "days" },
  arrivalAssumedDays: { min: 2, max: 60, unit: "days", short: "days" },
  reservationMinutes: { min: 5, max: 240, unit: "minutes", short: "min" },
  offerHours: { min: 1, max: 336, unit: "hours", short: "h" },
  offerCheckoutHours: { min: 1, max: 168, unit: "hours", short: "h" },
} as const;
export type TimingField = keyof typeof SETTING_BOUNDS;
export const TIMING_FIELDS = Object.keys(SETTING_BOUNDS) as TimingField[];

/** The highest fee the form takes (in percent): above it the seller would keep too little to be right. */
export const MAX_FEE_PERCENT = 30;

export const FeePercent = z
  .string()
  .trim()
  .min(1, "Type the fee, e.g. 8 or 8.5.")
  .transform((v) => v.replace(/\s*%$/, "").replace(",", "."))
  .refine((v) => /^\d{1,2}(?:\.\d{1,2})?$/.test(v), "Type the fee as a percentage with at most two decimals, e.g. 8.5.")
  .transform((v) => Math.round(Number(v) * 100))
  .refine((bp) => bp <= MAX_FEE_PERCENT * 100, `The fee can be at most ${MAX_FEE_PERCENT} %.`);

function wholeNumber(field: TimingField) {
  const { min, max, unit } = SETTING_BOUNDS[field];
  return z
    .string()
    .trim()
    .min(1, `Type a number of ${unit}.`)
    .regex(/^\d+$/, `Type a whole number of ${unit}.`)
    .transform(Number)
    .refine((n) => n >= min && n <= max, `Between ${min} and ${max} ${unit}.`);
}

const Minimum = (currency: Currency) =>
  z
    .string()
    .trim()
    .transform((v, ctx) => {
      const read = parsePrice(v === "" ? "0" : v, currency, { allowZero: true });
      if (!read.ok) {
        ctx.addIssue({ code: "custom", message: read.message });
        return z.NEVER;
      }
      return read.value;
    });

export type SettingsFormResult = { ok: true; value: MarketplaceSettingsInput } | { ok: false; errors: Record<string, string> };

const one = (form: FormData, key: string): string | null => {
  const all = form.getAll(key);
  return all.length === 1 && typeof all[0] === "string" ? all[0] : null;
};

/** Reads every field; the keys of `errors` are the field names ("feePercent", "minimum.GBP", "auditionDays"…). */
export function readSettingsForm(form: FormData): SettingsFormResult {
  const errors: Record<string, string> = {};
  const take = <T>(key: string, schema: z.ZodType<T, string>): T | undefined => {
    const raw = one(form, key);
    if (raw === null) {
      errors[key] = "Fill this in once.";
      return undefined;
    }
    const parsed = schema.safeParse(raw);
    if (parsed.success) return parsed.data;
    errors[key] = parsed.error.issues[0].message;
    return undefined;
  };
  const feeBasisPoints = take("feePercent", FeePercent);
  const feeMinimumMinor: Record<string, number> = {};
  for (const currency of CURRENCY_CODES) {
    const v = take(`minimum.${currency}`, Minimum(currency));
    if (v !== undefined) feeMinimumMinor[currency] = v;
  }
  const timings: Partial<Record<TimingField, number>> = {};
  for (const field of TIMING_FIELDS) timings[field] = take(field, wholeNumber(field));
  if (Object.keys(errors).length || feeBasisPoints === undefined) return { ok: false, errors };
  return {
    ok: true,
    value: {
      feeBasisPoints,
      feeMinimumMinor,
      auditionDays: timings.auditionDays!,
      arrivalAssumedDays: timings.arrivalAssumedDays!,
      reservationMinutes: timings.reservationMinutes!,
      offerHours: timings.offerHours!,
      offerCheckoutHours: timings.offerCheckoutHours!,
    },
  };
}

/** The stored settings as the form's field values. */
export function settingsFormValues(s: MarketplaceSettingsInput): Record<string, string> {
  const values: Record<string, string> = { feePercent: basisPointsText(s.feeBasisPoints) };
  for (const currency of CURRENCY_CODES) values[`minimum.${currency}`] = priceInputValue(s.feeMinimumMinor[currency] ?? 0, currency);
  for (const field of TIMING_FIELDS) values[field] = String(s[field]);
  return values;
}

/** 850 → "8.5", 800 → "8". */
export function basisPointsText(bp: number): string {
  const whole = Math.floor(bp / 100);
  const frac = String(bp % 100)
    .padStart(2, "0")
    .replace(/0+$/, "");
  return frac ? `${whole}.${frac}` : String(whole);
}
