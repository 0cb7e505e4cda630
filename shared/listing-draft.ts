// A listing as the seller writes it, step by step: the stored shape of each step (zod, checked again on the
// server) and readers that turn the HTML form's text into that shape with a message per field.
// Isomorphic: the editor checks as the seller types; the server is the authority.
import { z } from "zod";
import { CATEGORIES, COSMETIC_GRADES, SERVICE_STATES, SHIPPING_ZONES, type ShippingZone } from "./catalogue";
import { ShippingOptionsSchema, type ShippingOption } from "./catalogue-schemas";
import {
  CURRENCY_CODES,
  eraInputValue,
  isCurrency,
  lengthInputValue,
  parseEra,
  parseLength,
  parsePrice,
  parseWeight,
  parseWhole,
  priceInputValue,
  weightInputValue,
  type Currency,
} from "./listing-input";
import { COUNTRY_CODES } from "./countries";
import { freeText, nameText } from "./text";
import type { TextKind } from "./text-rules";

export const EDITOR_STEPS = [
  { id: "item", label: "Item" },
  { id: "condition", label: "Condition" },
  { id: "restoration", label: "Restoration log" },
  { id: "photos", label: "Photos" },
  { id: "bench", label: "Bench sheet" },
  { id: "review", label: "Review & publish" },
] as const;
export type EditorStep = (typeof EDITOR_STEPS)[number]["id"];

export type FieldErrors = Record<string, string>;
/** FormData, URLSearchParams or anything with the same `get`. */
export type FormLike = { get(name: string): unknown };

const str = (form: FormLike, name: string) => {
  const v = form.get(name);
  return typeof v === "string" ? v : "";
};
const checked = (form: FormLike, name: string) => {
  const v = form.get(name);
  return v === "on" || v === "true" || v === "1";
};
const optionalText = (max: number, label: string, kind: TextKind = "name") =>
  (kind === "name" ? nameText(label) : freeText(label).trim())
    .max(max, `${label} may be at most ${max} characters.`)
    .transform((s) => (s === "" ? null : s))
    .nullable();

// ---- Item ----

const year = z.int().min(1900).max(2100).nullable();

export const ItemFieldsSchema = z.strictObject({
  category: z.enum(CATEGORIES, "Choose what kind of unit this is."),
  maker: optionalText(80, "The maker"),
  model: optionalText(80, "The model"),
  yearFrom: year,
  yearTo: year,
  serialNumber: optionalText(80, "The serial number"),
  mainsVoltageV: z.int().min(90, "Mains voltage is between 90 and 260 V.").max(260, "Mains voltage is between 90 and 260 V.").nullable(),
  mainsFrequencyHz: z.union([z.literal(50), z.literal(60)], "Mains frequency is 50 or 60 Hz.").nullable(),
  mainsSwitchable: z.boolean(),
  weightG: z.int().positive().max(500_000).nullable(),
  boxedLengthMm: z.int().positive().max(5000).nullable(),
  boxedWidthMm: z.int().positive().max(5000).nullable(),
  boxedHeightMm: z.int().positive().max(5000).nullable(),
  includesManual: z.boolean(),
  includesRemote: z.boolean(),
  includesOriginalPacking: z.boolean(),
  priceMinor: z.int().positive("A price must be above zero.").max(100_000_000).nullable(),
  currency: z.enum(CURRENCY_CODES as [Currency, ...Currency[]], "Choose a currency."),
  offersWelcome: z.boolean(),
  country: z.enum(COUNTRY_CODES, "Choose a country from the list.").nullable(),
  region: optionalText(80, "The region"),
  town: optionalText(80, "The town"),
  postcode: z
    .string()
    .trim()
    .max(12, "A postcode is at most 12 characters.")
    .regex(/^[A-Za-z0-9 -]*$/, "A postcode has only letters, digits, spaces and dashes.")
    .transform((s) => (s === "" ? null : s.toUpperCase()))
    .nullable(),
  shippingOptions: ShippingOptionsSchema,
  handlingDays: z.int().min(0).max(30, "Handling time is at most 30 days.").nullable(),
});
export type ItemValues = z.output<typeof ItemFieldsSchema>;

const eraInOrder = (v: Partial<ItemValues>) => v.yearFrom == null || v.yearTo == null || v.yearFrom <= v.yearTo;
/** The whole item step, as stored. */
export const ItemSchema = ItemFieldsSchema.refine(eraInOrder, { message: "The era must run forwards.", path: ["yearTo"] });
/** What an API client may send: any subset of the item's fields. */
export const ItemPatchSchema = ItemFieldsSchema.partial().refine(eraInOrder, { message: "The era must run forwards.", path: ["yearTo"] });
export type ItemPatch = z.output<typeof ItemPatchSchema>;

/** Stored field → the form input that carries it, so the server's messages land next to the right field. */
export const ITEM_FORM_FIELD: Partial<Record<keyof ItemValues, string>> = {
  yearFrom: "era",
  yearTo: "era",
  weightG: "weight",
  boxedLengthMm: "boxedLength",
  boxedWidthMm: "boxedWidth",
  boxedHeightMm: "boxedHeight",
  priceMinor: "price",
  shippingOptions: "shipping",
};

const SHIPPED = ["parcel", "freight"] as const;
export const zoneField = (method: (typeof SHIPPED)[number], zone: ShippingZone) => `${method}.${zone}`;

/** Reads the item step's form. Every field is read; blanks become null (a draft may be incomplete). */
export function readItemForm(form: FormLike): { ok: true; value: ItemValues } | { ok: false; errors: FieldErrors } {
  const errors: FieldErrors = {};
  const take = <T>(field: string, r: { ok: true; value: T } | { ok: false; message: string }, fallback: T): T => {
    if (r.ok) return r.value;
    errors[field] = r.message;
    return fallback;
  };
  const currencyText = str(form, "currency") || "EUR";
  const currency: Currency = isCurrency(currencyText) ? currencyText : "EUR";
  if (!isCurrency(currencyText)) errors.currency = "Choose a currency from the list.";
  const era = take("era", parseEra(str(form, "era")), { from: null, to: null });
  const priceText = str(form, "price");
  const priceMinor = priceText.trim() ? take("price", parsePrice(priceText, currency), null) : null;

  const shippingOptions: ShippingOption[] = [];
  if (checked(form, "collection")) {
    const note = str(form, "collectionNote").trim();
    shippingOptions.push(note ? { method: "collection", note } : { method: "collection" });
  }
  for (const method of SHIPPED) {
    const prices: Partial<Record<ShippingZone, number>> = {};
    for (const zone of SHIPPING_ZONES) {
      const t = str(form, zoneField(method, zone));
      if (!t.trim()) continue;
      const p = parsePrice(t, currency, { allowZero: true });
      if (p.ok) prices[zone] = p.value;
      else errors[zoneField(method, zone)] = p.message;
    }
    if (Object.keys(prices).length) shippingOptions.push({ method, prices });
  }

  const raw = {
    category: str(form, "category"),
    maker: str(form, "maker"),
    model: str(form, "model"),
    yearFrom: era.from,
    yearTo: era.to,
    serialNumber: str(form, "serialNumber"),
    mainsVoltageV: take("mainsVoltageV", parseWhole(str(form, "mainsVoltageV"), 90, 260, "the mains voltage in volts"), null),
    mainsFrequencyHz: str(form, "mainsFrequencyHz") ? Number(str(form, "mainsFrequencyHz")) : null,
    mainsSwitchable: checked(form, "mainsSwitchable"),
    weightG: take("weight", parseWeight(str(form, "weight")), null),
    boxedLengthMm: take("boxedLength", parseLength(str(form, "boxedLength")), null),
    boxedWidthMm: take("boxedWidth", parseLength(str(form, "boxedWidth")), null),
    boxedHeightMm: take("boxedHeight", parseLength(str(form, "boxedHeight")), null),
    includesManual: checked(form, "includesManual"),
    includesRemote: checked(form, "includesRemote"),
    includesOriginalPacking: checked(form, "includesOriginalPacking"),
    priceMinor,
    currency,
    offersWelcome: checked(form, "offersWelcome"),
    country: str(form, "country") || null,
    region: str(form, "region"),
    town: str(form, "town"),
    postcode: str(form, "postcode"),
    shippingOptions,
    handlingDays: take("handlingDays", parseWhole(str(form, "handlingDays"), 0, 30, "the handling time in days"), null),
  };
  const parsed = ItemSchema.safeParse(raw);
  // A reader's own message (e.g. for the typed price) wins over the schema's for the same field.
  if (!parsed.success) for (const [k, m] of Object.entries(issuesToFields(parsed.error.issues, ITEM_FORM_FIELD))) errors[k] ??= m;
  if (Object.keys(errors).length || !parsed.success) return { ok: false, errors };
  return { ok: true, value: parsed.data };
}

/** The item step's inputs filled from stored values. */
export function itemFormValues(
  v: Omit<Partial<ItemValues>, "currency" | "country"> & { currency?: string; country?: string | null },
): Record<string, string | boolean> {
  const currency: Currency = v.currency && isCurrency(v.currency) ? v.currency : "EUR";
  const out: Record<string, string | boolean> = {
    category: v.category ?? "",
    maker: v.maker ?? "",
    model: v.model ?? "",
    era: eraInputValue(v.yearFrom, v.yearTo),
    serialNumber: v.serialNumber ?? "",
    mainsVoltageV: v.mainsVoltageV ? String(v.mainsVoltageV) : "",
    mainsFrequencyHz: v.mainsFrequencyHz ? String(v.mainsFrequencyHz) : "",
    mainsSwitchable: v.mainsSwitchable ?? false,
    weight: weightInputValue(v.weightG),
    boxedLength: lengthInputValue(v.boxedLengthMm),
    boxedWidth: lengthInputValue(v.boxedWidthMm),
    boxedHeight: lengthInputValue(v.boxedHeightMm),
    includesManual: v.includesManual ?? false,
    includesRemote: v.includesRemote ?? false,
    includesOriginalPacking: v.includesOriginalPacking ?? false,
    price: priceInputValue(v.priceMinor, currency),
    currency,
    offersWelcome: v.offersWelcome ?? false,
    country: v.country ?? "",
    region: v.region ?? "",
    town: v.town ?? "",
    postcode: v.postcode ?? "",
    handlingDays: v.handlingDays === null || v.handlingDays === undefined ? "" : String(v.handlingDays),
    collection: false,
    collectionNote: "",
  };
  for (const o of v.shippingOptions ?? []) {
    if (o.method === "collection") {
      out.collection = true;
      out.collectionNote = o.note ?? "";
    } else {
      for (const zone of SHIPPING_ZONES) {
        const p = o.prices[zone];
        out[zoneField(o.method, zone)] = p === undefined ? "" : priceInputValue(p, currency);
      }
    }
  }
  return out;
}

// ---- Condition ----

export const ConditionSchema = z.strictObject({
  cosmeticGrade: z.enum(COSMETIC_GRADES, "Choose the grade that fits best.").nullable(),
  serviceState: z.enum(SERVICE_STATES, "Choose the state that fits best.").nullable(),
  conditionNote: optionalText(4000, "The note", "free"),
});
export type ConditionValues = z.output<typeof ConditionSchema>;
export const ConditionPatchSchema = ConditionSchema.partial();

export function readConditionForm(form: FormLike): { ok: true; value: ConditionValues } | { ok: false; errors: FieldErrors } {
  const parsed = ConditionSchema.safeParse({
    cosmeticGrade: str(form, "cosmeticGrade") || null,
    serviceState: str(form, "serviceState") || null,
    conditionNote: str(form, "conditionNote"),
  });
  if (parsed.success) return { ok: true, value: parsed.data };
  return { ok: false, errors: issuesToFields(parsed.error.issues) };
}

// ---- shared helpers ----

type Issue = { path: PropertyKey[]; message: string };

/** zod issues to a message per form field (the first one wins). */
export function issuesToFields(issues: readonly Issue[], fieldOf: Record<string, string | undefined> = {}): FieldErrors {
  const out: FieldErrors = {};
  for (const i of issues) {
    const head = String(i.path[0] ?? "form");
    const name = fieldOf[head] ?? (i.path.length ? i.path.map(String).join(".") : "form");
    out[name] ??= i.message;
  }
  return out;
}
