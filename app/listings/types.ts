import type { Category, CosmeticGrade, ListingStatus, ServiceState, ShippingMethod, ShippingZone } from "@shared/catalogue";
import type { Outcome } from "@shared/bench";

// What the public listing page receives. Built on the server from what the viewer may see; it never
// carries the serial number (column or the sheet's equipment.serial), the postcode, e-mail addresses,
// storage keys of originals, or capture file names.

export interface ListingPageData {
  listing: ListingHead;
  viewer: ViewerState;
  photos: GalleryPhoto[];
  keyFigures: KeyFigureView[];
  bench: BenchView | null;
  plots: PlotSet;
  restoration: RestorationEntryView[];
  seller: SellerCard;
  shipping: ShippingView;
}

export interface ListingHead {
  id: string;
  status: ListingStatus;
  title: string;
  maker: string | null;
  model: string | null;
  category: Category;
  categoryLabel: string;
  era: string | null;
  priceMinor: number | null;
  currency: string;
  /** Formatted with Intl for the listing's currency, e.g. "€1,450". */
  priceText: string | null;
  offersWelcome: boolean;
  benchVerified: boolean;
  publishedAt: string | null;
  /** Only for the seller and moderators of a held listing. */
  heldReason: string | null;
  condition: {
    cosmetic: { code: CosmeticGrade; label: string; description: string } | null;
    service: { code: ServiceState; label: string; description: string } | null;
    note: string | null;
  };
  unit: UnitDetails;
  place: { town: string | null; region: string | null; country: string | null; countryName: string | null };
}

export interface UnitDetails {
  mains: { voltageV: number; frequencyHz: number | null; switchable: boolean } | null;
  weightG: number | null;
  weightText: string | null;
  boxedText: string | null;
  includes: string[];
  /** The seller recorded a serial number with Loadline (the number itself is never shown). */
  serialOnFile: boolean;
  handlingDays: number | null;
}

export interface ViewerState {
  signedIn: boolean;
  isSeller: boolean;
  isModerator: boolean;
  watching: boolean;
  /** A signed-in buyer who is not the seller, on a live listing. */
  canWatch: boolean;
  signInHref: string;
}

export interface GalleryPhoto {
  id: string;
  thumbUrl: string;
  listingUrl: string;
  zoomUrl: string;
  width: number;
  height: number;
  alt: string;
}

export interface KeyFigureView {
  key: string;
  label: string;
  value: string;
  unit: string;
  conditions: string;
  fromCapture: boolean;
}

export interface ReadingRow {
  ref: string;
  quantity: string;
  channel: string | null;
  value: string;
  conditions: string;
  basis: "rated" | "measured";
  fromCapture: boolean;
  /** "1 kHz sine, WAV" — how the capture behind the figure was analysed. */
  captureNote: string | null;
  note: string | null;
}

export interface CheckFinding {
  outcome: Outcome;
  detail: string;
  compared: { label: string; display: string }[];
  /** Any of the figures this finding compared came from a capture. */
  usesCapture: boolean;
}

/** One rule of the bench, with what it found on this sheet (a rule may look at several figures). */
export interface CheckRow {
  ruleId: string;
  title: string;
  /** The worst of its findings. */
  outcome: Outcome;
  explanation: string;
  source: string;
  findings: CheckFinding[];
  usesCapture: boolean;
}

export interface BenchView {
  measuredBy: string | null;
  measuredOn: string | null;
  notes: string | null;
  checkedAt: string | null;
  summary: string;
  verified: boolean;
  counts: Record<Outcome, number>;
  readings: ReadingRow[];
  checks: CheckRow[];
  skipped: { title: string; reason: string }[];
  shortfalls: string[];
  derived: { label: string; display: string }[];
  captureCount: number;
  /** Readings that make the unit unsafe to connect, in plain words (the bench's hazards). */
  hazards: { title: string; detail: string }[];
}

export interface SpectrumPlot {
  id: string;
  title: string;
  /** e.g. "1 kHz at 60 W into 8 Ω, 20 Hz–20 kHz bandwidth, 48 kHz WAV" */
  conditions: string;
  fundamentalHz: number;
  /** One bar group per harmonic order (2…10); dB re the fundamental per channel. */
  bars: { order: number; label: string; frequencyHz: number; levels: Record<string, number> }[];
  channels: { key: string; label: string; thd: string }[];
  floorDb: number;
  /** Axis titles for bars that are not harmonics (intermodulation products, separation per tone). */
  xLabel?: string;
  yLabel?: string;
}

export interface ResponsePlot {
  id: string;
  title: string;
  conditions: string;
  kind: "flat" | "riaa";
  fromCapture: boolean;
  /** Level re 1 kHz; for RIAA also the target curve and the deviation from it. */
  points: { f: number; level: number; target?: number; deviation?: number }[];
  /** For RIAA sweeps: "RIAA" or "RIAA with the IEC 7950 µs pole", and the worst deviation. */
  riaa: { variant: string; worst: string } | null;
  domain: { level: [number, number]; deviation: [number, number] | null };
}

export interface SquarePlot {
  id: string;
  title: string;
  conditions: string;
  /** Time in µs from the first sample, level in V. */
  points: { t: number; v: number }[];
  figures: { label: string; display: string }[];
  /** Axes other than time in µs against volts (a level over seconds, for output impedance). */
  axes?: { x: { label: string; unit: string }; y: { label: string; unit: string } };
}

/** A wow & flutter capture: the instantaneous speed against time, captioned with its weighted figures. */
export interface SpeedDriftPlot {
  id: string;
  title: string;
  conditions: string;
  /** Time in s from the start of the tone; speed re nominal in %. */
  points: { t: number; percent: number }[];
  figures: { label: string; display: string }[];
}

export interface PlotSet {
  spectra: SpectrumPlot[];
  responses: ResponsePlot[];
  squares: SquarePlot[];
  /** Loudspeakers' impedance sweeps (app/listings/plots-impedance.server.ts). */
  impedances: ImpedancePlot[];
  speedDrifts: SpeedDriftPlot[];
}

export interface ImpedancePlot {
  id: string;
  title: string;
  conditions: string;
  /** Modulus in Ω, and phase in degrees when the sweep has it; frequency in Hz, rising. */
  points: { f: number; ohms: number; phase?: number }[];
  /** 80 % of the rated impedance (IEC 60268-5 §16.1), drawn as a line when the rating is known. */
  floorOhm: number | null;
  figures: { label: string; display: string }[];
}

export interface RestorationReadingView {
  quantity: string;
  before: string | null;
  after: string | null;
  conditions: string;
}

export interface RestorationEntryView {
  id: string;
  doneOn: string;
  doneOnText: string;
  work: string;
  technician: string | null;
  parts: { part: string; quantity: number; reference: string | null }[];
  readings: RestorationReadingView[];
}

export interface SellerCard {
  kind: "workshop" | "private";
  name: string;
  place: string | null;
  verifiedWorkshop: boolean;
  about: string | null;
  memberSince: string;
}

export interface ShippingChoice {
  method: ShippingMethod;
  label: string;
  /** Price per zone, minor units; absent where the seller does not ship to that zone. */
  prices: Partial<Record<ShippingZone, { minor: number; text: string }>>;
  note: string | null;
}

export interface ShippingView {
  /** The zone the page opens with (query, else a guess from the visitor's language and region). */
  zone: ShippingZone;
  zoneGuessedFrom: string | null;
  zones: { zone: ShippingZone; label: string }[];
  options: ShippingChoice[];
  /** At or over 30 kg: freight only, two people to lift. */
  heavy: boolean;
  /** The seller offered parcel for a heavy unit; the page leaves it out. */
  parcelWithheld: boolean;
  handlingDays: number | null;
  sellerCountryName: string | null;
}
