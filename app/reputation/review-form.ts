import { z } from "zod";
import { freeText } from "@shared/text";

// The review forms' fields, read the same way by the pages and the tests: a rating of 1 to 5 and a
// short text; the seller's answer; a moderator's note when hiding one.

export type FieldErrors = Record<string, string>;

export const REVIEW_TEXT_MAX = 1000;

export const ReviewForm = z.object({
  rating: z.coerce
    .number({ message: "Choose a rating from 1 to 5." })
    .int({ message: "Choose a rating from 1 to 5." })
    .min(1, { message: "Choose a rating from 1 to 5." })
    .max(5, { message: "Choose a rating from 1 to 5." }),
  body: freeText("Your review")
    .transform((s) => s.trim())
    .pipe(
      z
        .string()
        .min(1, { message: "Say in a few words how the sale went." })
        .max(REVIEW_TEXT_MAX, { message: `Keep it under ${REVIEW_TEXT_MAX} characters.` }),
    ),
});

export const AnswerForm = z.object({
  answer: freeText("Your answer")
    .transform((s) => s.trim())
    .pipe(
      z
        .string()
        .min(1, { message: "Write your answer." })
        .max(REVIEW_TEXT_MAX, { message: `Keep it under ${REVIEW_TEXT_MAX} characters.` }),
    ),
});

export const HideForm = z.object({
  note: freeText("Note")
    .transform((s) => s.trim())
    .pipe(z.string().min(1, { message: "Say why the review is hidden." }).max(2000, { message: "Keep the note under 2,000 characters." })),
});

/** Parses `fields` with `schema`; errors keyed by field, the first message of each. */
export function readFields<T>(
  schema: z.ZodType<T>,
  fields: Record<string, unknown>,
): { ok: true; value: T } | { ok: false; errors: FieldErrors } {
  const parsed = schema.safeParse(fields);
  if (parsed.success) return { ok: true, value: parsed.data };
  const errors: FieldErrors = {};
  for (const issue of parsed.error.issues) {
    const key = String(issue.path[0] ?? "form");
    errors[key] ??= issue.message;
  }
  return { ok: false, errors };
}
