import type { BenchSheet } from "@shared/bench/schema";
import type { Category, CosmeticGrade, RestorationPart, RestorationReading, ServiceState } from "@shared/catalogue";
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
  /** Whole pounds. */
  price: number;
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
