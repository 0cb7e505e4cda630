import type { Route } from "./+types/inventory-csv";
import { requireUser } from "~/auth/guards.server";
import { inventoryExport } from "~/inventory/export.server";
import { readInventoryQuery } from "@shared/inventory";

// GET /sell/inventory.csv: the seller's units as a CSV in the import's layout, the table's filters and
// sort applied (every page). A file download; the byte-order mark lets spreadsheets read Ω and × right.
export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const { csv } = await inventoryExport(user.id, readInventoryQuery(new URL(request.url).searchParams));
  const day = new Date().toISOString().slice(0, 10);
  return new Response(`\uFEFF${csv}`, {
    headers: {
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": `attachment; filename="loadline-inventory-${day}.csv"`,
      "Cache-Control": "no-store",
    },
  });
}
