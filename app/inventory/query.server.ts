import { Op, QueryTypes, type Order, type WhereOptions } from "sequelize";
import { sequelize } from "~/db.server";
import { BenchSheet, Listing, ListingPhoto } from "~/models/index.server";
import { mediaUrl } from "~/catalogue/media-url";
import { listingTitle } from "@shared/catalogue";
import {
  INVENTORY_PAGE_SIZE,
  INVENTORY_STATES,
  defaultDir,
  type InventoryPage,
  type InventoryQuery,
  type InventoryRowView,
  type InventoryState,
} from "@shared/inventory";

// The workshop's inventory, one page at a time: its own units only (the seller id is the session's,
// never the request's), filtered by state, category and text, sorted on the server so a page is the
// same whatever the browser has loaded. Read by the /sell loader and by GET /api/v1/inventory.

/** Listing columns the text filter looks in: the stock number, maker and model. */
const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);

export function inventoryWhere(sellerId: string, q: Pick<InventoryQuery, "state" | "category" | "q">): WhereOptions {
  const where: Record<string | symbol, unknown> = { sellerId, status: q.state ?? { [Op.in]: [...INVENTORY_STATES] } };
  if (q.category) where.category = q.category;
  if (q.q) {
    const like = `%${escapeLike(q.q)}%`;
    where[Op.or] = [{ stockReference: { [Op.iLike]: like } }, { maker: { [Op.iLike]: like } }, { model: { [Op.iLike]: like } }];
  }
  return where;
}

export function inventoryOrder(q: Pick<InventoryQuery, "sort" | "dir">): Order {
  const dir = (q.dir ?? defaultDir(q.sort)).toUpperCase() as "ASC" | "DESC"; // one of two literals
  const nulls = (col: string): [string, string] => [col, `${dir} NULLS LAST`];
  const keys: Record<InventoryQuery["sort"], [string, string][]> = {
    updated: [["updatedAt", dir]],
    title: [nulls("maker"), nulls("model")],
    reference: [nulls("stockReference")],
    // Across currencies by the euro equivalent the market sorts by (kept by a trigger).
    price: [nulls("priceEurMinor")],
    state: [["status", dir]],
    handling: [nulls("handlingDays")],
  };
  // The id last: equal keys keep one order from page to page.
  return [...keys[q.sort], ["id", "ASC"]];
}

export async function inventoryPage(sellerId: string, q: InventoryQuery): Promise<InventoryPage> {
  const where = inventoryWhere(sellerId, q);
  const total = await Listing.count({ where });
  const pageCount = Math.max(1, Math.ceil(total / INVENTORY_PAGE_SIZE));
  const page = Math.min(q.page, pageCount);
  const rows = await Listing.findAll({
    where,
    include: [{ model: BenchSheet, as: "benchSheet", attributes: ["verdict"] }],
    order: inventoryOrder(q),
    limit: INVENTORY_PAGE_SIZE,
    offset: (page - 1) * INVENTORY_PAGE_SIZE,
  });
  return { rows: await toRows(rows), total, page, pageCount, stateCounts: await stateCounts(sellerId) };
}

async function stateCounts(sellerId: string): Promise<Record<InventoryState, number>> {
  const counted = await sequelize.query<{ status: InventoryState; n: string }>(
    "SELECT status, count(*) AS n FROM listings WHERE seller_id = :sellerId AND status IN (:states) GROUP BY status",
    { replacements: { sellerId, states: [...INVENTORY_STATES] }, type: QueryTypes.SELECT },
  );
  const out = Object.fromEntries(INVENTORY_STATES.map((s) => [s, 0])) as Record<InventoryState, number>; // filled from a fixed list
  for (const r of counted) out[r.status] = Number(r.n);
  return out;
}

export async function toRows(rows: Listing[]): Promise<InventoryRowView[]> {
  const covers = rows.length
    ? await ListingPhoto.findAll({
        where: { listingId: rows.map((r) => r.id), status: "ready" },
        attributes: ["listingId", "thumbKey", "isCover", "position"],
        order: [["position", "ASC"]],
      })
    : [];
  const coverOf = new Map<string, string>();
  for (const p of covers) if (p.thumbKey && (p.isCover || !coverOf.has(p.listingId))) coverOf.set(p.listingId, mediaUrl(p.thumbKey));
  return rows.map((l) => ({
    id: l.id,
    reference: l.stockReference ?? null,
    title: listingTitle(l.maker, l.model),
    maker: l.maker,
    model: l.model,
    category: l.category,
    status: l.status,
    heldReason: l.heldReason,
    benchVerified: l.benchVerified,
    priceMinor: l.priceMinor,
    currency: l.currency,
    handlingDays: l.handlingDays,
    updatedAt: l.updatedAt.toISOString(),
    coverUrl: coverOf.get(l.id) ?? null,
    counts: l.benchSheet?.verdict?.counts ?? null,
  }));
}
