// One restoration log entry as stored, and the form that writes it: the date, the work, the parts with
// quantities, who did it, and readings before and after (each a value with its unit and how it was taken).
import { z } from "zod";
import { RestorationPartSchema, RestorationReadingSchema, type RestorationPart, type RestorationReading } from "./catalogue-schemas";
import { freeText, nameText } from "./text";
import { issuesToFields, type FieldErrors, type FormLike } from "./listing-draft";

export const MAX_PARTS = 60;
export const MAX_ENTRY_READINGS = 20;

function isPastOrToday(iso: string): boolean {
  return iso <= new Date().toISOString().slice(0, 10);
}

export const RestorationEntrySchema = z.strictObject({
  doneOn: z.iso
    .date("Give the date the work was done.")
    .refine((d) => d >= "1900-01-01", "Give a date after 1900.")
    .refine(isPastOrToday, "The date cannot be in the future."),
  work: freeText("The description").trim().min(1, "Say what was done.").max(4000, "Keep the description under 4000 characters."),
  parts: z.array(RestorationPartSchema).max(MAX_PARTS, `At most ${MAX_PARTS} parts per entry.`),
  technician: nameText("The technician")
    .max(120)
    .transform((s) => (s === "" ? null : s))
    .nullable(),
  readingsBefore: z.array(RestorationReadingSchema).max(MAX_ENTRY_READINGS),
  readingsAfter: z.array(RestorationReadingSchema).max(MAX_ENTRY_READINGS),
});
export type RestorationEntryValues = z.output<typeof RestorationEntrySchema>;
export type RestorationEntryView = RestorationEntryValues & { id: string };

const str = (form: FormLike, name: string) => {
  const v = form.get(name);
  return typeof v === "string" ? v.trim() : "";
};

/** "42.1 V" or "-12 mV DC" to a number and the unit as written; the unit is kept as the seller wrote it. */
export function parseLogValue(text: string): { ok: true; value: number; unit: string } | { ok: false; message: string } {
  const m = /^([+\-−]?\d+(?:[.,]\d+)?)\s*(\S.*)?$/.exec(text.trim());
  if (!m) return { ok: false, message: `"${text}" does not start with a number.` };
  const value = Number(m[1].replace("−", "-").replace(",", "."));
  const unit = (m[2] ?? "").trim();
  if (!unit) return { ok: false, message: "Add the unit, e.g. 42 V or 35 mA." };
  if (unit.length > 16) return { ok: false, message: "Keep the unit short, e.g. V, mA, %, Ω." };
  return { ok: true, value, unit };
}

export const logValueText = (r: Pick<RestorationReading, "value" | "unit">) => `${r.value} ${r.unit}`;

/** Reads the entry form; rows left blank are skipped. Row fields are `parts.N.part`, `before.N.value` …. */
export function readRestorationForm(form: FormLike): { ok: true; value: RestorationEntryValues } | { ok: false; errors: FieldErrors } {
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
  const readings = (side: "before" | "after") => {
    const out: RestorationReading[] = [];
    for (let i = 0; i < MAX_ENTRY_READINGS + 10; i++) {
      const quantity = str(form, `${side}.${i}.quantity`);
      const valueText = str(form, `${side}.${i}.value`);
      const conditions = str(form, `${side}.${i}.conditions`);
      if (!quantity && !valueText && !conditions) continue;
      if (!quantity) errors[`${side}.${i}.quantity`] = "Say what was measured.";
      const v = parseLogValue(valueText);
      if (!v.ok) errors[`${side}.${i}.value`] = valueText ? v.message : "Enter the value with its unit.";
      if (!conditions) errors[`${side}.${i}.conditions`] = "Say how it was measured (e.g. at idle, 230 V mains).";
      out.push({ quantity, value: v.ok ? v.value : 0, unit: v.ok ? v.unit : "?", conditions });
    }
    return out;
  };
  const raw = {
    doneOn: str(form, "doneOn"),
    work: str(form, "work"),
    parts,
    technician: str(form, "technician"),
    readingsBefore: readings("before"),
    readingsAfter: readings("after"),
  };
  if (Object.keys(errors).length) return { ok: false, errors };
  const parsed = RestorationEntrySchema.safeParse(raw);
  if (!parsed.success) {
    const named = Object.entries(issuesToFields(parsed.error.issues)).map(([k, m]): [string, typeof m] => [
      k
        .replace(/^readingsBefore/, "before")
        .replace(/^readingsAfter/, "after")
        .replace(/\.unit$/, ".value"),
      m,
    ]);
    return { ok: false, errors: Object.fromEntries(named) };
  }
  return { ok: true, value: parsed.data };
}
