import { isOneOf } from "@shared/one-of";
import { CONTEST_REASONS, CONTEST_REASON_LABELS } from "~/orders/contest-words";
import type { OrderViewer } from "./order-view";

// The provider's ids (pi_…, tr_…, re_…, evt_…) are for the desk; buyers and sellers read the words.
const PROVIDER_REF = /\s*\((?:pi|ch|tr|re|evt|cs)_[A-Za-z0-9]+\)|^Payment (?:pi|ch)_[A-Za-z0-9]+.*$/g;

export function eventNote(e: { note: string | null; toState: string }, viewer: OrderViewer): string | null {
  if (!e.note) return null;
  if (e.toState === "contested" && isOneOf(CONTEST_REASONS, e.note)) return CONTEST_REASON_LABELS[e.note];
  if (viewer === "moderator") return e.note;
  return e.note.replace(PROVIDER_REF, "").trim() || null;
}
