import fc from "fast-check";
import { exampleIntegratedAmplifierSheet } from "@shared/bench";
import type { Fixtures } from "./matrix-fixtures";
import type { Malformed } from "./malformed";

// Well-formed bodies with hostile text in their free-text fields: a broken body is refused at the
// door, but NUL or U+202E in a maker, a note or a name gets all the way to the database. `TEXT`
// marks where the generated text goes. Only routes whose free text reaches storage are listed.

export const TEXT = "\u0000TEXT\u0000";

type Template = { who: "anonymous" | "owner"; method: "POST" | "PATCH"; form?: Record<string, string>; json?: unknown };

/** The bench sheet of the docs without its capture readings (those would need captures of the owner's). */
function typedSheet() {
  const sheet = exampleIntegratedAmplifierSheet();
  return { ...sheet, readings: sheet.readings.filter((r) => r.origin !== "capture"), measuredBy: TEXT, notes: TEXT };
}

/** Templates by route pattern; `n` makes each use unique where the app wants that (a new account's address). */
export function templates(f: Fixtures, n: () => number): Record<string, Template[]> {
  return {
    "/sign-up": [
      {
        who: "anonymous",
        method: "POST",
        form: { displayName: TEXT, email: `fuzz-${f.run}-${n()}@example.test`, password: "a-long-enough-password" },
      },
    ],
    "/reset-password/:token": [
      { who: "anonymous", method: "POST", form: { password: `${TEXT}-long-enough`, confirm: `${TEXT}-long-enough` } },
    ],
    "/listings/:id": [{ who: "owner", method: "POST", form: { intent: TEXT } }],
    "/sell/:id/item": [
      {
        who: "owner",
        method: "POST",
        form: {
          category: "integrated_amplifier",
          maker: TEXT,
          model: TEXT,
          serialNumber: TEXT,
          collection: "on",
          collectionNote: TEXT,
          region: TEXT,
          town: TEXT,
          postcode: TEXT,
        },
      },
    ],
    "/sell/:id/condition": [
      { who: "owner", method: "POST", form: { cosmeticGrade: "clean", serviceState: "serviced_measured", conditionNote: TEXT } },
    ],
    "/sell/:id/restoration": [
      {
        who: "owner",
        method: "POST",
        form: { intent: "add", doneOn: "2025-02-20", work: TEXT, technician: TEXT, "parts.0.part": TEXT, "parts.0.reference": TEXT },
      },
    ],
    "/api/v1/listings/:id": [
      { who: "owner", method: "PATCH", json: { item: { maker: TEXT, model: TEXT, serialNumber: TEXT } } },
      { who: "owner", method: "PATCH", json: { condition: { conditionNote: TEXT } } },
      { who: "owner", method: "PATCH", json: { benchSheet: typedSheet() } },
    ],
    "/api/v1/bench-sheets/check": [{ who: "anonymous", method: "POST", json: typedSheet() }],
  };
}

// NUL, the bidi overrides, other controls, a lone surrogate, and text that is only that. Each place
// gets NUL and U+202E for certain, then generated ones.
export const ALWAYS = ["Amp a\u0000b", "\u202Eevil\u202C"];
const HOSTILE = [
  "a\u0000b",
  "\u0000",
  "\u202Eevil\u202C",
  "\u2066x\u2069",
  "a\u0007b",
  "\u001b[31m",
  "x\uD800y",
  "\u0085",
  "\uFEFF",
  "\u00A0",
  "e\u0301",
  "\u200B",
];
export const hostileText: fc.Arbitrary<string> = fc.oneof(
  fc.constantFrom(...HOSTILE),
  fc.tuple(fc.string({ maxLength: 8 }), fc.constantFrom(...HOSTILE), fc.string({ maxLength: 8 })).map(([a, h, b]) => `Amp ${a}${h}${b}`),
);

/** How many `TEXT` places a template has. */
export function places(t: Template): number {
  return (JSON.stringify(t.form ?? t.json).match(/\\u0000TEXT\\u0000/g) ?? []).length;
}

/**
 * The template as a request body, with `hostile` in its `focus`-th `TEXT` place and plain words in
 * the others: one field at a time, so the rest of the body passes and the hostile text gets through.
 */
export function fillTemplate(t: Template, focus: number, hostile: string): Malformed {
  let place = 0;
  const text = (v: string) =>
    v.split(TEXT).reduce((out, part, i) => (i === 0 ? part : `${out}${place++ === focus ? hostile : "Fenwold"}${part}`), "");
  const swap = (v: unknown): unknown => {
    if (typeof v === "string") return text(v);
    if (Array.isArray(v)) return v.map(swap);
    if (v && typeof v === "object") return Object.fromEntries(Object.entries(v).map(([k, x]) => [k, swap(x)]));
    return v;
  };
  const enc = new TextEncoder();
  if (t.form) {
    const fields = new URLSearchParams(Object.entries(t.form).map(([k, v]) => [k, text(v)]));
    return { kind: "hostile text in a well-formed form", type: "application/x-www-form-urlencoded", body: enc.encode(fields.toString()) };
  }
  return { kind: "hostile text in well-formed json", type: "application/json", body: enc.encode(JSON.stringify(swap(t.json))) };
}
