import { sequelize } from "~/db.server";
import { RestorationEntry } from "~/models/index.server";
import { RestorationEntrySchema, type RestorationEntryView } from "@shared/restoration-form";
import { assertEditable, ownListing } from "./access.server";
import { ListingInputError, ListingNotFound } from "./errors.server";
import { isId } from "@shared/ids";

// The restoration log: dated entries on a listing the seller owns, oldest first.

export const MAX_ENTRIES = 100;

function parse(input: unknown) {
  const parsed = RestorationEntrySchema.safeParse(input);
  if (!parsed.success)
    throw new ListingInputError(parsed.error.issues.map((i) => ({ path: i.path.map(String).join("."), message: i.message })));
  return parsed.data;
}

export async function addRestorationEntry(listingId: string, sellerId: string, input: unknown): Promise<RestorationEntry> {
  const values = parse(input);
  return sequelize.transaction(async (transaction) => {
    const listing = await ownListing(listingId, sellerId, { transaction, lock: true });
    assertEditable(listing);
    const count = await RestorationEntry.count({ where: { listingId }, transaction });
    if (count >= MAX_ENTRIES)
      throw new ListingInputError([{ path: "form", message: `A log holds at most ${MAX_ENTRIES} entries; combine some.` }]);
    return RestorationEntry.create({ listingId, ...values }, { transaction });
  });
}

export async function updateRestorationEntry(
  listingId: string,
  sellerId: string,
  entryId: string,
  input: unknown,
): Promise<RestorationEntry> {
  const values = parse(input);
  return sequelize.transaction(async (transaction) => {
    const listing = await ownListing(listingId, sellerId, { transaction, lock: true });
    assertEditable(listing);
    const entry = isId(entryId) ? await RestorationEntry.findOne({ where: { id: entryId, listingId }, transaction }) : null;
    if (!entry) throw new ListingNotFound();
    return entry.update(values, { transaction });
  });
}

export async function deleteRestorationEntry(listingId: string, sellerId: string, entryId: string): Promise<void> {
  await sequelize.transaction(async (transaction) => {
    const listing = await ownListing(listingId, sellerId, { transaction, lock: true });
    assertEditable(listing);
    const removed = isId(entryId) ? await RestorationEntry.destroy({ where: { id: entryId, listingId }, transaction }) : 0;
    if (!removed) throw new ListingNotFound();
  });
}

export async function restorationLog(listingId: string): Promise<RestorationEntryView[]> {
  const rows = await RestorationEntry.findAll({
    where: { listingId },
    order: [
      ["doneOn", "ASC"],
      ["createdAt", "ASC"],
    ],
  });
  return rows.map((e) => ({
    id: e.id,
    doneOn: e.doneOn,
    work: e.work,
    parts: e.parts,
    technician: e.technician,
    readingsBefore: e.readingsBefore,
    readingsAfter: e.readingsAfter,
  }));
}
