import { BenchSheet, Listing } from "~/models/index.server";
import { inventoryCsv, listingToRow, type InventoryRow } from "@shared/inventory-csv";
import type { InventoryQuery } from "@shared/inventory";
import { inventoryOrder, inventoryWhere } from "./query.server";

// The inventory as a CSV file in the import's layout (docs/inventory-csv.md): the units the table's
// filters select, in its order, every page. Read in batches so a large inventory never loads at once.

const BATCH = 500;
/** At most this many rows in one file; the filters narrow a larger inventory. */
export const MAX_EXPORT_ROWS = 20_000;

export async function inventoryExport(sellerId: string, q: InventoryQuery): Promise<{ csv: string; rows: number }> {
  const where = inventoryWhere(sellerId, q);
  const order = inventoryOrder(q);
  const rows: InventoryRow[] = [];
  for (let offset = 0; offset < MAX_EXPORT_ROWS; offset += BATCH) {
    const batch = await Listing.findAll({
      where,
      order,
      limit: BATCH,
      offset,
      include: [{ model: BenchSheet, as: "benchSheet", attributes: ["sheet"] }],
    });
    for (const l of batch)
      rows.push(
        listingToRow({
          reference: l.stockReference ?? null,
          category: l.category,
          maker: l.maker,
          model: l.model,
          yearFrom: l.yearFrom,
          yearTo: l.yearTo,
          cosmeticGrade: l.cosmeticGrade,
          serviceState: l.serviceState,
          conditionNote: l.conditionNote,
          priceMinor: l.priceMinor,
          currency: l.currency,
          handlingDays: l.handlingDays,
          mainsVoltageV: l.mainsVoltageV,
          weightG: l.weightG,
          country: l.country,
          sheet: l.benchSheet?.sheet ?? null,
        }),
      );
    if (batch.length < BATCH) break;
  }
  return { csv: inventoryCsv(rows), rows: rows.length };
}
