// The catalogue's vocabulary, shared by the database checks, the forms and the pages. Values are the
// stored codes; labels and seller descriptions are Loadline's own words (README and docs). No zod here:
// every public page reads these words, and the schemas (catalogue-schemas.ts) are the forms' business.

export const CATEGORIES = [
  "integrated_amplifier",
  "power_amplifier",
  "preamplifier",
  "receiver",
  "phono_stage",
  "turntable",
  "tape_deck",
  "loudspeaker",
] as const;
export type Category = (typeof CATEGORIES)[number];

export const CATEGORY_LABELS: Record<Category, { one: string; many: string; slug: string }> = {
  integrated_amplifier: { one: "Integrated amplifier", many: "Integrated amplifiers", slug: "integrated-amplifiers" },
  power_amplifier: { one: "Power amplifier", many: "Power amplifiers", slug: "power-amplifiers" },
  preamplifier: { one: "Preamplifier", many: "Preamplifiers", slug: "preamplifiers" },
  receiver: { one: "Receiver", many: "Receivers", slug: "receivers" },
  phono_stage: { one: "Phono stage", many: "Phono stages", slug: "phono-stages" },
  turntable: { one: "Turntable", many: "Turntables", slug: "turntables" },
  tape_deck: { one: "Tape deck", many: "Tape decks", slug: "tape-decks" },
  loudspeaker: { one: "Loudspeaker", many: "Loudspeakers", slug: "loudspeakers" },
};

/** The category for a URL slug such as `phono-stages`, or null. */
export function categoryFromSlug(slug: string | null | undefined): Category | null {
  if (!slug) return null;
  const hit = CATEGORIES.find((c) => CATEGORY_LABELS[c].slug === slug);
  return hit ?? null;
}

export const LISTING_STATUSES = ["draft", "held", "live", "reserved", "sold", "withdrawn", "removed"] as const;
export type ListingStatus = (typeof LISTING_STATUSES)[number];

export const LISTING_STATUS_LABELS: Record<ListingStatus, string> = {
  draft: "Draft",
  held: "Held for review",
  live: "Live",
  reserved: "Reserved",
  sold: "Sold",
  withdrawn: "Withdrawn",
  removed: "Removed",
};

export const COSMETIC_GRADES = ["showroom", "clean", "lived_in", "rough"] as const;
export type CosmeticGrade = (typeof COSMETIC_GRADES)[number];

export const COSMETIC_GRADE_TEXT: Record<CosmeticGrade, { label: string; description: string }> = {
  showroom: {
    label: "Showroom",
    description: "Looks close to new at arm's length: no marks you would notice, legends crisp, knobs and feet original.",
  },
  clean: {
    label: "Clean",
    description: "Light wear only when you look closely: a few fine marks, nothing chipped, dented or missing.",
  },
  lived_in: {
    label: "Lived-in",
    description: "Honest wear from years of use: visible scratches, small dents or faded print, every part present.",
  },
  rough: {
    label: "Rough",
    description: "Heavy wear or damage: deep scratches, dents, cracked or missing trim. Priced for what it does.",
  },
};

export const SERVICE_STATES = ["serviced_measured", "working_unserviced", "needs_work", "parts_only"] as const;
export type ServiceState = (typeof SERVICE_STATES)[number];

export const SERVICE_STATE_TEXT: Record<ServiceState, { label: string; description: string }> = {
  serviced_measured: {
    label: "Serviced & measured",
    description: "Opened, serviced and then measured on the bench; the restoration log and bench sheet show what was done.",
  },
  working_unserviced: {
    label: "Working, unserviced",
    description: "Works as it came to you but has not been opened, cleaned or recapped; expect age-related drift.",
  },
  needs_work: {
    label: "Needs work",
    description: "Has a known fault, described in the condition note; sold for repair by someone qualified.",
  },
  parts_only: {
    label: "Parts only",
    description: "Not working or incomplete; for spares or a full rebuild. Not to be connected to mains as it is.",
  },
};

export const WORKSHOP_STATUSES = ["applied", "verified", "rejected"] as const;
export type WorkshopStatus = (typeof WORKSHOP_STATUSES)[number];

export const PHOTO_STATUSES = ["processing", "ready", "failed"] as const;
export type PhotoStatus = (typeof PHOTO_STATUSES)[number];

// Shipping: who pays what to move a heavy, fragile box. Zones are relative to the seller's country.
export const SHIPPING_METHODS = ["collection", "parcel", "freight"] as const;
export type ShippingMethod = (typeof SHIPPING_METHODS)[number];
export const SHIPPING_METHOD_LABELS: Record<ShippingMethod, string> = {
  collection: "Collection in person",
  parcel: "Parcel, insured",
  freight: "Freight on a pallet",
};

export const SHIPPING_ZONES = ["domestic", "nearby", "worldwide"] as const;
export type ShippingZone = (typeof SHIPPING_ZONES)[number];
export const SHIPPING_ZONE_LABELS: Record<ShippingZone, string> = {
  domestic: "Within the seller's country",
  nearby: "Neighbouring countries",
  worldwide: "Rest of the world",
};

/** Weight from which we tell sellers and buyers that two people must lift and freight packing is needed. */
export const TWO_PERSON_LIFT_G = 30_000;

/** "Maker Model", the listing's title. */
export function listingTitle(maker: string | null | undefined, model: string | null | undefined): string {
  return [maker, model].filter((s) => s && s.trim()).join(" ") || "Untitled unit";
}

/**
 * A year or an era: 1978; 1975–79; the 1970s when the span is a whole decade; "c. 1980" when only a
 * start is known. Null when neither is known.
 */
export function formatEra(from: number | null | undefined, to: number | null | undefined): string | null {
  if (!from && !to) return null;
  if (from && !to) return `c. ${from}`;
  if (!from && to) return `by ${to}`;
  const a = from!;
  const b = to!;
  if (a === b) return String(a);
  if (a % 10 === 0 && b === a + 9) return `the ${a}s`;
  const sameCentury = Math.floor(a / 100) === Math.floor(b / 100);
  return `${a}–${sameCentury ? String(b).slice(2) : b}`;
}

// Prices are formatted in shared/money.ts, which stays free of zod (see there).
export { formatPrice } from "./money";

/** Grams to "14.2 kg" or "850 g". */
export function formatWeight(grams: number): string {
  if (grams < 1000) return `${grams} g`;
  const kg = grams / 1000;
  return `${kg >= 100 ? Math.round(kg) : kg.toFixed(1).replace(/\.0$/, "")} kg`;
}
