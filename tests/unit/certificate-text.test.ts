import { describe, expect, it } from "vitest";
import { canonicalJson, sheetHash } from "~/certificates/sheet-hash.server";
import { runsOf } from "~/certificates/pdf/fonts.server";
import { exampleIntegratedAmplifierSheet } from "@shared/bench";

describe("the certified sheet's hash", () => {
  it("writes keys sorted at every depth and leaves undefined out", () => {
    // Written out by hand.
    expect(canonicalJson({ b: 1, a: [{ d: "x", c: 2 }], e: undefined })).toBe('{"a":[{"c":2,"d":"x"}],"b":1}');
  });
  it("does not depend on key order, and changes with any value", () => {
    const sheet = exampleIntegratedAmplifierSheet();
    const reordered = Object.fromEntries(Object.entries(sheet).reverse()) as typeof sheet;
    expect(sheetHash(reordered)).toBe(sheetHash(sheet));
    expect(sheetHash(sheet)).toMatch(/^[0-9a-f]{64}$/);
    const changed = { ...sheet, readings: sheet.readings.map((r, i) => (i === 3 ? { ...r, value: r.value + 1 } : r)) };
    expect(sheetHash(changed)).not.toBe(sheetHash(sheet));
  });
});

describe("the certificate's text runs", () => {
  it("sets Ω in the Greek subset and digits and spaces in the Latin one", () => {
    expect(runsOf("8 Ω at 1 kHz", "sans")).toEqual([
      { font: "sans-latin", text: "8 " },
      { font: "sans-greek", text: "Ω" },
      { font: "sans-latin", text: " at 1 kHz" },
    ]);
  });
  it("spells out what no subset has", () => {
    expect(runsOf("33⅓ rpm, Vpk/√2, ≤ 1 %", "mono")).toEqual([{ font: "mono-latin", text: "33 1/3 rpm, Vpk/sqrt2, <= 1 %" }]);
    expect(runsOf("Łódź", "sans").map((r) => r.font)).toEqual(["sans-latin-ext", "sans-latin", "sans-latin-ext"]);
  });
});
