import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "~/db.server";
import { BenchSheet, Listing, RestorationEntry } from "~/models/index.server";
import type { SessionUser } from "~/auth/guards.server";
import { checkBenchSheet, type Verdict } from "@shared/bench";
import { publishChecklist, type ChecklistItem } from "@shared/publish-checklist";
import { assertEditable, ownListing } from "./access.server";
import { verdictUpdate } from "./bench.server";
import { ListingInputError, ListingStateError } from "./errors.server";
import { queueAlertMatching } from "~/alerts/matching.server";
import { COPIED_PHOTO_HELD_REASON, flagCopiedPhotos } from "~/photos/copied.server";
import { flagLowPrice } from "~/reputation/low-price.server";

// Publishing: everything a buyer needs is present, the bench runs on the stored sheet (never on what
// the browser showed), and the listing goes live — or, with an implausible outcome or a photo copied
// from another seller's listing, to the review desk as held, where a moderator clears it before the
// market shows it.

/** The held reason of a listing published again after a moderator asked for changes. */
export const RESUBMITTED_REASON = "Resubmitted after changes";

export type PhotoCounts = { ready: number; processing: number; failed: number };

export async function photoCounts(listingId: string, transaction?: Transaction): Promise<PhotoCounts> {
  const rows = await sequelize.query<{ status: keyof PhotoCounts; n: string }>(
    "SELECT status, count(*) AS n FROM listing_photos WHERE listing_id = :listingId GROUP BY status",
    { replacements: { listingId }, type: QueryTypes.SELECT, transaction },
  );
  const out: PhotoCounts = { ready: 0, processing: 0, failed: 0 };
  for (const r of rows) out[r.status] = Number(r.n);
  return out;
}

export async function checklistFor(
  listing: Listing,
  user: Pick<SessionUser, "emailVerified">,
  transaction?: Transaction,
): Promise<ChecklistItem[]> {
  // One after another: inside a transaction they share one connection.
  const sheetRow = await BenchSheet.findOne({ where: { listingId: listing.id }, transaction });
  const entries = await RestorationEntry.count({ where: { listingId: listing.id }, transaction });
  const photos = await photoCounts(listing.id, transaction);
  const readings = sheetRow?.sheet?.readings ?? [];
  return publishChecklist({
    listing,
    sheet: sheetRow ? { readings: readings.length, measured: readings.filter((r) => r.basis === "measured").length } : null,
    restorationEntries: entries,
    photos,
    emailVerified: user.emailVerified,
  });
}

export type PublishResult = { listing: Listing; verdict: Verdict | null };

export async function publishListing(listingId: string, user: SessionUser): Promise<PublishResult> {
  return sequelize.transaction(async (transaction) => {
    const listing = await ownListing(listingId, user.id, { transaction, lock: true });
    assertEditable(listing);
    if (listing.status === "live" || listing.status === "held")
      throw new ListingStateError(
        listing.status === "live" ? "This listing is already live." : "This listing is already waiting at the review desk.",
        "published",
      );
    const open = (await checklistFor(listing, user, transaction)).filter((c) => !c.ok);
    if (open.length)
      throw new ListingInputError(
        open.map((c) => ({ path: `${c.step}.${c.id}`, message: `${c.label}: ${c.hint}` })),
        "Some things are still missing.",
      );

    const row = await BenchSheet.findOne({ where: { listingId }, transaction, lock: transaction.LOCK.UPDATE });
    let verdict: Verdict | null = null;
    let sheet = null;
    if (row) {
      if (!row.sheet)
        throw new ListingInputError([
          { path: "bench.sheet", message: "The stored bench sheet no longer reads; open the bench sheet step and save it again." },
        ]);
      sheet = row.sheet;
      verdict = checkBenchSheet(sheet);
      await row.update({ verdict, checkedAt: new Date() }, { transaction });
    }
    const update = verdictUpdate(listing, sheet, verdict);
    // A moderator asked for changes: the edited listing goes back to the desk, not straight to the market.
    const resubmitted = listing.reviewNote ? RESUBMITTED_REASON : null;
    // The photo check runs after the bench: either may hold the unit, and the seller reads every reason.
    const copied = await flagCopiedPhotos(listing.id, user.id, transaction);
    const heldReason =
      [resubmitted, update.heldReason, copied.length ? COPIED_PHOTO_HELD_REASON : null].filter(Boolean).join(" · ") || null;
    const status = heldReason ? "held" : (update.status ?? "live");
    await listing.update({ ...update, status, heldReason, publishedAt: new Date() }, { transaction });
    // A held unit is matched when the desk clears it.
    if (status === "live") await queueAlertMatching(listing.id, transaction);
    // Far under what the same maker and model sold for: the desk takes a look (the unit stays as it is).
    await flagLowPrice(listing, transaction);
    return { listing, verdict };
  });
}
