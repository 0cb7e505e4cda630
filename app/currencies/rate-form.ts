import { z } from "zod";
import { CURRENCY_CODES } from "@shared/listing-input";
import { RATE_DECIMALS, rateMillionths } from "@shared/currency";

// The admin's rate form: one field per currency ("rate.GBP" = "0.86"), the euro being the base.
// Read with zod; each bad field gets its own message.

export const BASE_CURRENCY = "EUR";
/** A change by more than this share of the stored rate must be confirmed (a slipped digit moves every price). */
export const CONFIRM_ABOVE = 0.2;

export const RateValue = z
  .string()
  .trim()
  .min(1, "Type the rate, e.g. 0.86.")
  .regex(/^\d{1,7}(?:\.\d+)?$/, "Type the rate as a plain number with a point, e.g. 0.86.")
  .refine((v) => (v.split(".")[1] ?? "").length <= RATE_DECIMALS, `Use at most ${RATE_DECIMALS} decimals.`)
  .refine((v) => rateMillionths(v) !== null, "A rate must be above zero.")
  .transform((v) => normaliseRate(v));

export interface RateChange {
  currency: string;
  perEur: string;
}

export type RateFormResult = { ok: true; changes: RateChange[]; confirmed: boolean } | { ok: false; errors: Record<string, string> };

const EDITABLE = CURRENCY_CODES.filter((c) => c !== BASE_CURRENCY);

/** The submitted rates (every field present is read; the caller saves only those that differ). */
export function readRateForm(form: FormData): RateFormResult {
  const errors: Record<string, string> = {};
  const changes: RateChange[] = [];
  for (const key of new Set(form.keys())) {
    if (!key.startsWith("rate.")) continue;
    const currency = key.slice(5);
    if (currency === BASE_CURRENCY) errors[currency] = "The euro is the base: 1 EUR is always 1 EUR.";
    else if (!(EDITABLE as string[]).includes(currency)) errors[currency] = `Unknown currency "${currency.slice(0, 8)}".`;
  }
  for (const currency of EDITABLE) {
    const values = form.getAll(`rate.${currency}`);
    if (values.length === 0) continue;
    if (values.length > 1 || typeof values[0] !== "string") {
      errors[currency] = "Give each rate once.";
      continue;
    }
    const parsed = RateValue.safeParse(values[0]);
    if (parsed.success) changes.push({ currency, perEur: parsed.data });
    else errors[currency] = parsed.error.issues[0].message;
  }
  if (Object.keys(errors).length) return { ok: false, errors };
  if (!changes.length) return { ok: false, errors: { form: "Change at least one rate." } };
  return { ok: true, changes, confirmed: form.get("confirm") === "yes" };
}

/** "0860.50" → "860.5": one spelling per value. */
export function normaliseRate(v: string): string {
  const [whole, fraction = ""] = v.split(".");
  const w = whole.replace(/^0+(?=\d)/, "");
  const f = fraction.replace(/0+$/, "");
  return f ? `${w}.${f}` : w;
}

/** True when `next` differs from `stored` by more than CONFIRM_ABOVE of `stored`. */
export function isBigChange(stored: string, next: string): boolean {
  const a = rateMillionths(stored);
  const b = rateMillionths(next);
  if (a === null || b === null) return true;
  const diff = b > a ? b - a : a - b;
  return diff * 100n > BigInt(Math.round(CONFIRM_ABOVE * 100)) * a;
}

/** "+25 %" for the confirmation. */
export function changeShare(stored: string, next: string): string {
  const a = Number(stored);
  const share = Math.round(((Number(next) - a) / a) * 100);
  return `${share > 0 ? "+" : share < 0 ? "−" : "±"}${Math.abs(share)} %`;
}
