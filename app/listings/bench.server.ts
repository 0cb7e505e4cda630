import { Op, type Transaction } from "sequelize";
import { sequelize } from "~/db.server";
import { BenchSheet, Listing } from "~/models/index.server";
import { Capture } from "~/models/capture.server";
import {
  categoryNoun,
  checkBenchSheet,
  lowerLabel,
  parseBenchSheet,
  withArticle,
  type BenchSheet as Sheet,
  type Verdict,
} from "@shared/bench";
import { listingFacets } from "@shared/listing-facets";
import { CATEGORY_QUANTITIES } from "@shared/bench/quantities";
import type { Reading, Sweep } from "@shared/bench/schema";
import { sheetFingerprint } from "@shared/bench-form/state";
import { assertEditable, isPublished, ownListing } from "./access.server";
import { ListingInputError, type Issue } from "./errors.server";
import { settleSheetCaptures } from "./captures.server";
import { isId } from "@shared/ids";

// The bench sheet step. The server is the authority: it re-reads the sheet, puts the readings of each
// capture back exactly as the bench derived them (a typed figure cannot pass itself off as captured),
// checks it, stores sheet and verdict, and copies the filter figures to the listing. On a published
// listing a changed sheet loses bench-verified at once and gets it back only from this re-check.

export type SheetSaveResult = {
  listing: Listing;
  sheet: Sheet;
  verdict: Verdict;
  /** The sheet differs from the one stored before. */
  changed: boolean;
  /** On a published listing: whether it carried the mark before this save. */
  wasVerified: boolean;
};

/** Readings and sweeps of origin "capture" replaced by the stored analysis of captures this seller owns. */
async function fromOwnCaptures(sheet: Sheet, sellerId: string, transaction: Transaction): Promise<Sheet> {
  const issues: Issue[] = [];
  const ids = new Set<string>();
  sheet.readings.forEach((r, i) => {
    if (r.origin !== "capture") return;
    if (!r.captureId || !isId(r.captureId))
      issues.push({ path: `readings.${i}.captureId`, message: "A figure from a capture must name a capture you uploaded." });
    else ids.add(r.captureId);
  });
  (sheet.sweeps ?? []).forEach((s, i) => {
    if (s.origin !== "capture") return;
    if (!s.captureId || !isId(s.captureId))
      issues.push({ path: `sweeps.${i}.captureId`, message: "A sweep from a capture must name a capture you uploaded." });
    else ids.add(s.captureId);
  });
  if (issues.length) throw new ListingInputError(issues);
  if (!ids.size) return sheet;
  const captures = await Capture.findAll({ where: { id: { [Op.in]: [...ids] }, ownerId: sellerId }, transaction });
  const byId = new Map(captures.map((c) => [c.id, c]));
  sheet.readings.forEach((r, i) => {
    if (r.origin !== "capture") return;
    const c = byId.get(r.captureId!);
    if (!c) issues.push({ path: `readings.${i}.captureId`, message: "No capture of yours has that id." });
    else if (c.status !== "done")
      issues.push({ path: `readings.${i}.captureId`, message: `The capture ${c.fileName} is not analysed yet.` });
  });
  (sheet.sweeps ?? []).forEach((sw, i) => {
    if (sw.origin !== "capture") return;
    const c = byId.get(sw.captureId!);
    if (!c) issues.push({ path: `sweeps.${i}.captureId`, message: "No capture of yours has that id." });
    else if (c.status !== "done" || !c.sweep)
      issues.push({ path: `sweeps.${i}.captureId`, message: `The capture ${c.fileName} holds no analysed sweep.` });
  });
  if (issues.length) throw new ListingInputError(issues);
  const allowed = new Set<string>(CATEGORY_QUANTITIES[sheet.category]);
  const readings: Reading[] = [];
  const placed = new Set<string>();
  for (const r of sheet.readings) {
    if (r.origin !== "capture") readings.push(r);
    else if (!placed.has(r.captureId!)) {
      placed.add(r.captureId!);
      // The capture's own readings, where the seller's first one stood; quantities this kind of unit does not have are left out.
      for (const cr of byId.get(r.captureId!)?.readings ?? []) if (allowed.has(cr.quantity)) readings.push(cr);
    }
  }
  const sweeps: Sweep[] = [];
  for (const s of sheet.sweeps ?? []) {
    if (s.origin !== "capture") sweeps.push(s);
    else {
      const stored = byId.get(s.captureId!)?.sweep;
      if (stored && !placed.has(`sweep:${s.captureId}`)) {
        placed.add(`sweep:${s.captureId}`);
        sweeps.push(stored);
      }
    }
  }
  return { ...sheet, readings, sweeps };
}

/** The held reason's opening for a unit the bench found unsafe to connect; the desk filters on it. */
export const UNSAFE_HELD_PREFIX = "Unsafe to connect";

/** Why a sheet goes to the review desk instead of the market, or null. A reading that makes the unit unsafe comes first. */
export function heldReasonFor(verdict: Verdict): string | null {
  const hazards = verdict.hazards ?? [];
  if (hazards.length) {
    const more = hazards.length > 1 ? ` (and ${hazards.length - 1} more)` : "";
    return `${UNSAFE_HELD_PREFIX}: ${lowerLabel(hazards[0].title)} — ${hazards[0].detail}${more}`.slice(0, 1000);
  }
  const implausible = verdict.results.filter((r) => r.outcome === "implausible");
  if (!implausible.length) return null;
  const first = implausible[0];
  const more = implausible.length > 1 ? ` (and ${implausible.length - 1} more)` : "";
  return `Bench check: ${first.title.toLowerCase()} — implausible. ${first.detail}${more}`.slice(0, 1000);
}

/** Apply a fresh verdict to a published listing: the mark, the facets, and the desk for implausible sheets. */
export function verdictUpdate(listing: Listing, sheet: Sheet | null, verdict: Verdict | null) {
  const reason = verdict ? heldReasonFor(verdict) : null;
  const update: Partial<Listing> = { ...listingFacets(sheet), benchVerified: !!verdict?.benchVerified && !reason };
  if (reason) {
    update.status = "held";
    update.heldReason = reason;
  }
  return update;
}

/** A sheet as the bench step stores it: with the bench's verdict and when it was checked. The CSV import stores its sheets through this too. */
export function checkedSheet(sheet: Sheet): { sheet: Sheet; verdict: Verdict; checkedAt: Date } {
  return { sheet, verdict: checkBenchSheet(sheet), checkedAt: new Date() };
}

export async function saveBenchSheet(
  listingId: string,
  sellerId: string,
  input: unknown,
  opts: { transaction?: Transaction } = {},
): Promise<SheetSaveResult> {
  const parsed = parseBenchSheet(input);
  if (!parsed.ok) throw new ListingInputError(parsed.issues);
  const run = async (transaction: Transaction): Promise<SheetSaveResult> => {
    const listing = await ownListing(listingId, sellerId, { transaction, lock: true });
    assertEditable(listing);
    if (parsed.sheet.category !== listing.category)
      throw new ListingInputError([
        { path: "category", message: `This listing is for ${withArticle(categoryNoun(listing.category))}; the sheet must be too.` },
      ]);
    const merged = await fromOwnCaptures(parsed.sheet, sellerId, transaction);
    const again = parseBenchSheet(merged);
    if (!again.ok) throw new ListingInputError(again.issues);
    const sheet = again.sheet;
    const stored = await BenchSheet.findOne({ where: { listingId }, transaction, lock: transaction.LOCK.UPDATE });
    const changed = sheetFingerprint(stored?.sheet) !== sheetFingerprint(sheet);
    const wasVerified = listing.benchVerified;
    if (changed && isPublished(listing) && listing.benchVerified) {
      // The mark belongs to the sheet that was checked; a different sheet has none until the check below.
      await listing.update({ benchVerified: false }, { transaction });
    }
    // Captures it names are tied to this listing; one it no longer names goes, with its file, by a job.
    await settleSheetCaptures(listingId, sellerId, stored?.sheet, sheet, transaction);
    const record = checkedSheet(sheet);
    const { verdict } = record;
    if (stored) await stored.update(record, { transaction });
    else await BenchSheet.create({ listingId, ...record }, { transaction });
    if (isPublished(listing)) await listing.update(verdictUpdate(listing, sheet, verdict), { transaction });
    else await listing.update(listingFacets(sheet), { transaction });
    return { listing, sheet, verdict, changed, wasVerified };
  };
  return opts.transaction ? run(opts.transaction) : sequelize.transaction(run);
}

/** The stored sheet and verdict of a listing the caller already owns. A sheet that no longer reads is null. */
export async function storedSheet(
  listingId: string,
  transaction?: Transaction,
): Promise<{ sheet: Sheet | null; verdict: Verdict | null; checkedAt: Date | null }> {
  const row = await BenchSheet.findOne({ where: { listingId }, transaction });
  if (!row) return { sheet: null, verdict: null, checkedAt: null };
  return { sheet: row.sheet, verdict: row.verdict, checkedAt: row.checkedAt };
}
