import {
  SHIPPING_METHOD_LABELS,
  SHIPPING_ZONES,
  SHIPPING_ZONE_LABELS,
  TWO_PERSON_LIFT_G,
  formatPrice,
  type ShippingZone,
} from "@shared/catalogue";
import type { RestorationReading } from "@shared/catalogue-schemas";
import type { Listing, RestorationEntry, User, Workshop } from "~/models/index.server";
import type { RestorationEntryView, SellerCard, ShippingView } from "./types";
import { dayText, monthText } from "@shared/dates";

// The restoration log, the seller's card and the shipping options, as the listing page shows them.

const regionNames = new Intl.DisplayNames(["en-GB"], { type: "region" });

export function countryName(code: string | null | undefined): string | null {
  if (!code) return null;
  try {
    return regionNames.of(code.toUpperCase()) ?? code;
  } catch {
    return code;
  }
}

export function placeText(town: string | null, region: string | null, country: string | null): string | null {
  const parts = [town, region, countryName(country)].filter((p): p is string => !!p && p.trim() !== "");
  return parts.length ? parts.join(", ") : null;
}

// ---- restoration log ---------------------------------------------------------------------------

function readingText(r: RestorationReading): string {
  const value = Number.isInteger(r.value) ? String(r.value) : String(Number(r.value.toPrecision(4)));
  return `${value.replace(/^-/, "−")} ${r.unit}`;
}

/** Before and after readings side by side, paired by what was measured and how. */
function pairReadings(before: RestorationReading[], after: RestorationReading[]): RestorationEntryView["readings"] {
  const key = (r: RestorationReading) => `${r.quantity.trim().toLowerCase()}|${r.conditions.trim().toLowerCase()}`;
  const rows = new Map<string, RestorationEntryView["readings"][number]>();
  for (const r of before) rows.set(key(r), { quantity: r.quantity, before: readingText(r), after: null, conditions: r.conditions });
  for (const r of after) {
    const row = rows.get(key(r));
    if (row && row.after === null) row.after = readingText(r);
    else rows.set(`${key(r)}|after`, { quantity: r.quantity, before: null, after: readingText(r), conditions: r.conditions });
  }
  return [...rows.values()];
}

export function restorationLog(entries: RestorationEntry[]): RestorationEntryView[] {
  return [...entries]
    .sort((a, b) => a.doneOn.localeCompare(b.doneOn) || a.createdAt.getTime() - b.createdAt.getTime())
    .map((e) => ({
      id: e.id,
      doneOn: e.doneOn,
      doneOnText: dayText(e.doneOn),
      work: e.work,
      technician: e.technician,
      parts: (e.parts ?? []).map((p) => ({ part: p.part, quantity: p.quantity, reference: p.reference ?? null })),
      readings: pairReadings(e.readingsBefore ?? [], e.readingsAfter ?? []),
    }));
}

// ---- seller's card ---------------------------------------------------------------------------------

/** A workshop by its name and town; a private seller by display name and the listing's region. */
export function sellerCard(listing: Listing, seller: User | null | undefined, workshop: Workshop | null | undefined): SellerCard {
  const since = monthText(workshop?.createdAt ?? seller?.createdAt ?? listing.createdAt);
  if (workshop) {
    return {
      kind: "workshop",
      name: workshop.name,
      place: placeText(workshop.town, workshop.region, workshop.country),
      verifiedWorkshop: workshop.verificationStatus === "verified" && workshop.verifiedAt !== null,
      about: workshop.about,
      memberSince: since,
    };
  }
  return {
    kind: "private",
    name: seller?.displayName ?? "Private seller",
    place: placeText(null, listing.region, listing.country),
    verifiedWorkshop: false,
    about: null,
    memberSince: since,
  };
}

// ---- shipping ------------------------------------------------------------------------------------

export function shippingView(listing: Listing, zone: ShippingZone, guessedFrom: string | null): ShippingView {
  const heavy = (listing.weightG ?? 0) >= TWO_PERSON_LIFT_G;
  const offered = listing.shippingOptions;
  const parcelWithheld = heavy && offered.some((o) => o.method === "parcel");
  const order = { collection: 0, parcel: 1, freight: 2 } as const;
  const options = offered
    .filter((o) => !(heavy && o.method === "parcel"))
    .sort((a, b) => order[a.method] - order[b.method])
    .map((o) => {
      const prices: ShippingView["options"][number]["prices"] = {};
      if (o.method !== "collection") {
        for (const z of SHIPPING_ZONES) {
          const minor = o.prices[z];
          if (minor !== undefined) prices[z] = { minor, text: minor === 0 ? "Free" : formatPrice(minor, listing.currency) };
        }
      }
      const collectionPlace = placeText(listing.town, listing.region, listing.country);
      return {
        method: o.method,
        label: SHIPPING_METHOD_LABELS[o.method],
        prices,
        note: o.method === "collection" ? (o.note ?? (collectionPlace ? `From ${collectionPlace}` : null)) : null,
      };
    });
  return {
    zone,
    zoneGuessedFrom: guessedFrom,
    zones: SHIPPING_ZONES.map((z) => ({
      zone: z,
      label: z === "domestic" && listing.country ? `Within ${countryName(listing.country)}` : SHIPPING_ZONE_LABELS[z],
    })),
    options,
    heavy,
    parcelWithheld,
    handlingDays: listing.handlingDays,
    sellerCountryName: countryName(listing.country),
  };
}
