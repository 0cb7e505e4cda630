// The workshop's inventory: what the table asks for (filters, sort, page — the URL's state, read the same
// way by the page's loader, the JSON API and the browser) and the bulk actions it sends, with the
// arithmetic of a price changed by a percentage. Isomorphic: the browser shows the new prices before the
// server answers, and the server, the authority, computes them the same way.
import { z } from "zod";
import { CATEGORIES, type Category, type ListingStatus } from "./catalogue";
import { CURRENCIES, MAX_PRICE_MAJOR, isCurrency } from "./listing-input";
import { idSchema } from "./ids";
import type { Outcome } from "./bench";

/** The states the inventory shows (a unit the desk removed is no longer the workshop's to sell). */
export const INVENTORY_STATES = ["draft", "held", "live", "reserved", "sold", "withdrawn"] as const;
export type InventoryState = (typeof INVENTORY_STATES)[number];

export const INVENTORY_SORTS = ["updated", "title", "reference", "price", "state", "handling"] as const;
export type InventorySort = (typeof INVENTORY_SORTS)[number];
export const SORT_LABELS: Record<InventorySort, string> = {
  updated: "Last saved",
  title: "Unit",
  reference: "Reference",
  price: "Price",
  state: "State",
  handling: "Handling",
};

export const INVENTORY_PAGE_SIZE = 50;
/** At most this many units in one bulk action (two pages of the table). */
export const MAX_BULK = 100;

const pick = <T extends string>(list: readonly T[]) => z.enum(list).optional().catch(undefined);

/** The table's state from URL parameters; anything unreadable falls back to the default (it is a view, not input to refuse). */
export const InventoryQuerySchema = z.object({
  state: pick(INVENTORY_STATES),
  category: pick(CATEGORIES),
  q: z
    .string()
    .trim()
    .max(80)
    .optional()
    .catch(undefined)
    .transform((s) => s || undefined),
  sort: pick(INVENTORY_SORTS).transform((s) => s ?? "updated"),
  dir: z.enum(["asc", "desc"]).optional().catch(undefined),
  page: z.coerce
    .number()
    .int()
    .min(1)
    .max(10_000)
    .optional()
    .catch(undefined)
    .transform((n) => n ?? 1),
});
export type InventoryQuery = z.output<typeof InventoryQuerySchema>;

/** Newest saves and highest prices first; words and references A to Z. */
export function defaultDir(sort: InventorySort): "asc" | "desc" {
  return sort === "updated" || sort === "price" ? "desc" : "asc";
}

export function readInventoryQuery(params: URLSearchParams): InventoryQuery {
  const raw = Object.fromEntries(
    ["state", "category", "q", "sort", "dir", "page"].flatMap((k) => (params.get(k) ? [[k, params.get(k)]] : [])),
  );
  return InventoryQuerySchema.parse(raw);
}

/** The canonical URL parameters of a query (defaults left out), e.g. for links and the API call. */
export function inventoryParams(q: Partial<InventoryQuery>): URLSearchParams {
  const p = new URLSearchParams();
  if (q.state) p.set("state", q.state);
  if (q.category) p.set("category", q.category);
  if (q.q) p.set("q", q.q);
  if (q.sort && q.sort !== "updated") p.set("sort", q.sort);
  if (q.dir && q.sort && q.dir !== defaultDir(q.sort)) p.set("dir", q.dir);
  if (q.page && q.page > 1) p.set("page", String(q.page));
  return p;
}

/** One unit as the table shows it. */
export interface InventoryRowView {
  id: string;
  reference: string | null;
  title: string;
  maker: string | null;
  model: string | null;
  category: Category;
  status: ListingStatus;
  heldReason: string | null;
  benchVerified: boolean;
  priceMinor: number | null;
  currency: string;
  handlingDays: number | null;
  updatedAt: string;
  coverUrl: string | null;
  counts: Record<Outcome, number> | null;
}

export interface InventoryPage {
  rows: InventoryRowView[];
  total: number;
  page: number;
  pageCount: number;
  /** Units per state, over the whole inventory (the filter's chips). */
  stateCounts: Record<InventoryState, number>;
}

// ---- bulk actions ----

const ids = z.array(idSchema("unit")).min(1, "Choose at least one unit.").max(MAX_BULK, `At most ${MAX_BULK} units at a time.`);
/** A percentage with at most two decimals, −90 % to +200 %, never 0. */
const percent = z
  .number("Give the change as a percentage, e.g. -10 or 5.")
  .min(-90, "A price can come down by at most 90 %.")
  .max(200, "A price can go up by at most 200 %.")
  .refine((p) => p !== 0, "A change of 0 % changes nothing.")
  .refine((p) => Math.abs(p * 100 - Math.round(p * 100)) < 1e-6, "Use at most two decimals.");

export const InventoryActionSchema = z.discriminatedUnion(
  "action",
  [
    z.strictObject({ action: z.literal("publish"), ids }),
    z.strictObject({ action: z.literal("withdraw"), ids }),
    z.strictObject({ action: z.literal("reprice"), ids, percent }),
    z.strictObject({
      action: z.literal("handling"),
      ids,
      handlingDays: z
        .int("Give the handling time in whole days.")
        .min(0, "Handling time is 0 to 30 days.")
        .max(30, "Handling time is 0 to 30 days."),
    }),
    z.strictObject({
      action: z.literal("price"),
      ids: z.array(idSchema("unit")).length(1, "A price is set on one unit at a time."),
      priceMinor: z.int("Give the price in minor units.").positive("A price must be above zero.").max(100_000_000),
    }),
  ],
  "Choose publish, withdraw, reprice, handling or price.",
);
export type InventoryAction = z.output<typeof InventoryActionSchema>;
export type InventoryActionName = InventoryAction["action"];

export const ACTION_LABELS: Record<Exclude<InventoryActionName, "price">, string> = {
  publish: "Publish",
  withdraw: "Withdraw",
  reprice: "Change price by %",
  handling: "Set handling time",
};

/** What happened to one unit. */
export interface UnitOutcome {
  id: string;
  /** Maker and model, so a report reads without the table. */
  title: string;
  ok: boolean;
  /** The unit's state after the action (or as it stayed). */
  status: ListingStatus;
  /** For a person: "live and bench-verified", "held: …", or why nothing changed. */
  message: string;
  priceMinor?: number | null;
  handlingDays?: number | null;
  benchVerified?: boolean;
}

export interface InventoryActionResult {
  action: InventoryActionName;
  outcomes: UnitOutcome[];
}

/** States whose price and handling time may change: not while a buyer holds it, nor once it is sold. */
export const EDITABLE_STATES: readonly ListingStatus[] = ["draft", "held", "live", "withdrawn"];
export const WITHDRAWABLE_STATES: readonly ListingStatus[] = ["held", "live"];
export const PUBLISHABLE_STATES: readonly ListingStatus[] = ["draft", "withdrawn"];

/**
 * A price changed by a percentage, in whole minor units, rounded half away from zero, in integers only:
 * 124 900 cents − 10 % = 112 410; 99 cents + 12.5 % = 111.375 → 111. Yen have no minor unit, so the result
 * is whole yen. Null when the result would be zero or above the most a listing may ask.
 */
export function applyPercent(minor: number, percentChange: number, currency: string): number | null {
  const basisPoints = Math.round(percentChange * 100);
  const scaled = minor * (10_000 + basisPoints); // exact: minor ≤ 1e8, factor ≤ 30 000
  const next = Math.floor((scaled + 5_000) / 10_000);
  const digits = isCurrency(currency) ? CURRENCIES[currency] : 2;
  if (next <= 0 || next > MAX_PRICE_MAJOR * 10 ** digits) return null;
  return next;
}
