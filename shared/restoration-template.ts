// A restoration template: a common service job a workshop does again and again (its title, the work done
// and the parts list), saved once and applied to a unit's restoration log, where the entry form starts
// filled with it. Isomorphic: the template form checks as the workshop types; the server is the authority.
import { z } from "zod";
import { RestorationPartSchema, type RestorationPart } from "./catalogue-schemas";
import { freeText, nameText } from "./text";
import { issuesToFields, type FieldErrors, type FormLike } from "./listing-draft";
import { MAX_PARTS } from "./restoration-form";

/** How many templates one workshop keeps (a menu longer than this is no help). */
export const MAX_TEMPLATES = 50;

export const RestorationTemplateSchema = z.strictObject({
  title: nameText("The title").min(1, "Give the template a title.").max(120, "Keep the title under 120 characters."),
  work: freeText("The description").trim().min(1, "Say what the job does.").max(4000, "Keep the description under 4000 characters."),
  parts: z.array(RestorationPartSchema).max(MAX_PARTS, `At most ${MAX_PARTS} parts per template.`),
});
export type RestorationTemplateValues = z.output<typeof RestorationTemplateSchema>;
export type RestorationTemplateView = RestorationTemplateValues & { id: string };

const str = (form: FormLike, name: string) => {
  const v = form.get(name);
  return typeof v === "string" ? v.trim() : "";
};

/** Reads the template form (fields `title`, `work`, `parts.N.quantity|part|reference`); blank part rows are skipped. */
export function readTemplateForm(form: FormLike): { ok: true; value: RestorationTemplateValues } | { ok: false; errors: FieldErrors } {
  const errors: FieldErrors = {};
  const parts: RestorationPart[] = [];
  for (let i = 0; i < MAX_PARTS + 10; i++) {
    const part = str(form, `parts.${i}.part`);
    const qty = str(form, `parts.${i}.quantity`);
    const reference = str(form, `parts.${i}.reference`);
    if (!part && !qty && !reference) continue;
    if (!part) errors[`parts.${i}.part`] = "Name the part.";
    const quantity = qty === "" ? 1 : Number(qty);
    if (!Number.isInteger(quantity) || quantity < 1 || quantity > 999) errors[`parts.${i}.quantity`] = "A whole number from 1 to 999.";
    if (reference.length > 80) errors[`parts.${i}.reference`] = "At most 80 characters.";
    parts.push({ part, quantity, ...(reference ? { reference } : {}) });
  }
  if (Object.keys(errors).length) return { ok: false, errors };
  const parsed = RestorationTemplateSchema.safeParse({ title: str(form, "title"), work: str(form, "work"), parts });
  if (!parsed.success) return { ok: false, errors: issuesToFields(parsed.error.issues) };
  return { ok: true, value: parsed.data };
}

/**
 * The restoration entry form's fields filled from a template: the work and the parts; the date is the
 * day it is applied (UTC), who did it and the readings are the workshop's to add.
 */
export function entryValuesFromTemplate(t: RestorationTemplateValues, today = new Date()): Record<string, string> {
  const values: Record<string, string> = { doneOn: today.toISOString().slice(0, 10), technician: "", work: t.work };
  t.parts.forEach((p, i) => {
    values[`parts.${i}.quantity`] = String(p.quantity);
    values[`parts.${i}.part`] = p.part;
    values[`parts.${i}.reference`] = p.reference ?? "";
  });
  return values;
}
