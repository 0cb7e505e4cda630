import { describe, expect, it } from "vitest";
import {
  CURRENCIES,
  CURRENCY_CODES,
  eraInputValue,
  parseEra,
  parseLength,
  parsePrice,
  parseWeight,
  priceInputValue,
  weightInputValue,
} from "@shared/listing-input";
import { ItemPatchSchema, itemFormValues, readConditionForm, readItemForm } from "@shared/listing-draft";
import { parseLogValue, readRestorationForm } from "@shared/restoration-form";
import { publishChecklist, type ChecklistInput } from "@shared/publish-checklist";

const form = (fields: Record<string, string>) => new URLSearchParams(fields);
const NOW = new Date("2026-06-01T12:00:00Z");

describe("prices typed by sellers, to integer minor units", () => {
  it.each([
    ["1250", 125_000],
    ["1,250", 125_000],
    ["1.250", 125_000],
    ["1 250", 125_000],
    ["1,250.00", 125_000],
    ["1.250,50", 125_050],
    ["125,000", 12_500_000],
    ["899.9", 89_990],
    ["12,5", 1_250],
    ["€ 899", 89_900],
    ["EUR 1.199,00", 119_900],
    ["0.99", 99],
  ])("%s → %i minor units of EUR", (text, minor) => {
    expect(parsePrice(text, "EUR")).toEqual({ ok: true, value: minor });
  });

  it("never goes through floating point: 0.29 + 0.58 type prices stay exact", () => {
    // 1.15 * 100 is 114.99999999999999 in binary floating point; the parser works on the digits.
    expect(parsePrice("1.15", "EUR")).toEqual({ ok: true, value: 115 });
    expect(parsePrice("4.35", "GBP")).toEqual({ ok: true, value: 435 });
  });

  it("respects the currency's minor units (ISO 4217: EUR 2, JPY 0)", () => {
    expect(parsePrice("148,000", "JPY")).toEqual({ ok: true, value: 148_000 });
    expect(parsePrice("1480.5", "JPY").ok).toBe(false);
    expect(parsePrice("1250.999", "EUR")).toMatchObject({ ok: false, message: expect.stringMatching(/2 decimals/) });
  });

  it("every listed currency has the minor-unit digits the runtime's CLDR data gives (cross-check of the ISO 4217 table)", () => {
    for (const code of CURRENCY_CODES) {
      const digits = new Intl.NumberFormat("en", { style: "currency", currency: code }).resolvedOptions().maximumFractionDigits;
      expect([code, CURRENCIES[code]]).toEqual([code, digits]);
    }
  });

  it("refuses what is not a price, with a message for the field", () => {
    expect(parsePrice("", "EUR")).toMatchObject({ ok: false, message: "Enter a price." });
    expect(parsePrice("twelve", "EUR")).toMatchObject({ ok: false, message: expect.stringMatching(/not a price/) });
    expect(parsePrice("-5", "EUR")).toMatchObject({ ok: false, message: expect.stringMatching(/negative/) });
    expect(parsePrice("0", "EUR")).toMatchObject({ ok: false, message: expect.stringMatching(/above zero/) });
    expect(parsePrice("0", "EUR", { allowZero: true })).toEqual({ ok: true, value: 0 });
    expect(parsePrice("2000000", "EUR")).toMatchObject({ ok: false });
  });

  it("shows a stored price back the way it reads again", () => {
    for (const minor of [125_000, 125_050, 99, 1])
      expect(parsePrice(priceInputValue(minor, "EUR"), "EUR")).toEqual({ ok: true, value: minor });
    expect(priceInputValue(148_000, "JPY")).toBe("148000");
  });
});

describe("year or era", () => {
  it.each([
    ["1978", 1978, 1978],
    ["1975-79", 1975, 1979],
    ["1975–1979", 1975, 1979],
    ["1970s", 1970, 1979],
    ["late 1970s", 1976, 1979],
    ["c. 1980", 1980, null],
    ["", null, null],
  ])("%s → %s to %s", (text, from, to) => {
    expect(parseEra(text, NOW)).toEqual({ ok: true, value: { from, to } });
  });

  it("refuses backwards spans, years out of range and words", () => {
    expect(parseEra("1979-75", NOW).ok).toBe(false);
    expect(parseEra("1850", NOW).ok).toBe(false);
    expect(parseEra("2031", NOW).ok).toBe(false);
    expect(parseEra("old", NOW).ok).toBe(false);
  });

  it("round-trips through the input", () => {
    for (const [a, b] of [
      [1978, 1978],
      [1975, 1979],
      [1980, null],
    ] as const) {
      const back = parseEra(eraInputValue(a, b), NOW);
      expect(back).toEqual({ ok: true, value: { from: a, to: b } });
    }
  });
});

describe("weight and box", () => {
  it("reads kilograms by default, grams and pounds when said", () => {
    expect(parseWeight("14.2")).toEqual({ ok: true, value: 14_200 });
    expect(parseWeight("14,2 kg")).toEqual({ ok: true, value: 14_200 });
    expect(parseWeight("850 g")).toEqual({ ok: true, value: 850 });
    // 1 lb = 0.45359237 kg exactly (international yard and pound agreement, 1959).
    expect(parseWeight("100 lb")).toEqual({ ok: true, value: 45_359 });
    expect(parseWeight("heavy").ok).toBe(false);
    expect(parseWeight("600").ok).toBe(false);
    expect(weightInputValue(31_500)).toBe("31.5");
  });

  it("reads box sides in centimetres to millimetres", () => {
    expect(parseLength("62")).toEqual({ ok: true, value: 620 });
    expect(parseLength("62,5 cm")).toEqual({ ok: true, value: 625 });
    expect(parseLength("620 mm")).toEqual({ ok: true, value: 620 });
    expect(parseLength("0").ok).toBe(false);
  });
});

describe("the item step form", () => {
  const filled = {
    category: "integrated_amplifier",
    maker: "  Harrowgate Sound ",
    model: "120-HG",
    era: "1978",
    mainsVoltageV: "230",
    mainsFrequencyHz: "50",
    mainsSwitchable: "on",
    weight: "14.2",
    price: "1,250",
    currency: "EUR",
    country: "DE",
    postcode: "d-10115",
    collection: "on",
    collectionNote: "Evenings",
    "parcel.domestic": "45",
    "parcel.worldwide": "0",
    handlingDays: "3",
  };

  it("reads into the stored shape", () => {
    const r = readItemForm(form(filled));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.value).toMatchObject({
      maker: "Harrowgate Sound",
      yearFrom: 1978,
      yearTo: 1978,
      mainsVoltageV: 230,
      mainsFrequencyHz: 50,
      mainsSwitchable: true,
      weightG: 14_200,
      priceMinor: 125_000,
      postcode: "D-10115",
      offersWelcome: false,
      shippingOptions: [
        { method: "collection", note: "Evenings" },
        { method: "parcel", prices: { domestic: 4_500, worldwide: 0 } },
      ],
      handlingDays: 3,
    });
    expect(ItemPatchSchema.safeParse(r.value).success).toBe(true);
  });

  it("names each bad field with its own message", () => {
    const r = readItemForm(
      form({ ...filled, price: "lots", era: "1981-1975", mainsVoltageV: "400", country: "XX", "freight.nearby": "abc" }),
    );
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(Object.keys(r.errors).sort()).toEqual(["country", "era", "freight.nearby", "mainsVoltageV", "price"]);
    expect(r.errors.price).toMatch(/not a price/);
  });

  it("lets a draft be incomplete: blanks are null", () => {
    const r = readItemForm(form({ category: "turntable", currency: "EUR" }));
    expect(r.ok && r.value).toMatchObject({ maker: null, priceMinor: null, weightG: null, shippingOptions: [] });
  });

  it("fills the inputs from stored values and reads them back unchanged", () => {
    const r = readItemForm(form(filled));
    if (!r.ok) throw new Error("did not read");
    const again = readItemForm(
      form(
        Object.fromEntries(
          Object.entries(itemFormValues(r.value))
            .filter(([, v]) => v !== false)
            .map(([k, v]) => [k, v === true ? "on" : String(v)]),
        ),
      ),
    );
    expect(again).toEqual(r);
  });
});

describe("the condition step form", () => {
  it("takes our words only", () => {
    expect(
      readConditionForm(form({ cosmeticGrade: "lived_in", serviceState: "needs_work", conditionNote: "Right channel hums." })),
    ).toEqual({
      ok: true,
      value: { cosmeticGrade: "lived_in", serviceState: "needs_work", conditionNote: "Right channel hums." },
    });
    const bad = readConditionForm(form({ cosmeticGrade: "mint" }));
    expect(bad.ok).toBe(false);
    expect(!bad.ok && bad.errors.cosmeticGrade).toBeTruthy();
  });
});

describe("a restoration log entry", () => {
  it("reads parts with quantities and readings with units, skipping blank rows", () => {
    const r = readRestorationForm(
      form({
        doneOn: "2025-03-02",
        work: "Recapped the power supply.",
        technician: "Bench 2",
        "parts.0.part": "Filter capacitor 10 000 µF 63 V",
        "parts.0.quantity": "2",
        "parts.0.reference": "C401, C402",
        "parts.2.part": "Bias trimmer",
        "before.0.quantity": "DC offset, left",
        "before.0.value": "-48 mV",
        "before.0.conditions": "at idle",
      }),
    );
    expect(r).toEqual({
      ok: true,
      value: {
        doneOn: "2025-03-02",
        work: "Recapped the power supply.",
        technician: "Bench 2",
        parts: [
          { part: "Filter capacitor 10 000 µF 63 V", quantity: 2, reference: "C401, C402" },
          { part: "Bias trimmer", quantity: 1 },
        ],
        readingsBefore: [{ quantity: "DC offset, left", value: -48, unit: "mV", conditions: "at idle" }],
        readingsAfter: [],
      },
    });
  });

  it("asks for the unit and the conditions of a reading, and a part's name", () => {
    const r = readRestorationForm(
      form({ doneOn: "2025-03-02", work: "x", "parts.0.quantity": "2", "after.0.quantity": "Bias", "after.0.value": "25" }),
    );
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.errors).toMatchObject({
      "parts.0.part": "Name the part.",
      "after.0.value": expect.stringMatching(/unit/),
      "after.0.conditions": expect.any(String),
    });
    expect(parseLogValue("25 mA")).toEqual({ ok: true, value: 25, unit: "mA" });
  });
});

describe("what publishing needs", () => {
  const base: ChecklistInput = {
    listing: {
      maker: "Harrowgate Sound",
      model: "120-HG",
      priceMinor: 125_000,
      country: "DE",
      weightG: 14_200,
      shippingOptions: [{ method: "collection" }],
      handlingDays: null,
      cosmeticGrade: "clean",
      serviceState: "working_unserviced",
      conditionNote: null,
    },
    sheet: null,
    restorationEntries: 0,
    photos: { ready: 1, processing: 0, failed: 0 },
    emailVerified: true,
  };
  const open = (i: ChecklistInput) =>
    publishChecklist(i)
      .filter((c) => !c.ok)
      .map((c) => c.id);

  it("is complete for a working, unserviced unit collected in person", () => {
    expect(open(base)).toEqual([]);
  });

  it("asks a “serviced & measured” unit for a log entry and measured readings", () => {
    const claim = { ...base, listing: { ...base.listing, serviceState: "serviced_measured" as const } };
    expect(open(claim)).toEqual(["restoration", "bench"]);
    expect(open({ ...claim, restorationEntries: 1, sheet: { readings: 3, measured: 0 } })).toEqual(["bench"]);
    expect(open({ ...claim, restorationEntries: 1, sheet: { readings: 3, measured: 2 } })).toEqual([]);
  });

  it("asks a unit that needs work to say what is wrong, shipped units for a handling time, and waits for photos", () => {
    expect(open({ ...base, listing: { ...base.listing, serviceState: "needs_work" } })).toEqual(["fault-note"]);
    expect(open({ ...base, listing: { ...base.listing, shippingOptions: [{ method: "parcel", prices: { domestic: 100 } }] } })).toEqual([
      "handling",
    ]);
    expect(open({ ...base, photos: { ready: 2, processing: 1, failed: 0 } })).toEqual(["photos"]);
    expect(open({ ...base, emailVerified: false })).toEqual(["email"]);
  });

  it("lists only what applies: no fault note for a serviced unit, no handling time for collection", () => {
    const ids = (i: ChecklistInput) => publishChecklist(i).map((c) => c.id);
    const serviced = { ...base, listing: { ...base.listing, serviceState: "serviced_measured" as const } };
    expect(ids(serviced)).not.toContain("fault-note");
    expect(ids(serviced)).toEqual(expect.arrayContaining(["restoration", "bench"]));
    expect(ids(base)).not.toContain("handling");
    expect(ids(base)).not.toContain("restoration");
    expect(ids({ ...base, listing: { ...base.listing, serviceState: "parts_only" } })).toContain("fault-note");
  });
});
