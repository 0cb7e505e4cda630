import { z } from "zod";
import { freeText, nameText } from "@shared/text";
import { isCurrency, parsePrice } from "@shared/listing-input";

// The order pages' forms, read with zod: each returns the field's message for the page to show next
// to it. The transitions behind them check the order's state again under a lock.

export type FieldErrors = Record<string, string>;

export const ShipForm = z.object({
  carrier: nameText("The carrier").min(2, "Name the carrier or freight company.").max(60, "Keep the carrier's name under 60 characters."),
  trackingNumber: z
    .string()
    .trim()
    .min(1, "Type the tracking number the carrier gave you.")
    .max(60, "A tracking number of at most 60 characters.")
    .regex(/^[A-Za-z0-9][A-Za-z0-9 ./-]*$/, "Letters, digits, spaces, dots, slashes and dashes only, as the carrier prints it."),
});

export const RESOLUTIONS = ["release", "refund_whole", "refund_part"] as const;
export type Resolution = (typeof RESOLUTIONS)[number];

const ResolveFields = z.object({
  resolution: z.enum(RESOLUTIONS, { message: "Choose release, a whole refund or a part refund." }),
  amount: z.string().optional(),
  note: freeText("The note")
    .trim()
    .min(10, "Say why, in a sentence or two: both sides read this note.")
    .max(2000, "Keep the note under 2,000 characters."),
});

/** The moderator's decision: the refund in minor units (0 = release all, total = refund all). */
export function readResolveForm(
  fields: Record<string, unknown>,
  order: { currency: string; totalMinor: number; refundedMinor: number },
): { ok: true; refundMinor: number; note: string } | { ok: false; errors: FieldErrors } {
  const parsed = ResolveFields.safeParse(fields);
  const errors: FieldErrors = {};
  if (!parsed.success) {
    for (const i of parsed.error.issues) errors[String(i.path[0] ?? "form")] ??= i.message;
    return { ok: false, errors };
  }
  const refundable = order.totalMinor - order.refundedMinor;
  const { resolution, note } = parsed.data;
  if (resolution === "release") return { ok: true, refundMinor: 0, note };
  if (resolution === "refund_whole") return { ok: true, refundMinor: refundable, note };
  if (!isCurrency(order.currency)) return { ok: false, errors: { amount: `Unknown currency ${order.currency}.` } };
  const amount = parsePrice(parsed.data.amount ?? "", order.currency);
  if (!amount.ok)
    return { ok: false, errors: { amount: amount.message === "Enter a price." ? "Type the amount to refund." : amount.message } };
  if (amount.value >= refundable)
    return { ok: false, errors: { amount: "A part refund is less than what the buyer paid; choose the whole refund for all of it." } };
  return { ok: true, refundMinor: amount.value, note };
}

/** zod issues → one message per field. */
export function fieldErrors(error: z.ZodError): FieldErrors {
  const errors: FieldErrors = {};
  for (const i of error.issues) errors[String(i.path[0] ?? "form")] ??= i.message;
  return errors;
}
