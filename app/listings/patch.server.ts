import { z } from "zod";
import { sequelize } from "~/db.server";
import { ownListing } from "./access.server";
import { saveBenchSheet, type SheetSaveResult } from "./bench.server";
import { saveCondition, saveItem } from "./drafts.server";
import { ListingInputError } from "./errors.server";

// PATCH /api/v1/listings/:id — any of the item, condition and bench sheet at once, in one transaction:
// either everything in the body is saved or nothing is.

/** A full bench sheet (300 readings, long sweeps) with the item and condition fits well inside this. */
export const PATCH_MAX_BYTES = 600 * 1024;

const Envelope = z.strictObject({
  item: z.record(z.string(), z.unknown()).optional(),
  condition: z.record(z.string(), z.unknown()).optional(),
  benchSheet: z.record(z.string(), z.unknown()).optional(),
});

function prefixed<T>(prefix: string, work: () => Promise<T>): Promise<T> {
  return work().catch((e) => {
    if (e instanceof ListingInputError)
      throw new ListingInputError(
        e.issues.map((i) => ({ ...i, path: `${prefix}.${i.path}` })),
        e.message,
      );
    throw e;
  });
}

export async function patchListing(listingId: string, sellerId: string, body: unknown): Promise<{ bench: SheetSaveResult | null }> {
  const parsed = Envelope.safeParse(body);
  if (!parsed.success)
    throw new ListingInputError(
      parsed.error.issues.map((i) => ({
        path: i.path.map(String).join(".") || "body",
        message: i.code === "unrecognized_keys" ? `Unknown part: ${i.keys.join(", ")}. Send item, condition or benchSheet.` : i.message,
      })),
    );
  const { item, condition, benchSheet } = parsed.data;
  if (!item && !condition && !benchSheet)
    throw new ListingInputError([{ path: "body", message: "Send at least one of item, condition or benchSheet." }]);
  return sequelize.transaction(async (transaction) => {
    await ownListing(listingId, sellerId, { transaction, lock: true });
    if (item) await prefixed("item", () => saveItem(listingId, sellerId, item, { transaction }));
    if (condition) await prefixed("condition", () => saveCondition(listingId, sellerId, condition, { transaction }));
    const bench = benchSheet ? await prefixed("benchSheet", () => saveBenchSheet(listingId, sellerId, benchSheet, { transaction })) : null;
    return { bench };
  });
}
