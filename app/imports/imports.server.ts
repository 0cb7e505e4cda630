import { Op } from "sequelize";
import { z } from "zod";
import { sequelize } from "~/db.server";
import { BenchSheet, Listing, User, Workshop } from "~/models/index.server";
import { ListingImport } from "~/models/listing-import.server";
import { enqueue, QUEUES } from "~/services/jobs.server";
import { holdsRole, normaliseRoles } from "~/auth/roles";
import { refusal } from "~/http/errors.server";
import { checkedSheet } from "~/listings/bench.server";
import { parseBenchSheet } from "@shared/bench";
import { InventoryRowSchema, rowToDraft, type InventoryDraft } from "@shared/inventory-csv";
import { listingFacets } from "@shared/listing-facets";
import { isId } from "@shared/ids";
import { checkInventoryCsv, type CheckedRow, type CsvCheck } from "./check-csv";

// A workshop's CSV import: the file is checked whole before anything is written (check-csv.ts); a file
// without problems becomes an import row holding its rows, and the drafts are written in ONE
// transaction, so a file is imported whole or not at all. Small files are written at once, larger ones
// by the `listing-import` job while the page shows its progress. The rows leave the database when the
// import ends; the upload itself is never stored (docs/decisions/0032).

/** Files up to this many units are written within the request; larger ones go to the job. */
export const INLINE_ROWS = 25;
/** Rows written per statement; progress is reported after each batch. */
const BATCH = 250;

export type ImportView = {
  id: string;
  fileName: string;
  status: ListingImport["status"];
  totalRows: number;
  doneRows: number;
  error: string | null;
  createdAt: string;
  finishedAt: string | null;
};

export const importView = (i: ListingImport): ImportView => ({
  id: i.id,
  fileName: i.fileName,
  status: i.status,
  totalRows: i.totalRows,
  doneRows: i.doneRows,
  error: i.error ?? null,
  createdAt: i.createdAt.toISOString(),
  finishedAt: i.finishedAt ? i.finishedAt.toISOString() : null,
});

// Stored rows keep only their filled cells (most figure columns of a row are blank).
const StoredRowsSchema = z.array(z.object({ row: z.int().positive(), cells: InventoryRowSchema }));
const compact = (rows: CheckedRow[]) =>
  rows.map((r) => ({ row: r.row, cells: Object.fromEntries(Object.entries(r.cells).filter(([, v]) => v.trim() !== "")) }));

export type StartResult = { ok: false; check: Extract<CsvCheck, { ok: false }> } | { ok: true; import: ImportView };

/** Checks the file and, when every row reads, starts its import. One import at a time per workshop. */
export async function startImport(ownerId: string, fileName: string, text: string): Promise<StartResult> {
  const check = checkInventoryCsv(text);
  if (!check.ok) return { ok: false, check };
  const created = await sequelize.transaction(async (transaction) => {
    // One at a time, so a form sent twice does not import its units twice.
    await sequelize.query("SELECT pg_advisory_xact_lock(hashtext('listing_imports:' || $1))", { bind: [ownerId], transaction });
    const running = await ListingImport.count({ where: { ownerId, status: { [Op.in]: ["queued", "running"] } }, transaction });
    if (running) throw refusal("conflict", "An import of yours is still running; wait for it to finish before sending another file.");
    const row = await ListingImport.create(
      { ownerId, fileName: fileName.slice(0, 200) || "import.csv", totalRows: check.rows.length, rows: compact(check.rows) },
      { transaction },
    );
    if (check.rows.length > INLINE_ROWS) await enqueue(QUEUES.listingImport, { importId: row.id }, { transaction });
    return row;
  });
  if (check.rows.length <= INLINE_ROWS) await runImport(created.id);
  return { ok: true, import: importView((await ListingImport.findByPk(created.id)) ?? created) };
}

/** Something that stops an import and is the workshop's to hear about (not a fault of ours). */
class ImportStopped extends Error {}

/** Writes an import's drafts, all in one transaction; the job's handler. A finished import is left alone. */
export async function runImport(importId: string): Promise<void> {
  const imp = await ListingImport.findByPk(importId);
  if (!imp || imp.status === "done" || imp.status === "failed") return;
  await imp.update({ status: "running", doneRows: 0 });
  const stored = StoredRowsSchema.safeParse(imp.rows);
  try {
    if (!stored.success) throw new ImportStopped("The stored rows no longer read; send the file again.");
    await sequelize.transaction(async (transaction) => {
      const owner = await User.findByPk(imp.ownerId, { transaction });
      if (!owner || owner.status !== "active" || !holdsRole(normaliseRoles(owner.roles), "workshop"))
        throw new ImportStopped("The account is no longer a workshop's; nothing was imported.");
      const workshop = await Workshop.findOne({ where: { ownerId: owner.id }, transaction });
      const rows = stored.data;
      for (let start = 0; start < rows.length; start += BATCH) {
        const batch = rows.slice(start, start + BATCH).map((r) => {
          const read = rowToDraft(r.cells);
          // Checked before the import was made; a row that no longer reads means the layout changed meanwhile.
          if (!read.ok) throw new ImportStopped(`Row ${r.row} no longer reads (${read.problems[0]?.message}); send the file again.`);
          return draftRecords(read.draft, owner.id, workshop);
        });
        const listings = await Listing.bulkCreate(
          batch.map((b) => b.listing),
          { transaction, returning: ["id"] },
        );
        const sheets = batch.flatMap((b, i) => (b.sheet ? [{ listingId: listings[i].id, ...b.sheet }] : []));
        if (sheets.length) await BenchSheet.bulkCreate(sheets, { transaction });
        // Outside the transaction, so the page sees the progress while the drafts stay invisible until the end.
        await ListingImport.update({ doneRows: Math.min(start + BATCH, rows.length) }, { where: { id: imp.id } });
      }
      await ListingImport.update(
        { status: "done", rows: null, doneRows: rows.length, finishedAt: new Date() },
        { where: { id: imp.id }, transaction },
      );
    });
  } catch (error) {
    if (!(error instanceof ImportStopped)) console.error("[imports]", error);
    const message =
      error instanceof ImportStopped ? error.message : "Something went wrong on our side; nothing was imported. Send the file again.";
    await ListingImport.update(
      { status: "failed", rows: null, doneRows: 0, error: message, finishedAt: new Date() },
      { where: { id: imp.id } },
    );
  }
}

/** The listing and bench sheet one row becomes: a draft, located at the workshop unless the row says another country. */
function draftRecords(d: InventoryDraft, sellerId: string, workshop: Workshop | null) {
  const item = d.item;
  const atWorkshop = !!workshop && (!item.country || item.country === workshop.country);
  const parsed = d.benchSheet ? parseBenchSheet(d.benchSheet) : null;
  const sheet = parsed?.ok ? parsed.sheet : null;
  const listing = {
    sellerId,
    workshopId: workshop?.id ?? null,
    category: d.category,
    maker: item.maker ?? null,
    model: item.model ?? null,
    yearFrom: item.yearFrom ?? null,
    yearTo: item.yearTo ?? null,
    serialNumber: null,
    mainsVoltageV: item.mainsVoltageV ?? null,
    mainsFrequencyHz: null,
    weightG: item.weightG ?? null,
    boxedLengthMm: null,
    boxedWidthMm: null,
    boxedHeightMm: null,
    priceMinor: item.priceMinor ?? null,
    currency: item.currency ?? "EUR",
    country: item.country ?? workshop?.country ?? null,
    region: atWorkshop ? (workshop?.region ?? null) : null,
    town: atWorkshop ? (workshop?.town ?? null) : null,
    postcode: null,
    handlingDays: item.handlingDays ?? null,
    cosmeticGrade: d.condition.cosmeticGrade,
    serviceState: d.condition.serviceState,
    conditionNote: d.condition.conditionNote,
    publishedAt: null,
    heldReason: null,
    stockReference: d.reference,
    ...listingFacets(sheet),
  };
  // Stored with its verdict exactly as the bench step stores a typed sheet: the editor's bench and review
  // steps, its checklist, the inventory and the desk read the stored verdict and show none without one.
  return { listing, sheet: sheet ? checkedSheet(sheet) : null };
}

/** The job's entry: `{ importId }`. */
export async function listingImportJob(data: unknown): Promise<void> {
  const parsed = z.object({ importId: z.uuid() }).safeParse(data);
  if (!parsed.success) return;
  await runImport(parsed.data.importId);
}

/** One of the owner's imports; someone else's answers as a missing one. */
export async function ownImport(ownerId: string, id: unknown): Promise<ImportView> {
  const imp = isId(id) ? await ListingImport.findOne({ where: { id, ownerId } }) : null;
  if (!imp) throw refusal("not_found", "No import of yours has that address.");
  return importView(imp);
}

export async function recentImports(ownerId: string, limit = 5): Promise<ImportView[]> {
  const rows = await ListingImport.findAll({
    where: { ownerId },
    attributes: { exclude: ["rows"] },
    order: [["createdAt", "DESC"]],
    limit,
  });
  return rows.map(importView);
}
