import { z } from "zod";
import { textProblem, type TextKind } from "./text-rules";

// The forms' schemas for text people type, checked the same way in the browser and on the server;
// the rules themselves are in text-rules.ts.

function refuse(kind: TextKind, label: string) {
  return (value: string, ctx: z.RefinementCtx) => {
    const problem = textProblem(value, kind, label);
    if (problem) ctx.addIssue({ code: "custom", message: problem });
  };
}

/**
 * A name, maker, model, title or other one-line label: NFC-normalised and trimmed; control
 * characters and direction overrides are refused. Chain `.min()` / `.max()` for the field's bounds.
 */
export function nameText(label: string) {
  return z.string().normalize("NFC").trim().superRefine(refuse("name", label));
}

/** Notes and descriptions: line breaks as \n; control characters other than tab and newline are refused. */
export function freeText(label: string) {
  return z
    .string()
    .overwrite((s) => s.replace(/\r\n?/g, "\n"))
    .superRefine(refuse("free", label));
}
