import type { BenchSheet } from "@shared/bench/schema";
import type { Category, CosmeticGrade, ServiceState } from "@shared/catalogue";
import type { RestorationPart, RestorationReading } from "@shared/catalogue-schemas";
import type { Role } from "~/auth/roles";

// The demo scenario's people, workshops and places, and the shape of a demo unit. All invented.
export const DEMO_PASSWORD = "bench-demo-2026";

export type AccountKey = "admin" | "desk" | "workshop" | "workshop2" | "workshop3" | "seller" | "seller2" | "buyer" | "buyer2";

export interface DemoAccount {
  key: AccountKey;
  email: string;
  displayName: string;
  roles: Role[];
  /** What `npm start` prints beside the address. */
  role: string;
}

export const DEMO_ACCOUNTS: DemoAccount[] = [
  { key: "admin", email: "admin@loadline.test", displayName: "Wren Hallory", roles: ["buyer", "admin"], role: "admin" },
  { key: "desk", email: "desk@loadline.test", displayName: "Moss Ketteridge", roles: ["buyer", "moderator"], role: "moderator" },
  {
    key: "workshop",
    email: "workshop@loadline.test",
    displayName: "Ottilie Varn",
    roles: ["buyer", "workshop"],
    role: "workshop (verified)",
  },
  {
    key: "workshop2",
    email: "valves@loadline.test",
    displayName: "Bram Keswater",
    roles: ["buyer", "workshop"],
    role: "workshop (verified)",
  },
  {
    key: "workshop3",
    email: "platters@loadline.test",
    displayName: "Isolde Pennick",
    roles: ["buyer", "workshop"],
    role: "workshop (applied)",
  },
  { key: "seller", email: "seller@loadline.test", displayName: "Jory Fenwright", roles: ["buyer", "seller"], role: "private seller" },
  { key: "seller2", email: "seller2@loadline.test", displayName: "Anneke Sollum", roles: ["buyer", "seller"], role: "private seller" },
  { key: "buyer", email: "buyer@loadline.test", displayName: "Perrin Gadsby", roles: ["buyer"], role: "buyer" },
  { key: "buyer2", email: "buyer2@loadline.test", displayName: "Linnet Aubrey", roles: ["buyer"], role: "buyer" },
];

export interface DemoWorkshop {
  owner: AccountKey;
  name: string;
  slug: string;
  about: string;
  town: string;
  region: string;
  country: string;
  verifiedDaysAgo: number | null;
}

export const DEMO_WORKSHOPS: DemoWorkshop[] = [
  {
    owner: "workshop",
    name: "Corrowmere Audio Bench",
    slug: "corrowmere-audio-bench",
    about:
      "Two benches, one dummy-load rack and forty years of transistor amplifiers between us. Every unit is recapped where it needs it, biased, measured into 8 and 4 Ω and soak-tested for a week before it is listed.",
    town: "Corrowmere",
    region: "Westhallow",
    country: "GB",
    verifiedDaysAgo: 210,
  },
  {
    owner: "workshop2",
    name: "Keswater Valve & Transistor",
    slug: "keswater-valve-transistor",
    about:
      "Power amplifiers, tape transports and the loudspeakers they drive. We replace what has drifted, measure what we replaced, and pack heavy units on pallets.",
    town: "Velsbridge",
    region: "Dunmarsh",
    country: "GB",
    verifiedDaysAgo: 95,
  },
  {
    owner: "workshop3",
    name: "Pennick Turntable Works",
    slug: "pennick-turntable-works",
    about:
      "Belt and direct-drive turntables: new belts, bearings cleaned and re-oiled, speed and wow & flutter measured with a 3150 Hz test record.",
    town: "Brindlecote",
    region: "Eastreach",
    country: "GB",
    verifiedDaysAgo: null,
  },
];

/** Where private sellers keep their units. */
export const SELLER_PLACES: Partial<Record<AccountKey, { town: string; region: string; postcode: string }>> = {
  seller: { town: "Oxhallow", region: "Westhallow", postcode: "WH4 7QA" },
  seller2: { town: "Saltrey Cross", region: "Dunmarsh", postcode: "DM9 2LE" },
  workshop: { town: "Corrowmere", region: "Westhallow", postcode: "WH1 3BX" },
  workshop2: { town: "Velsbridge", region: "Dunmarsh", postcode: "DM2 8RT" },
  workshop3: { town: "Brindlecote", region: "Eastreach", postcode: "ER6 1NP" },
};

/**
 * Each invented maker numbers its models its own way, so no demo code reads like a real product line.
 * The scale generator and any new demo unit follow these; the unit tests check every demo model.
 */
export const MODEL_SCHEMES: Record<string, { scheme: string; pattern: RegExp }> = {
  // "WQ", the watts in tens, then i(ntegrated), p(ower), r(eceiver) or ph(ono).
  Carrowain: { scheme: "WQ 46i", pattern: /^WQ \d{1,2}(i|p|r|ph)$/ },
  // The Velt range: integrated by watts; P power, C control, R receiver, Ph phono, each with its figure.
  Vantrell: { scheme: "Velt R85", pattern: /^Velt (\d{2,3}|P\d{2,3}|C\d{2}|R\d{2,3}|Ph\d)( Mk II| Studio)?$/ },
  // "ZK", the watts in tens, then .0 integrated, .1 preamplifier, .2 power amplifier.
  Kelloran: { scheme: "ZK 15.2", pattern: /^ZK \d{1,2}\.[012]( Monitor)?$/ },
  // Tellis and a Roman numeral; phono stages say so.
  Calvorne: { scheme: "Tellis Phono II MC", pattern: /^Tellis (Phono )?[IVX]+( Reference| MM| MC| MM\/MC)?$/ },
  // Orrel and the number spelled out.
  Quorvane: { scheme: "Orrel Five Direct", pattern: /^Orrel (One|Two|Three|Four|Five|Six|Seven|Eight|Nine)( Direct| Reference)?$/ },
  // "XQ/" and two digits for cassette decks, "XQ/R" and a digit for open reel.
  Pellquist: { scheme: "XQ/55 Three-Head", pattern: /^XQ\/(\d{2}|R\d)( Three-Head| Reel-to-Reel)?$/ },
  // The cabinet's volume in litres.
  Hexlund: { scheme: "64L (pair)", pattern: /^\d{2}L( Tower)?( \(pair\))?$/ },
  // Bass driver in cm over the nominal impedance.
  Brisvale: { scheme: "40/8 Monitor (pair)", pattern: /^\d{2}\/8( Monitor)?( \(pair\))?$/ },
};

export interface DemoLogEntry {
  daysAgo: number;
  work: string;
  parts?: RestorationPart[];
  technician?: string;
  before?: RestorationReading[];
  after?: RestorationReading[];
}

export interface DemoUnit {
  /** Natural key of the demo listing (stored as its serial number, which the public never sees). */
  serial: string;
  seller: AccountKey;
  category: Category;
  maker: string;
  model: string;
  years: [number, number];
  /** Whole units of `currency`. */
  price: number;
  /** GBP unless given (the demo sellers are in Britain; some price in euros). */
  currency?: "GBP" | "EUR";
  offers?: boolean;
  grade: CosmeticGrade;
  service: ServiceState;
  note: string;
  /** Published this many days ago (drafts: created). */
  daysAgo: number;
  weightKg: number;
  /** Boxed, in cm. */
  box: [number, number, number];
  mains?: { v: number; hz: 50 | 60; switchable: boolean };
  includes?: Array<"manual" | "remote" | "packing">;
  handlingDays?: number;
  /** Held is not set here: the bench's verdict decides it. */
  status?: "live" | "draft" | "sold" | "withdrawn";
  sheet?: BenchSheet;
  log?: DemoLogEntry[];
  /** Photos to draw (0 for none; drafts have none). */
  photos?: 0 | 1 | 2;
}
