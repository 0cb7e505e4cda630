import { ITEM_FORM_FIELD, type FieldErrors } from "@shared/listing-draft";

const FORM_FIELD_OF: Partial<Record<string, string>> = ITEM_FORM_FIELD;

/** The API's issue paths ("item.priceMinor") as the step's form field names ("price"). */
export function issuesByField(issues: { path: string; message: string }[], part: "item" | "condition"): FieldErrors {
  const out: FieldErrors = {};
  for (const i of issues) {
    const [head, field = "form"] = i.path.split(".");
    if (head !== part) continue;
    const name = part === "item" ? (FORM_FIELD_OF[field] ?? field) : field;
    out[name] ??= i.message;
  }
  return out;
}
