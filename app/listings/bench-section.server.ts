import { Op } from "sequelize";
import { BenchSheet } from "~/models/index.server";
import { Capture } from "~/models/capture.server";
import { benchView, keyFigureViews } from "./bench-view.server";
import { captureIdsOf, capturesForSheet } from "./captures.server";
import { plotsFor } from "./plots.server";
import type { ListingPageData } from "./types";
import { isId } from "@shared/ids";

// A listing page's bench part (key figures, the sheet as checked, the plots) is built from the sheet,
// its verdict and the captures it names: the same for every visitor until one of them changes, and
// it costs more than the rest of the page's data (the sheet and verdict are some 40 kB of JSON read
// through their schemas each time, then turned into views). So it is kept per sheet version (every
// save moves the row's updatedAt) and per state of its captures (one may finish after the save).

export type BenchSection = Pick<ListingPageData, "keyFigures" | "bench" | "plots">;

/** Sections kept: a page's are some 100 kB of objects, and the popular pages are few. */
const SECTIONS_KEPT = 200;
const kept = new Map<string, { captureIds: string[]; captures: string; section: BenchSection }>();

const NO_SHEET: BenchSection = {
  keyFigures: [],
  bench: null,
  plots: { spectra: [], responses: [], squares: [], impedances: [], speedDrifts: [] },
};

/** The bench part of the page of a listing whose sheet row is `row` (null: no sheet yet). */
export async function benchSection(row: Pick<BenchSheet, "id" | "updatedAt"> | null | undefined, sellerId: string): Promise<BenchSection> {
  if (!row) return NO_SHEET;
  const hit = kept.get(versionOf(row));
  if (hit && (await capturesState(hit.captureIds, sellerId)) === hit.captures) return hit.section;
  const full = await BenchSheet.findByPk(row.id, { attributes: ["id", "sheet", "verdict", "checkedAt", "updatedAt"] });
  const sheet = full?.sheet ?? null;
  if (!full || !sheet) return NO_SHEET;
  const captures = await capturesForSheet(sheet, sellerId);
  const section: BenchSection = {
    keyFigures: keyFigureViews(sheet),
    bench: benchView(full, sheet, captures),
    plots: await plotsFor(sheet, captures),
  };
  const key = versionOf(full);
  kept.delete(key);
  if (kept.size >= SECTIONS_KEPT) kept.delete(kept.keys().next().value!);
  kept.set(key, { captureIds: captureIdsOf(sheet).filter(isId), captures: stateOf([...captures.values()]), section });
  return section;
}

const versionOf = (row: Pick<BenchSheet, "id" | "updatedAt">) => `${row.id}@${row.updatedAt.getTime()}`;

/** Which of the named captures are finished, and as of when: what capturesForSheet would find. */
async function capturesState(ids: string[], sellerId: string): Promise<string> {
  if (ids.length === 0) return "";
  const rows = await Capture.findAll({
    where: { id: { [Op.in]: ids }, ownerId: sellerId, status: "done" },
    attributes: ["id", "updatedAt"],
  });
  return stateOf(rows);
}

const stateOf = (captures: Pick<Capture, "id" | "updatedAt">[]) =>
  captures
    .map((c) => `${c.id}@${c.updatedAt.getTime()}`)
    .sort()
    .join(",");
