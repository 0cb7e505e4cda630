// A capture's analysis joining the sheet being edited: its readings (those the kind of unit uses)
// take the place of the first empty measured row, marked as from the capture; a capture already on
// the sheet is replaced, not doubled; its sweep joins the sweeps. The editor does this in the browser,
// the plain-form capture upload on the server.
import { CATEGORY_QUANTITIES } from "../bench/quantities";
import type { Reading, Sweep } from "../bench/schema";
import { readingToRow, type SheetFormState } from "./state";

export type CaptureResult = { id: string; fileName: string; readings: Reading[]; sweep?: Sweep };

export function foldCapture(s: SheetFormState, c: CaptureResult): SheetFormState {
  const allowed = CATEGORY_QUANTITIES[s.category];
  const kept = s.rows.filter((r) => r.capture?.captureId !== c.id);
  const added = c.readings.filter((r) => allowed.includes(r.quantity)).map((r, i) => readingToRow(r, `cap-${c.id}-${i}`));
  const firstBlank = kept.findIndex((r) => r.basis === "measured" && !r.capture && !r.value.trim());
  const at = firstBlank < 0 ? kept.length : firstBlank;
  const sweeps = c.sweep ? [...s.sweeps.filter((x) => x.captureId !== c.id), c.sweep] : s.sweeps;
  return { ...s, rows: [...kept.slice(0, at), ...added, ...kept.slice(at)], sweeps };
}
