import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { freeText, nameText } from "@shared/text";
import { hasLoneSurrogate, textProblem } from "@shared/text-rules";
import { SignUpForm } from "~/auth/forms";
import { ItemPatchSchema, readItemForm, ConditionSchema } from "@shared/listing-draft";
import { parseBenchSheet } from "@shared/bench/schema";
import { RestorationEntrySchema } from "@shared/restoration-form";

// Names are one NFC line without control or direction-override characters; free text may hold tabs
// and line breaks but no other control characters. Properties over generated strings, then the
// schemas that use the rules.

const CONTROLS = [...Array.from({ length: 32 }, (_, i) => i), ...Array.from({ length: 33 }, (_, i) => 0x7f + i)].map((c) =>
  String.fromCharCode(c),
);
const BIDI = ["\u202a", "\u202b", "\u202c", "\u202d", "\u202e", "\u2066", "\u2067", "\u2068", "\u2069"];
const name = nameText("The model");
const free = freeText("The note");

/** Strings from any code points, including the ones the rules are about. */
const anyText = fc.string({
  unit: fc.oneof(fc.constantFrom(...CONTROLS, ...BIDI, "e\u0301", "Ω", "\u2126", "\ud800"), fc.string({ unit: "binary", maxLength: 3 })),
  maxLength: 40,
});

describe("nameText", () => {
  it("what it accepts is NFC, trimmed, and free of control and direction characters; accepting is idempotent", () => {
    fc.assert(
      fc.property(anyText, (s) => {
        const r = name.safeParse(s);
        if (!r.success) return;
        expect(r.data).toBe(r.data.normalize("NFC"));
        expect(r.data).toBe(r.data.trim());
        expect(CONTROLS.some((c) => r.data.includes(c)) || BIDI.some((c) => r.data.includes(c)) || hasLoneSurrogate(r.data)).toBe(false);
        expect(name.parse(r.data)).toBe(r.data);
      }),
      { numRuns: 2000 },
    );
  });

  it("refuses any name holding a control, direction-override or lone surrogate character, naming the field", () => {
    const bad = fc.constantFrom(...CONTROLS.filter((c) => !/\s/.test(c) || c === "\u0000"), ...BIDI, "\udc00");
    fc.assert(
      fc.property(fc.string({ maxLength: 10 }), bad, fc.string({ maxLength: 10 }), (a, c, b) => {
        const r = name.safeParse(`x${a}${c}${b}x`);
        expect(r.success).toBe(false);
        expect(r.error!.issues[0].message).toMatch(/^The model (contains|holds)/);
      }),
    );
  });

  it("says which character, in words", () => {
    expect(textProblem("Model\u202eX", "name", "The model")).toBe(
      "The model contains a hidden text-direction control (U+202E), which can make it read differently from what is stored; remove it.",
    );
    expect(textProblem("a\u0000b", "name", "Your name")).toBe(
      "Your name contains a NUL character (U+0000); it must be one line of visible text.",
    );
    expect(name.parse("  Cafe\u0301 Ω ")).toBe("Café Ω");
    expect(name.parse("\u2126-1")).toBe("\u03a9-1"); // the ohm sign is canonically the Greek capital omega
  });
});

describe("freeText", () => {
  it("keeps tabs and line breaks (CR LF as LF) and refuses every other control character", () => {
    fc.assert(
      fc.property(anyText, (s) => {
        const r = free.safeParse(s);
        const refusable = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f]/.test(s) || hasLoneSurrogate(s);
        expect(r.success).toBe(!refusable);
        if (r.success) expect(r.data).toBe(s.replace(/\r\n?/g, "\n"));
      }),
      { numRuns: 2000 },
    );
    expect(free.parse("line one\r\n\tline two")).toBe("line one\n\tline two");
    expect(free.safeParse("a\u0000b").error?.issues[0].message).toBe(
      "The note contains a NUL character (U+0000); only tabs and line breaks are allowed.",
    );
    // Direction characters belong to right-to-left writing in free text; names are where they mislead.
    expect(free.safeParse("note \u2067x\u2069").success).toBe(true);
  });
});

describe("the forms and schemas use the rules", () => {
  it("a display name with a right-to-left override or NUL is refused beside the field", () => {
    const base = { email: "a@example.test", password: "long enough password" };
    expect(SignUpForm.safeParse({ ...base, displayName: "Ada\u202egnp.exe" }).error?.issues[0]).toMatchObject({
      path: ["displayName"],
      message: expect.stringContaining("U+202E"),
    });
    expect(SignUpForm.safeParse({ ...base, displayName: "Ada\u0000" }).error?.issues[0].path).toEqual(["displayName"]);
    expect(SignUpForm.parse({ ...base, displayName: " Rene\u0301 " }).displayName).toBe("René");
  });

  it("makers and models are names, notes are free text", () => {
    expect(ItemPatchSchema.safeParse({ maker: "Aur\u202eal" }).error?.issues[0].path).toEqual(["maker"]);
    expect(ItemPatchSchema.safeParse({ model: "M\u0007" }).error?.issues[0].path).toEqual(["model"]);
    expect(ConditionSchema.partial().safeParse({ conditionNote: "Scratch\u0000" }).error?.issues[0].path).toEqual(["conditionNote"]);
    expect(ConditionSchema.partial().parse({ conditionNote: "Scratch on the lid.\r\nKnobs fine." }).conditionNote).toBe(
      "Scratch on the lid.\nKnobs fine.",
    );
  });

  it("the item form's collection note with a NUL is refused beside the field", () => {
    const form = new URLSearchParams({
      category: "integrated_amplifier",
      currency: "EUR",
      collection: "on",
      collectionNote: "by\u0000appointment",
    });
    const read = readItemForm(form);
    expect(read.ok).toBe(false);
    expect(Object.values(read.ok ? {} : read.errors).join(" ")).toContain("NUL");
  });

  it("bench sheet notes and equipment, and the restoration log", () => {
    const sheet = parseBenchSheet({ category: "integrated_amplifier", readings: [], notes: "a\u0000b", equipment: { model: "X\u202e" } });
    expect(sheet.ok ? [] : sheet.issues.map((i) => i.path)).toEqual(expect.arrayContaining(["notes", "equipment.model"]));
    const entry = RestorationEntrySchema.safeParse({
      doneOn: "2024-01-02",
      work: "Recapped\u0000",
      parts: [],
      technician: "Bo\u202e",
      readingsBefore: [],
      readingsAfter: [],
    });
    expect(entry.error?.issues.map((i) => i.path.join("."))).toEqual(expect.arrayContaining(["work", "technician"]));
  });
});
