import type { DeskFlag } from "~/models/desk-flag.server";
import { copiedPhotoPair } from "./copied-photo-pair.server";
import type { CopiedPhotoPairData } from "./ui/CopiedPhotoPair";
import { formatPrice } from "@shared/money";

// A flag as the desk's listing page shows it: what was found, by whom, and the evidence (a copied
// photo beside the one it copies; the sold-price index behind a low price; a report's reason and note).

export interface FlagView {
  id: string;
  kind: DeskFlag["kind"];
  heading: string;
  reason: string;
  note: string | null;
  reporter: string | null;
  at: string;
  /** copied_photo: this listing's photo and the other seller's, with the hash distance (null when one is gone). */
  pair: CopiedPhotoPairData | null;
  /** low_price and anything else: the details as label and value lines. */
  facts: { label: string; value: string }[];
}

const HEADINGS: Record<DeskFlag["kind"], string> = {
  copied_photo: "A photo copies another seller's",
  low_price: "Price far below the sold-price index",
  report: "Reported",
};

/** "not_as_described" → "Not as described". */
export function words(code: string): string {
  const s = code.replace(/_/g, " ").trim();
  return s.charAt(0).toUpperCase() + s.slice(1);
}

function factValue(key: string, value: unknown, currency: string | null): string {
  if (typeof value === "number" && /minor$/i.test(key) && currency) return formatPrice(value, currency);
  if (typeof value === "number" && /(share|ratio)$/i.test(key)) return `${Math.round(value * 100)} %`;
  if (value === null || value === undefined) return "—";
  if (typeof value === "object") return JSON.stringify(value);
  return typeof value === "string" || typeof value === "number" || typeof value === "boolean" ? String(value) : JSON.stringify(value);
}

export async function flagView(f: DeskFlag): Promise<FlagView> {
  const details = f.details ?? {};
  const pair = f.kind === "copied_photo" ? await copiedPhotoPair(details) : null;
  const currency = typeof details.currency === "string" ? details.currency : null;
  const facts =
    f.kind === "copied_photo"
      ? []
      : Object.entries(details)
          .filter(([k]) => k !== "currency")
          .map(([k, v]) => ({
            label: words(
              k
                .replace(/Minor$/, "")
                .replace(/([a-z])([A-Z])/g, "$1 $2")
                .toLowerCase(),
            ),
            value: factValue(k, v, currency),
          }));
  return {
    id: f.id,
    kind: f.kind,
    heading: HEADINGS[f.kind],
    reason: words(f.reason),
    note: f.note,
    reporter: f.reporter?.displayName ?? null,
    at: f.createdAt.toISOString(),
    pair,
    facts,
  };
}
