import { describe, expect, it } from "vitest";
import {
  INVENTORY_COLUMNS,
  checkHeader,
  csvLine,
  inventoryCsv,
  listingToRow,
  rowToDraft,
  safeCell,
  type InventoryListing,
  type InventoryRow,
} from "@shared/inventory-csv";
import { FIGURE_COLUMNS, figuresFor } from "@shared/inventory-csv-figures";
import { CONDITION_FIELDS } from "@shared/bench-form/rows";
import { CATEGORY_QUANTITIES } from "@shared/bench/quantities";

// Expected values are worked out by hand from the cells: 1249.00 EUR is 124 900 cents; 11.4 kg is 11 400 g;
// 0.1 % is a ratio of 0.001; 1 kHz is 1000 Hz.
const AMP_ROW: Partial<InventoryRow> = {
  reference: "WS-0412",
  category: "integrated_amplifier",
  maker: "Kelloran",
  model: "ZK 7.0",
  era: "1978–80",
  cosmetic_grade: "clean",
  service_state: "serviced_measured",
  description: "Recapped, relays cleaned.",
  price: "1249.00",
  currency: "EUR",
  handling_days: "3",
  mains_voltage: "230",
  weight_kg: "11.4",
  country: "DE",
  measured_on: "2026-11-20",
  measured_by: "Bench 2",
  power: "2 × 65 W",
  power_load: "8 Ω",
  power_limit: "0.1 % THD",
  power_driven: "both",
  thd: "0.02 %",
  thd_level: "1 W",
  thd_load: "8 Ω",
  thd_frequency: "1 kHz",
  snr: "96 dB",
  snr_weighting: "A",
};

const ok = (row: Partial<InventoryRow>) => {
  const r = rowToDraft(row);
  if (!r.ok) throw new Error(JSON.stringify(r.problems));
  return r.draft;
};
const problems = (row: Partial<InventoryRow>) => {
  const r = rowToDraft(row);
  if (r.ok) throw new Error("expected problems");
  return r.problems;
};

describe("the inventory CSV layout", () => {
  it("names each column once, the unit's own first", () => {
    expect(new Set(INVENTORY_COLUMNS).size).toBe(INVENTORY_COLUMNS.length);
    expect(INVENTORY_COLUMNS.slice(0, 4)).toEqual(["reference", "category", "maker", "model"]);
    expect(INVENTORY_COLUMNS).toContain("power_load");
    expect(INVENTORY_COLUMNS).toContain("wow_flutter_tone");
  });

  it("gives every figure only conditions the bench form reads for its quantity, in categories that measure it", () => {
    for (const f of FIGURE_COLUMNS) {
      for (const c of f.conditions) expect(CONDITION_FIELDS[f.quantity], `${f.column}_${c}`).toContain(c);
      for (const cat of f.categories) expect(CATEGORY_QUANTITIES[cat], `${f.column} in ${cat}`).toContain(f.quantity);
    }
    expect(figuresFor("turntable").map((f) => f.column)).toEqual(["speed_error", "wow_flutter", "rumble"]);
  });

  it("checks a header: unknown and repeated columns, and the three it needs", () => {
    expect(checkHeader(["category", "maker", "model", "price"])).toEqual([]);
    expect(checkHeader(["Category", " Maker ", "MODEL"])).toEqual([]);
    expect(checkHeader(["category", "maker", "maker", "colour"])).toEqual([
      { column: "maker", message: 'The column "maker" appears twice.' },
      { column: "colour", message: '"colour" is not a column of the layout.' },
      { column: "model", message: 'The file needs a "model" column.' },
    ]);
  });
});

describe("one row into draft input", () => {
  it("reads the unit, its condition and its figures with their conditions", () => {
    const d = ok(AMP_ROW);
    expect(d.reference).toBe("WS-0412");
    expect(d.category).toBe("integrated_amplifier");
    expect(d.item).toEqual({
      category: "integrated_amplifier",
      maker: "Kelloran",
      model: "ZK 7.0",
      yearFrom: 1978,
      yearTo: 1980,
      priceMinor: 124_900,
      currency: "EUR",
      handlingDays: 3,
      mainsVoltageV: 230,
      weightG: 11_400,
      country: "DE",
    });
    expect(d.condition).toEqual({ cosmeticGrade: "clean", serviceState: "serviced_measured", conditionNote: "Recapped, relays cleaned." });
    expect(d.benchSheet).toMatchObject({ category: "integrated_amplifier", measuredOn: "2026-11-20", measuredBy: "Bench 2" });
    const [power, thd, snr] = d.benchSheet!.readings;
    expect(power).toMatchObject({
      quantity: "output_power",
      value: 65,
      unit: "W",
      text: "2 × 65 W",
      basis: "measured",
      channel: "both",
      conditions: { loadOhm: 8, atDistortion: { ratio: 0.001, measure: "thd" }, channelsDriven: "both" },
    });
    expect(thd.quantity).toBe("thd");
    expect(thd.value).toBeCloseTo(0.0002, 12);
    expect(thd.conditions).toEqual({ powerW: 1, loadOhm: 8, frequencyHz: 1000 });
    expect(snr).toMatchObject({ quantity: "snr", value: 96, conditions: { weighting: "A" } });
  });

  it("leaves the bench sheet out of a row without figures; blanks are nulls", () => {
    const d = ok({ category: "turntable", maker: "Kelloran", model: "Rota 2" });
    expect(d.benchSheet).toBeNull();
    expect(d.reference).toBeNull();
    expect(d.item).toMatchObject({ priceMinor: null, yearFrom: null, weightG: null, country: null, currency: "EUR" });
    expect(d.condition).toEqual({ cosmeticGrade: null, serviceState: null, conditionNote: null });
  });

  it("accepts labels written with spaces and capitals for the coded columns", () => {
    const d = ok({
      category: "Tape deck",
      maker: "A",
      model: "B",
      cosmetic_grade: "Lived-in",
      service_state: "needs work",
      country: "gb",
      currency: "gbp",
    });
    expect(d.category).toBe("tape_deck");
    expect(d.condition.cosmeticGrade).toBe("lived_in");
    expect(d.condition.serviceState).toBe("needs_work");
    expect(d.item).toMatchObject({ country: "GB", currency: "GBP" });
  });

  it("names the column of every problem in the row, in the order of the columns", () => {
    expect(
      problems({
        category: "integrated_amplifier",
        maker: "A",
        model: "B",
        price: "twelve",
        currency: "XYZ",
        handling_days: "45",
        cosmetic_grade: "mint",
        country: "Atlantis",
        power: "65 Hz",
        thd_load: "8 Ω",
        speed_error: "0.2 %",
      }).map((p) => p.column),
    ).toEqual(["cosmetic_grade", "price", "currency", "handling_days", "country", "power", "thd_load", "speed_error"]);
  });

  it("refuses a row without a category or with one Loadline does not list", () => {
    expect(problems({ maker: "A", model: "B" })).toEqual([
      { column: "category", message: "Give the kind of unit, e.g. integrated_amplifier." },
    ]);
    expect(problems({ category: "radio", maker: "A", model: "B" })[0].column).toBe("category");
  });

  it("reads the price in the row's currency: yen have no decimals", () => {
    expect(ok({ category: "turntable", maker: "A", model: "B", price: "185000", currency: "JPY" }).item.priceMinor).toBe(185_000);
    expect(problems({ category: "turntable", maker: "A", model: "B", price: "1850.50", currency: "JPY" })[0].column).toBe("price");
  });

  it("refuses a bad condition of a figure by its own column", () => {
    expect(problems({ ...AMP_ROW, power_limit: "lots" }).map((p) => p.column)).toEqual(["power_limit"]);
    expect(problems({ ...AMP_ROW, measured_on: "20 Nov" }).map((p) => p.column)).toEqual(["measured_on"]);
  });
});

describe("one listing as a row", () => {
  const listing = (): InventoryListing => {
    const d = ok(AMP_ROW);
    return {
      reference: d.reference,
      category: d.category,
      maker: "Kelloran",
      model: "ZK 7.0",
      yearFrom: 1978,
      yearTo: 1980,
      cosmeticGrade: "clean",
      serviceState: "serviced_measured",
      conditionNote: "Recapped, relays cleaned.",
      priceMinor: 124_900,
      currency: "EUR",
      handlingDays: 3,
      mainsVoltageV: 230,
      weightG: 11_400,
      country: "DE",
      sheet: {
        ...d.benchSheet!,
        sweeps: [],
        readings: d.benchSheet!.readings.map((r) => ({ ...r, origin: "typed" as const, conditions: r.conditions ?? {} })),
      },
    };
  };

  it("writes the price in major units with its decimals and the figures as typed", () => {
    const row = listingToRow(listing());
    expect(row).toMatchObject({
      reference: "WS-0412",
      era: "1978–1980",
      price: "1249.00",
      currency: "EUR",
      weight_kg: "11.4",
      power: "2 × 65 W",
      power_load: "8 Ω",
      power_limit: "0.1 % THD",
      power_driven: "both",
      thd: "0.02 %",
      snr: "96 dB",
      snr_weighting: "A",
      rumble: "",
    });
    expect(Object.keys(row)).toEqual([...INVENTORY_COLUMNS]);
  });

  it("round-trips: a listing written as a row reads back as the same draft", () => {
    expect(ok(listingToRow(listing()))).toEqual(ok(AMP_ROW));
  });
});

describe("writing CSV", () => {
  it("quotes cells with commas, quotes and line breaks (RFC 4180)", () => {
    expect(csvLine(["a", "b,c", 'say "hi"', "two\nlines", ""])).toBe('a,"b,c","say ""hi""","two\nlines",');
  });

  it("keeps a spreadsheet from running a cell as a formula, but leaves signed figures alone", () => {
    expect(safeCell("=HYPERLINK(1)")).toBe("'=HYPERLINK(1)");
    expect(safeCell("@SUM(A1)")).toBe("'@SUM(A1)");
    expect(safeCell("+0.2 %")).toBe("+0.2 %");
    expect(safeCell("-12 mV")).toBe("-12 mV");
    expect(ok({ category: "turntable", maker: "A", model: "B", description: "'=1+1" }).condition.conditionNote).toBe("=1+1");
  });

  it("writes a header and CRLF line ends", () => {
    const text = inventoryCsv([listingToRow({ ...ok_listing(), reference: "R,1" })]);
    const lines = text.split("\r\n");
    expect(lines[0]).toBe(INVENTORY_COLUMNS.join(","));
    expect(lines[1].startsWith('"R,1",turntable,A,B,')).toBe(true);
    expect(lines).toHaveLength(3);
  });
});

function ok_listing(): InventoryListing {
  return {
    reference: null,
    category: "turntable",
    maker: "A",
    model: "B",
    yearFrom: null,
    yearTo: null,
    cosmeticGrade: null,
    serviceState: null,
    conditionNote: null,
    priceMinor: null,
    currency: "EUR",
    handlingDays: null,
    mainsVoltageV: null,
    weightG: null,
    country: null,
    sheet: null,
  };
}
