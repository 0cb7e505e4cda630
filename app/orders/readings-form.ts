// The buyer's re-measurement as form fields, for the contest form and for "accept with my own figures".
// Each measured figure of the listing's sheet gets one box (`m:readings.3`): the buyer types what they
// read ("64 W") under the sheet's own conditions. A few free rows (`x0.*`) take a figure the sheet does
// not have, with its load and frequency. Isomorphic and zod-free: the server checks the result with
// BuyerReadingsSchema afterwards.
import { QUANTITIES, QUANTITY_INFO, type Quantity } from "@shared/bench/quantities";
import { CHANNELS, type Conditions, type Reading } from "@shared/bench/schema";
import { parseValue } from "@shared/bench/units";
import type { BuyerReading, BuyerReadings, ListedFigure } from "@shared/bench/remeasure";
import { isOneOf } from "@shared/one-of";

export const FIGURE_FIELD_PREFIX = "m:";
export const EXTRA_ROWS = 2;

export const figureField = (ref: string) => `${FIGURE_FIELD_PREFIX}${ref}`;
export const extraField = (i: number, part: "quantity" | "value" | "channel" | "load" | "frequency") => `x${i}.${part}`;

export type FieldErrors = Record<string, string>;

export interface ReadingsFromForm {
  buyer: BuyerReadings;
  /** Field name of each reading, in `buyer.readings` order, so schema issues land next to their box. */
  fieldOf: string[];
  errors: FieldErrors;
}

type Get = (name: string) => string;

function parseAs(text: string, quantity: Quantity): { ok: true; value: number; unit: string } | { ok: false; error: string } {
  const info = QUANTITY_INFO[quantity];
  const r = parseValue(text, { kind: info.kind, voltageForm: info.dc ? "dc" : "rms" });
  if (!r.ok) return { ok: false, error: r.error };
  if (r.channels) return { ok: false, error: "Enter one channel's figure per box (no “2 ×”)." };
  return { ok: true, value: r.value, unit: r.unit };
}

/** Reads the readings boxes; blank boxes are skipped, unreadable ones get an error beside them. */
export function readingsFromForm(get: Get, figures: readonly ListedFigure[]): ReadingsFromForm {
  const readings: BuyerReading[] = [];
  const fieldOf: string[] = [];
  const errors: FieldErrors = {};
  for (const f of figures) {
    const name = figureField(f.ref);
    const text = get(name).trim();
    if (!text) continue;
    const p = parseAs(text, f.quantity);
    if (!p.ok) {
      errors[name] = p.error;
      continue;
    }
    readings.push({
      quantity: f.quantity,
      value: p.value,
      unit: p.unit,
      text,
      ...(f.channel ? { channel: f.channel } : {}),
      conditions: f.conditions,
      ref: f.ref,
    });
    fieldOf.push(name);
  }
  for (let i = 0; i < EXTRA_ROWS; i++) {
    const extra = extraRow(get, i, errors);
    if (extra) {
      readings.push(extra);
      fieldOf.push(extraField(i, "value"));
    }
  }
  const equipment = get("equipment").trim();
  const measuredOn = get("measuredOn").trim();
  return {
    buyer: { readings, ...(equipment ? { equipment } : {}), ...(measuredOn ? { measuredOn } : {}) },
    fieldOf,
    errors,
  };
}

function extraRow(get: Get, i: number, errors: FieldErrors): BuyerReading | null {
  const q = get(extraField(i, "quantity")).trim();
  const text = get(extraField(i, "value")).trim();
  if (!q && !text) return null;
  if (!isOneOf(QUANTITIES, q)) {
    errors[extraField(i, "quantity")] = "Choose what you measured.";
    return null;
  }
  if (!text) {
    errors[extraField(i, "value")] = "Enter the figure you read, with its unit.";
    return null;
  }
  const p = parseAs(text, q);
  if (!p.ok) {
    errors[extraField(i, "value")] = p.error;
    return null;
  }
  const conditions: Conditions = {};
  const load = get(extraField(i, "load")).trim();
  if (load) {
    const r = parseValue(load, { kind: "resistance" });
    if (r.ok && r.value > 0) conditions.loadOhm = r.value;
    else errors[extraField(i, "load")] = r.ok ? "The load must be above zero." : r.error;
  }
  const freq = get(extraField(i, "frequency")).trim();
  if (freq) {
    const r = parseValue(freq, { kind: "frequency" });
    if (r.ok && r.value > 0) conditions.frequencyHz = r.value;
    else errors[extraField(i, "frequency")] = r.ok ? "The frequency must be above zero." : r.error;
  }
  const ch = get(extraField(i, "channel")).trim();
  const channel: Reading["channel"] | undefined = isOneOf(CHANNELS, ch) ? ch : undefined;
  return { quantity: q, value: p.value, unit: p.unit, text, ...(channel ? { channel } : {}), conditions };
}
