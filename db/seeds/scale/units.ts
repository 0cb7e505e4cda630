import type { BenchSheet } from "@shared/bench/schema";
import type { Category, CosmeticGrade, ServiceState } from "@shared/catalogue";
import type { ShippingOption } from "@shared/catalogue-schemas";
import { CURRENCIES, type Currency } from "@shared/listing-input";
import { amplifierSheet, loudspeakerSheet, phonoSheet, preamplifierSheet, tapeSheet, turntableSheet } from "../demo-sheets";
import { CATEGORY_SHARE, SCALE_MODELS, type ScaleModel } from "./models";
import type { ScaleSeller } from "./people";
import { Rng } from "./rng";
import { conditionNote } from "./words";

// One unit of the scale seed from (seed, index): which model, who sells it, in what state, at what
// price, and the bench sheet its seller typed. Figures spread around the model's type the way a
// bench finds them: serviced units near or above the rating, tired ones below it.

/** Rough euro rates for pricing made-up units; the app's own rate table is not read here. */
const PER_EUR: Record<Currency, number> = {
  EUR: 1,
  GBP: 0.85,
  USD: 1.08,
  CHF: 0.95,
  SEK: 11.3,
  NOK: 11.6,
  DKK: 7.46,
  PLN: 4.3,
  CZK: 25,
  CAD: 1.47,
  AUD: 1.65,
  JPY: 160,
};

export type UnitStatus = "live" | "sold" | "draft" | "withdrawn";

export interface ScaleUnit {
  id: string;
  sheetId: string;
  seller: ScaleSeller;
  model: ScaleModel;
  status: UnitStatus;
  grade: CosmeticGrade;
  service: ServiceState;
  /** As typed by the seller; validated and checked by the writer. */
  sheet: BenchSheet | null;
  priceMinor: number;
  currency: Currency;
  offersWelcome: boolean;
  mains: { v: number; hz: 50 | 60; switchable: boolean } | null;
  weightG: number;
  boxMm: [number, number, number];
  includes: { manual: boolean; remote: boolean; packing: boolean };
  shipping: ShippingOption[];
  handlingDays: number;
  note: string;
  serial: string;
  years: [number, number];
  createdAt: Date;
  publishedAt: Date | null;
  updatedAt: Date;
}

const DAY = 86_400_000;

/** Models by category, with a cumulative popularity for drawing. */
const BY_CATEGORY = new Map<Category, { models: ScaleModel[]; weights: Record<string, number> }>();
for (const m of SCALE_MODELS) {
  const entry = BY_CATEGORY.get(m.category) ?? { models: [], weights: {} };
  entry.weights[String(entry.models.length)] = m.popularity;
  entry.models.push(m);
  BY_CATEGORY.set(m.category, entry);
}

/** Draws sellers in proportion to how much each lists. */
export class SellerPicker {
  private readonly cumulative: number[] = [];
  private total = 0;
  constructor(private readonly sellers: ScaleSeller[]) {
    for (const s of sellers) this.cumulative.push((this.total += s.activity));
  }
  pick(rng: Rng): ScaleSeller {
    const x = rng.next() * this.total;
    let lo = 0;
    let hi = this.cumulative.length - 1;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (this.cumulative[mid] > x) hi = mid;
      else lo = mid + 1;
    }
    return this.sellers[lo];
  }
}

const round = (x: number, digits = 1) => Number(x.toFixed(digits));

/** A price as people ask it: 95, 240, 1,250, 12,500 kr, ¥85,000. */
function askingPrice(eur: number, currency: Currency): number {
  const local = eur * PER_EUR[currency];
  const step = local < 100 ? 5 : local < 1000 ? 10 : local < 10_000 ? 50 : local < 100_000 ? 500 : 5000;
  const major = Math.max(step, Math.round(local / step) * step);
  return Math.min(major, 1_000_000) * 10 ** CURRENCIES[currency];
}

function shippingFor(rng: Rng, kg: number, currency: Currency, town: string): ShippingOption[] {
  const minor = (eur: number) => Math.round(eur * PER_EUR[currency]) * 10 ** CURRENCIES[currency];
  const options: ShippingOption[] = [];
  if (rng.chance(0.9)) options.push({ method: "collection", note: `From ${town}, by appointment.` });
  if (kg < 25) {
    const nearby = rng.chance(0.7);
    const worldwide = kg < 12 && rng.chance(0.3);
    options.push({
      method: "parcel",
      prices: {
        domestic: minor(12 + kg * 1.2),
        ...(nearby ? { nearby: minor(35 + kg * 2.5) } : {}),
        ...(worldwide ? { worldwide: minor(80 + kg * 6) } : {}),
      },
    });
  }
  if (kg >= 15 || options.length === 0)
    options.push({ method: "freight", prices: { domestic: minor(85 + kg * 1.5), nearby: minor(160 + kg * 3) } });
  return options;
}

interface Who {
  maker: string;
  model: string;
  year: number;
  measuredBy: string;
  measuredOn: string;
}

/** The sheet the seller typed: complete from a workshop, often partial from a private seller; sometimes doctored. */
function sheetFor(rng: Rng, m: ScaleModel, who: Who, depth: "full" | "basic", serviced: boolean): BenchSheet {
  const fit = serviced ? 1 : 1.5; // an unserviced unit distorts and drifts more
  const spread = (x: number, s: number) => rng.logNormal(x, s);
  switch (m.category) {
    case "integrated_amplifier":
    case "power_amplifier":
    case "receiver": {
      const t = m.type;
      const reach = serviced ? rng.range(1.01, 1.14) : rng.range(0.86, 1.06);
      const l8 = Math.round(t.rated8 * reach);
      const r8 = Math.round(l8 * rng.range(0.96, 1.01));
      const l4 = t.rated4 ? Math.round(t.rated4 * reach * rng.range(0.98, 1.03)) : 0;
      const meas4: [number, number] = [l4, Math.round(l4 * rng.range(0.96, 1.01))];
      const thd = spread(t.thdPct * fit, 0.3);
      const doctor = depth === "full" && rng.chance(0.025) ? rng.pick(["half-load", "rails", "voltage"] as const) : undefined;
      return amplifierSheet(m.category, who, {
        rated8: t.rated8,
        ...(t.rated4 ? { rated4: t.rated4, meas4 } : {}),
        ratedThdPct: t.ratedThdPct,
        meas8: [l8, r8],
        thdPct: [round(thd, 4), round(thd * rng.range(0.9, 1.25), 4)],
        snrDb: Math.round(rng.normal(t.snrDb - (serviced ? 0 : 3), 2)),
        f3HighHz: Math.round(spread(t.f3HighHz, 0.12) / 1000) * 1000,
        f3LowHz: Math.max(1, Math.round(spread(t.f3LowHz, 0.2))),
        dampingFactor: Math.max(10, Math.round(spread(t.dampingFactor, 0.2) / 5) * 5),
        basic: depth === "basic",
        ...(doctor ? { doctor } : {}),
      });
    }
    case "preamplifier": {
      const t = m.type;
      return preamplifierSheet(who, {
        gainDb: round(rng.normal(t.gainDb, 0.4)),
        thdPct: round(spread(t.thdPct * fit, 0.3), 4),
        snrDb: Math.round(rng.normal(t.snrDb, 2)),
        f3HighHz: Math.round(spread(t.f3HighHz, 0.1) / 1000) * 1000,
        f3LowHz: Math.max(1, Math.round(spread(t.f3LowHz, 0.2))),
        noNoise: depth === "basic",
        ...(depth === "full" && rng.chance(0.02) ? { doctor: "thdn-below-thd" as const } : {}),
      });
    }
    case "phono_stage": {
      const t = m.type;
      const gainDb = round(rng.normal(t.gainDb, 0.5));
      const snrDb = Math.round(rng.normal(t.snrDb, 2));
      const sheet = phonoSheet(who, {
        gainDb,
        snrDb,
        thdPct: round(spread(t.thdPct * fit, 0.3), 4),
        wobbleDb: round(Math.max(0.02, spread(t.wobbleDb * fit, 0.35)), 2),
        noSweep: depth === "basic",
      });
      // Output noise, input shorted: the 5 mV reference through the stage's gain, that many dB down.
      const noiseV = 0.005 * 10 ** (gainDb / 20) * 10 ** (-snrDb / 20);
      const uv = round(noiseV * 1e6, 1);
      sheet.readings.push({
        quantity: "noise",
        value: uv / 1e6,
        unit: "µV",
        text: `${uv} µV`,
        channel: "both",
        basis: "measured",
        origin: "typed",
        conditions: { weighting: "A" },
        note: "Input shorted.",
      });
      return sheet;
    }
    case "turntable": {
      const t = m.type;
      const speed = round(rng.normal(0, serviced ? 0.12 : 0.6), 2);
      return turntableSheet(who, {
        speedErrorPct: speed === 0 ? 0.01 : speed,
        ...(depth === "full" || rng.chance(0.5) ? { wowFlutterPct: round(spread(t.wowFlutterPct * fit, 0.25), 3) } : {}),
        ...(depth === "full" ? { rumbleDb: Math.round(rng.normal(t.rumbleDb, 2)) } : {}),
        ...(rng.chance(0.3) ? { ratedWowFlutterPct: t.wowFlutterPct, weighting: "IEC-60386-peak" as const } : {}),
      });
    }
    case "tape_deck": {
      const t = m.type;
      const sheet = tapeSheet(who, {
        speedErrorPct: round(rng.normal(0, serviced ? 0.3 : 0.9), 2) || 0.05,
        wowFlutterPct: round(spread(t.wowFlutterPct * fit, 0.25), 3),
        snrDb: Math.round(rng.normal(t.snrDb, 1.5)),
        f3HighHz: Math.round(spread(t.f3HighHz, 0.08) / 100) * 100,
        tapeSpeedCmS: t.tapeSpeedCmS,
      });
      // A seller without a noise meter leaves the signal-to-noise ratio out.
      if (depth === "basic") sheet.readings = sheet.readings.filter((r) => r.quantity !== "snr");
      return sheet;
    }
    case "loudspeaker": {
      const t = m.type;
      return loudspeakerSheet(who, {
        ratedOhm: t.ratedOhm,
        minOhm: round(rng.normal(t.minOhm, 0.15)),
        minAtHz: Math.round(rng.normal(t.minAtHz, 8)),
        ...(depth === "full" || rng.chance(0.4) ? { sensitivityDb: round(rng.normal(t.sensitivityDb, 0.6)) } : {}),
        f3LowHz: Math.round(rng.normal(t.f3LowHz, 2)),
      });
    }
  }
}

export interface UnitContext {
  seed: number;
  /** Publish dates run back from here. */
  until: Date;
  workshops: SellerPicker;
  privates: SellerPicker;
}

export function scaleUnit(ctx: UnitContext, index: number): ScaleUnit {
  const rng = new Rng(ctx.seed, 0x0517, index);
  const id = rng.uuid();
  const sheetId = rng.uuid();
  const category = rng.weighted(CATEGORY_SHARE);
  const line = BY_CATEGORY.get(category)!;
  const model = line.models[Number(rng.weighted(line.weights))];
  const fromWorkshop = rng.chance(0.34);
  const seller = (fromWorkshop ? ctx.workshops : ctx.privates).pick(rng);
  const status = rng.weighted({ live: 81, sold: 10, draft: 5, withdrawn: 4 });

  const service: ServiceState = fromWorkshop
    ? rng.weighted({ serviced_measured: 86, working_unserviced: 9, needs_work: 5, parts_only: 0 })
    : rng.weighted({ serviced_measured: 14, working_unserviced: 60, needs_work: 18, parts_only: 8 });
  const grade: CosmeticGrade =
    service === "parts_only" || service === "needs_work"
      ? rng.weighted({ showroom: 1, clean: 20, lived_in: 45, rough: 34 })
      : rng.weighted({ showroom: 11, clean: 46, lived_in: 34, rough: 9 });
  const serviced = service === "serviced_measured";

  // Workshops measure nearly everything in full; a private seller may measure a few figures or none.
  const depth: "full" | "basic" | null =
    service === "parts_only"
      ? null
      : fromWorkshop
        ? rng.weighted({ full: 93, basic: 4, none: 3 }) === "none"
          ? null
          : rng.chance(0.96)
            ? "full"
            : "basic"
        : rng.weighted({ full: 22, basic: 33, none: 45 }) === "none"
          ? null
          : rng.chance(0.4)
            ? "full"
            : "basic";

  const ageDays = Math.min(3 * 365, rng.logNormal(75, 1.1));
  const published = new Date(ctx.until.getTime() - ageDays * DAY - rng.int(0, 86_399) * 1000);
  const created = new Date(published.getTime() - rng.range(0.1, 6) * DAY);
  const updated = status === "live" ? published : new Date(Math.min(ctx.until.getTime(), published.getTime() + rng.range(1, 60) * DAY));
  const measuredOn = new Date(created.getTime() - rng.range(1, 20) * DAY).toISOString().slice(0, 10);
  const unitYear = model.year + (rng.chance(0.7) ? 0 : rng.int(1, 4));
  const equipment = model.model.replace(/ \(pair\)$/, "");
  const who: Who = {
    maker: model.maker,
    model: equipment,
    year: unitYear,
    measuredBy: seller.workshop?.name ?? seller.displayName,
    measuredOn,
  };
  const sheet = depth ? sheetFor(rng, model, who, depth, serviced) : null;
  // The sheet says the mains it was measured on.
  if (sheet) for (const r of sheet.readings) if (r.conditions?.mainsV !== undefined) r.conditions.mainsV = seller.place.mains.v;

  const gradeFactor = { showroom: 1.35, clean: 1, lived_in: 0.78, rough: 0.55 }[grade];
  const serviceFactor = { serviced_measured: 1.25, working_unserviced: 0.9, needs_work: 0.45, parts_only: 0.2 }[service];
  const priceEur = model.priceEur * gradeFactor * serviceFactor * rng.logNormal(1, 0.22);
  const currency = seller.place.currency;

  const electronics = category !== "loudspeaker";
  const switchable = electronics && rng.chance(0.3);
  const kg = Math.max(0.8, round(rng.normal(model.weightKg, model.weightKg * 0.04)));
  const packing = rng.chance(grade === "showroom" ? 0.6 : 0.12);
  return {
    id,
    sheetId,
    seller,
    model,
    status,
    grade,
    service,
    sheet,
    priceMinor: askingPrice(priceEur, currency),
    currency,
    offersWelcome: rng.chance(0.3),
    mains: electronics ? { v: switchable ? rng.pick([120, 230]) : seller.place.mains.v, hz: seller.place.mains.hz, switchable } : null,
    weightG: Math.round(kg * 1000),
    boxMm: [model.box[0] * 10, model.box[1] * 10, model.box[2] * 10],
    includes: {
      manual: rng.chance(0.45),
      remote: category === "receiver" || category === "integrated_amplifier" ? rng.chance(0.2) : false,
      packing,
    },
    shipping: shippingFor(rng, kg, currency, seller.place.town),
    handlingDays: rng.int(1, 7),
    note: conditionNote(rng, category, service, grade, seller.place.country),
    serial: `${model.maker.slice(0, 2).toUpperCase()}${rng.int(100000, 999999)}`,
    years: [unitYear, unitYear],
    createdAt: created,
    publishedAt: status === "draft" ? null : published,
    updatedAt: status === "draft" ? created : updated,
  };
}
