import { csvLine, INVENTORY_COLUMNS, inventoryCsv, MAX_INVENTORY_ROWS, type InventoryRow } from "@shared/inventory-csv";

// The two files the import page offers: the template (the header and one comment line, which the import
// skips: lines whose first cell starts with #) and an example with a few invented units a workshop
// might list, figures and their conditions as a bench would give them.

export function templateCsv(): string {
  const note =
    `# Loadline inventory CSV: one unit per row, at most ${MAX_INVENTORY_ROWS} rows. Needed: category, maker, model; ` +
    "blank cells are fine. The columns are explained at /sell/import. Lines starting with # are skipped.";
  return [csvLine(INVENTORY_COLUMNS), csvLine([note])].join("\r\n") + "\r\n";
}

const unit = (cells: Record<string, string>): InventoryRow => ({ ...Object.fromEntries(INVENTORY_COLUMNS.map((c) => [c, ""])), ...cells });

/** Invented units: names, models and figures are made up for the example. */
export const EXAMPLE_ROWS: readonly InventoryRow[] = [
  unit({
    reference: "WB-1041",
    category: "integrated_amplifier",
    maker: "Vantrell",
    model: "IA-70",
    era: "1978–81",
    cosmetic_grade: "clean",
    service_state: "serviced_measured",
    description: "Recapped power supply and driver boards; new speaker relay; bias and offset set after warm-up.",
    price: "649.00",
    currency: "EUR",
    handling_days: "3",
    mains_voltage: "230",
    weight_kg: "11.4",
    country: "DE",
    measured_on: "2026-11-20",
    measured_by: "Bench 2",
    power: "2 × 72 W",
    power_load: "8 Ω",
    power_limit: "0.1 % THD",
    power_driven: "both",
    thd: "0.03 %",
    thd_level: "1 W",
    thd_load: "8 Ω",
    thd_frequency: "1 kHz",
    dc_offset: "4 mV",
  }),
  unit({
    reference: "WB-1042",
    category: "turntable",
    maker: "Pellquist",
    model: "DT 3",
    era: "1970s",
    cosmetic_grade: "lived_in",
    service_state: "serviced_measured",
    description: "New belt, platter bearing cleaned and oiled, speed trimmed.",
    price: "420",
    currency: "EUR",
    handling_days: "5",
    weight_kg: "8.2",
    country: "DE",
    measured_on: "2026-11-22",
    measured_by: "Bench 1",
    speed_error: "+0.2 %",
    speed_error_speed: "33⅓ rpm",
  }),
  unit({
    reference: "WB-1043",
    category: "loudspeaker",
    maker: "Carrowain",
    model: "Monitor 12",
    era: "1984",
    cosmetic_grade: "lived_in",
    service_state: "working_unserviced",
    description: "Pair. Surrounds replaced on both woofers; cabinets show light marks on the corners.",
    price: "380",
    currency: "EUR",
    handling_days: "7",
    weight_kg: "24",
    country: "DE",
  }),
  unit({
    reference: "WB-1044",
    category: "tape_deck",
    maker: "Quorvane",
    model: "CX-5",
    era: "c. 1986",
    cosmetic_grade: "clean",
    service_state: "serviced_measured",
    description: "Belts and pinch roller replaced; heads demagnetised; azimuth set.",
    price: "295",
    currency: "EUR",
    handling_days: "3",
    mains_voltage: "230",
    weight_kg: "5.1",
    country: "DE",
  }),
];

export function exampleCsv(): string {
  return inventoryCsv(EXAMPLE_ROWS);
}
