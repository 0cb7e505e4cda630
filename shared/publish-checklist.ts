// What a listing needs before it can go on the market. The review step shows it; the server enforces it.
import { type CosmeticGrade, type ServiceState } from "./catalogue";
import type { ShippingOption } from "./catalogue-schemas";
import type { EditorStep } from "./listing-draft";

export type ChecklistInput = {
  listing: {
    maker: string | null;
    model: string | null;
    priceMinor: number | null;
    country: string | null;
    weightG: number | null;
    shippingOptions: ShippingOption[];
    handlingDays: number | null;
    cosmeticGrade: CosmeticGrade | null;
    serviceState: ServiceState | null;
    conditionNote: string | null;
  };
  /** Readings on the stored bench sheet, or null when there is none. */
  sheet: { readings: number; measured: number } | null;
  restorationEntries: number;
  /** Null while the listing has no photo feature to count. */
  photos: { ready: number; processing: number; failed: number } | null;
  emailVerified: boolean;
};

export type ChecklistItem = { id: string; step: EditorStep | "account"; label: string; ok: boolean; hint: string };

export function publishChecklist(i: ChecklistInput): ChecklistItem[] {
  const l = i.listing;
  const shipped = l.shippingOptions.some((o) => o.method !== "collection");
  const faulty = l.serviceState === "needs_work" || l.serviceState === "parts_only";
  const measuredClaim = l.serviceState === "serviced_measured";
  // Only what applies to this unit is listed: a serviced unit with no fault has no "fault, described"
  // to tick off, a unit collected in person no handling time.
  const items: ChecklistItem[] = [
    { id: "title", step: "item", label: "Maker and model", ok: !!(l.maker && l.model), hint: "Buyers search by both." },
    { id: "price", step: "item", label: "Price", ok: l.priceMinor !== null, hint: "The asking price; say whether offers are welcome." },
    { id: "location", step: "item", label: "Where the unit is", ok: !!l.country, hint: "At least the country, for shipping zones." },
    {
      id: "weight",
      step: "item",
      label: "Weight",
      ok: l.weightG !== null,
      hint: "Buyers and carriers need it; 30 kg and more means freight.",
    },
    {
      id: "shipping",
      step: "item",
      label: "How it reaches the buyer",
      ok: l.shippingOptions.length > 0,
      hint: "Collection, parcel or freight, with a price per zone you ship to.",
    },
  ];
  if (shipped)
    items.push({
      id: "handling",
      step: "item",
      label: "Handling time",
      ok: l.handlingDays !== null,
      hint: "Days between payment and dispatch.",
    });
  items.push(
    { id: "grade", step: "condition", label: "Cosmetic grade", ok: !!l.cosmeticGrade, hint: "How it looks." },
    { id: "service", step: "condition", label: "Service state", ok: !!l.serviceState, hint: "What has been done to it." },
  );
  if (faulty)
    items.push({
      id: "fault-note",
      step: "condition",
      label: "The fault, described",
      ok: !!l.conditionNote?.trim(),
      hint: "A unit that needs work or is for parts says what is wrong in the condition note.",
    });
  if (measuredClaim)
    items.push(
      {
        id: "restoration",
        step: "restoration",
        label: "Restoration log",
        ok: i.restorationEntries > 0,
        hint: "“Serviced & measured” needs at least one entry saying what was done.",
      },
      {
        id: "bench",
        step: "bench",
        label: "Bench sheet",
        ok: (i.sheet?.measured ?? 0) > 0,
        hint: "“Serviced & measured” needs a bench sheet with measured readings.",
      },
    );
  if (i.photos) {
    items.push({
      id: "photos",
      step: "photos",
      label: "Photos",
      ok: i.photos.ready > 0 && i.photos.processing === 0,
      hint: i.photos.processing > 0 ? "Wait until every photo has finished processing." : "At least one photo of the unit itself.",
    });
  }
  items.push({
    id: "email",
    step: "account",
    label: "Confirmed e-mail address",
    ok: i.emailVerified,
    hint: "Buyers and the review desk must be able to reach you. Confirm it from your account page.",
  });
  return items;
}
