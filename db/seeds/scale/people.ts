import type { Currency } from "@shared/listing-input";
import { Rng } from "./rng";

// The scale seed's sellers: private sellers and workshops across the countries Loadline ships to,
// with invented names, towns and regions (syllables put together, so no real person or place is
// meant). Every account is at the scale domain, which is how a later run finds and replaces them.

export const SCALE_EMAIL_DOMAIN = "scale.loadline.test";

export interface Place {
  country: string;
  currency: Currency;
  mains: { v: number; hz: 50 | 60 };
  region: string;
  town: string;
  postcode: string;
}

export interface ScaleSeller {
  id: string;
  email: string;
  displayName: string;
  roles: string[];
  place: Place;
  workshop: { id: string; name: string; slug: string; about: string; verified: boolean } | null;
  /** How much this seller lists, relative to the others. */
  activity: number;
}

type CountryInfo = { share: number; currency: Currency; mains: { v: number; hz: 50 | 60 }; style: keyof typeof TOWN_PARTS };

const EU230 = { v: 230, hz: 50 as const };
/** Where sellers are, roughly as a European market with a few overseas sellers would have them. */
const COUNTRIES: Record<string, CountryInfo> = {
  GB: { share: 26, currency: "GBP", mains: EU230, style: "en" },
  DE: { share: 17, currency: "EUR", mains: EU230, style: "de" },
  NL: { share: 7, currency: "EUR", mains: EU230, style: "de" },
  FR: { share: 8, currency: "EUR", mains: EU230, style: "fr" },
  IT: { share: 5, currency: "EUR", mains: EU230, style: "fr" },
  ES: { share: 3, currency: "EUR", mains: EU230, style: "fr" },
  BE: { share: 3, currency: "EUR", mains: EU230, style: "fr" },
  AT: { share: 2, currency: "EUR", mains: EU230, style: "de" },
  IE: { share: 1, currency: "EUR", mains: EU230, style: "en" },
  SE: { share: 4, currency: "SEK", mains: EU230, style: "no" },
  DK: { share: 3, currency: "DKK", mains: EU230, style: "no" },
  NO: { share: 2, currency: "NOK", mains: EU230, style: "no" },
  CH: { share: 3, currency: "CHF", mains: EU230, style: "de" },
  PL: { share: 3, currency: "PLN", mains: EU230, style: "de" },
  CZ: { share: 2, currency: "CZK", mains: EU230, style: "de" },
  US: { share: 5, currency: "USD", mains: { v: 120, hz: 60 }, style: "en" },
  CA: { share: 1, currency: "CAD", mains: { v: 120, hz: 60 }, style: "en" },
  AU: { share: 1, currency: "AUD", mains: { v: 240, hz: 50 }, style: "en" },
  JP: { share: 2, currency: "JPY", mains: { v: 100, hz: 60 }, style: "en" },
};

const TOWN_PARTS = {
  en: [
    ["Corrow", "Hallow", "Fenby", "Saltrey", "Brindle", "Oxley", "Wendle", "Marrow", "Dunley", "Kestle"],
    ["mere", "cote", " Cross", "bridge", "wick", "ford", "stow", "holm", "combe", "dale"],
  ],
  de: [
    ["Kell", "Aur", "Wend", "Sollm", "Brack", "Ostr", "Tann", "Löw", "Gräf", "Mühl"],
    ["brück", "heim", "stedt", "hausen", "au", "feld", "dorf", "ingen", "rode", "bach"],
  ],
  fr: [
    ["Sév", "Mont", "Brév", "Lauz", "Vir", "Caul", "Aign", "Rosc", "Pell", "Font"],
    ["renne", "calère", "aulx", "ignac", "ès-le-Pont", "ville", "oisel", "anges", "éde", "ourt"],
  ],
  no: [
    ["Öst", "Kärn", "Lyng", "Fjell", "Åsk", "Sand", "Holm", "Vest", "Brå", "Tjør"],
    ["ravik", "by", "strand", "vall", "sund", "ö", "lunda", "heim", "næs", "rup"],
  ],
} as const;

const REGION_PARTS = [
  ["West", "East", "North", "South", "Upper", "Lower", "Dun", "Marsh", "Ridge", "Vale"],
  ["hallow", "reach", "marsh", "moor", "land", "wold", "fen", "mark", "shire", "vale"],
];

const FIRST = [
  "Wren",
  "Moss",
  "Ottilie",
  "Bram",
  "Isolde",
  "Jory",
  "Anneke",
  "Perrin",
  "Linnet",
  "Tamsin",
  "Oskar",
  "Ines",
  "Corin",
  "Maren",
  "Elske",
  "Teodor",
  "Silke",
  "Rowan",
  "Aurèle",
  "Léonie",
  "Björn",
  "Saskia",
  "Emrys",
  "Noor",
  "Hedda",
  "Piet",
  "Zélie",
  "Casimir",
  "Ysolde",
  "Fenna",
  "Lorcan",
  "Milou",
  "Anselm",
  "Britt",
  "Ciarán",
  "Ottokar",
];
const SURNAME = [
  ["Hal", "Fen", "Kes", "Var", "Pen", "Sol", "Gad", "Corr", "Brin", "Wes", "Tal", "Mer", "Ost", "Lun", "Quil", "Rad", "Vel", "Ash"],
  ["lory", "wright", "water", "nick", "lum", "sby", "rey", "mere", "dridge", "beck", "stow", "wick", "holt", "ley", "garth", "more"],
];
const WORKSHOP_KINDS = [
  "Audio Bench",
  "Hi-Fi Works",
  "Amplifier Clinic",
  "Valve & Transistor",
  "Sound Repair",
  "Restorations",
  "Audio Service",
  "Turntable Works",
];

function composed(rng: Rng, parts: readonly (readonly string[])[]): string {
  return parts.map((p) => rng.pick(p)).join("");
}

function postcode(rng: Rng, country: string): string {
  const letter = () => String.fromCharCode(65 + rng.int(0, 25));
  if (country === "GB" || country === "IE") return `${letter()}${letter()}${rng.int(1, 19)} ${rng.int(1, 9)}${letter()}${letter()}`;
  if (country === "NL") return `${rng.int(1000, 9999)} ${letter()}${letter()}`;
  if (["AT", "BE", "CH", "DK", "NO", "AU"].includes(country)) return String(rng.int(1000, 9999));
  if (country === "CA") return `${letter()}${rng.int(0, 9)}${letter()} ${rng.int(0, 9)}${letter()}${rng.int(0, 9)}`;
  if (country === "JP") return `${rng.int(100, 999)}-${rng.int(1000, 9999)}`;
  return String(rng.int(10000, 99999));
}

function place(rng: Rng): Place {
  const country = rng.weighted(Object.fromEntries(Object.entries(COUNTRIES).map(([c, i]) => [c, i.share])));
  const info = COUNTRIES[country];
  // A few sellers outside the euro area ask in euros, for buyers across the border.
  const currency = info.currency !== "EUR" && info.currency !== "GBP" && rng.chance(0.1) ? "EUR" : info.currency;
  return {
    country,
    currency,
    mains: info.mains,
    region: composed(rng, REGION_PARTS),
    town: composed(rng, TOWN_PARTS[info.style]),
    postcode: postcode(rng, country),
  };
}

const slugify = (s: string) =>
  s
    .normalize("NFD")
    .replace(/[\u0300-\u036f]/g, "")
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-|-$/g, "");

/** The sellers for a seed of `listings` units: about one workshop per 800 units and one private seller per 25. */
export function scaleSellers(seed: number, listings: number): { workshops: ScaleSeller[]; privates: ScaleSeller[] } {
  const workshops: ScaleSeller[] = [];
  const privates: ScaleSeller[] = [];
  const nWorkshops = Math.max(4, Math.round(listings / 800));
  const nPrivates = Math.max(12, Math.round(listings / 25));
  for (let i = 0; i < nWorkshops; i++) {
    const rng = new Rng(seed, 0x5e11e5, 1, i);
    const surname = composed(rng, SURNAME);
    const name = `${surname} ${rng.pick(WORKSHOP_KINDS)}`;
    const p = place(rng);
    const verified = rng.chance(0.88);
    workshops.push({
      id: rng.uuid(),
      email: `workshop-${String(i + 1).padStart(4, "0")}@${SCALE_EMAIL_DOMAIN}`,
      displayName: `${rng.pick(FIRST)} ${surname}`,
      roles: ["buyer", "workshop"],
      place: p,
      workshop: {
        id: rng.uuid(),
        name,
        // The index keeps slugs unique when two workshops draw the same name.
        slug: `${slugify(name)}-${i + 1}`,
        about: `Bench repairs and restorations in ${p.town}: every unit is serviced, measured and soak-tested before it is listed.`,
        verified,
      },
      // A workshop lists far more than a private seller, and a few workshops most of all.
      activity: 20 * rng.logNormal(1, 0.6),
    });
  }
  for (let i = 0; i < nPrivates; i++) {
    const rng = new Rng(seed, 0x5e11e5, 2, i);
    privates.push({
      id: rng.uuid(),
      email: `seller-${String(i + 1).padStart(5, "0")}@${SCALE_EMAIL_DOMAIN}`,
      displayName: `${rng.pick(FIRST)} ${composed(rng, SURNAME)}`,
      roles: ["buyer", "seller"],
      place: place(rng),
      workshop: null,
      activity: rng.logNormal(1, 0.9),
    });
  }
  return { workshops, privates };
}
