import { z } from "zod";
import { freeText } from "@shared/text";
import { idSchema } from "@shared/ids";

// What people send in messages and offers, checked on the server (and by the thread's form).

export const MESSAGE_MAX = 4000;

export const MessageInputSchema = z.object({
  body: freeText("Your message")
    .trim()
    .min(1, "Write a message first.")
    .max(MESSAGE_MAX, `Keep a message under ${MESSAGE_MAX.toLocaleString("en-GB")} characters.`),
});

export const OpenThreadSchema = z.object({ listingId: idSchema("listing") });

/** An offer or a counter in the API: integer minor units in the listing's currency. */
export const OfferAmountSchema = z.object({
  amountMinor: z
    .number({ error: "Give the amount in minor units (cents, pence)." })
    .int("Give the amount in whole minor units.")
    .positive("An offer must be more than nothing."),
  currency: z.string().regex(/^[A-Z]{3}$/, "Give a three-letter currency code."),
});

export const MakeOfferSchema = OfferAmountSchema.extend({ listingId: idSchema("listing") });

export const OfferAnswerSchema = z.discriminatedUnion("action", [
  z.object({ action: z.literal("accept") }),
  z.object({ action: z.literal("decline") }),
  z.object({ action: z.literal("withdraw") }),
  z.object({ action: z.literal("counter") }).extend(OfferAmountSchema.shape),
]);
export type OfferAnswer = z.infer<typeof OfferAnswerSchema>;
