import { CATEGORY_LABELS } from "@shared/catalogue";
import { Listing, Order, User, Workshop } from "~/models/index.server";
import { contestedOrders, type ContestedOrderItem } from "~/buying/desk-queue.server";

// The review desk's queue: listings held for review, workshops waiting to be verified and contested
// orders, oldest first so nothing waits longest. (Acting on them arrives with the moderation work.)

export const QUEUE_LIMIT = 100;

export interface HeldListingItem {
  id: string;
  title: string;
  category: string;
  reason: string;
  seller: string;
  workshop: string | null;
  since: string;
}

export interface WorkshopApplicationItem {
  id: string;
  name: string;
  place: string;
  owner: string;
  ownerEmail: string;
  since: string;
}

export type { ContestedOrderItem };

export async function reviewQueue() {
  const [held, heldCount, applications, applicationCount, contested, contestedCount] = await Promise.all([
    Listing.findAll({
      where: { status: "held" },
      include: [
        { model: User, as: "seller", attributes: ["displayName"] },
        { model: Workshop, as: "workshop", attributes: ["name"] },
      ],
      order: [["updatedAt", "ASC"]],
      limit: QUEUE_LIMIT,
    }),
    Listing.count({ where: { status: "held" } }),
    Workshop.findAll({
      where: { verificationStatus: "applied" },
      include: [{ model: User, as: "owner", attributes: ["displayName", "email"] }],
      order: [["createdAt", "ASC"]],
      limit: QUEUE_LIMIT,
    }),
    Workshop.count({ where: { verificationStatus: "applied" } }),
    contestedOrders(QUEUE_LIMIT),
    Order.count({ where: { state: "contested" } }),
  ]);

  return {
    heldListings: held.map((l): HeldListingItem => ({
      id: l.id,
      title: [l.maker, l.model].filter(Boolean).join(" ") || "Untitled unit",
      category: CATEGORY_LABELS[l.category]?.one ?? l.category,
      reason: l.heldReason ?? "",
      seller: l.seller?.displayName ?? "unknown seller",
      workshop: l.workshop?.name ?? null,
      since: l.updatedAt.toISOString(),
    })),
    heldCount,
    workshopApplications: applications.map((w): WorkshopApplicationItem => ({
      id: w.id,
      name: w.name,
      place: [w.town, w.region, w.country].filter(Boolean).join(", "),
      owner: w.owner?.displayName ?? "unknown",
      ownerEmail: w.owner?.email ?? "",
      since: w.createdAt.toISOString(),
    })),
    applicationCount,
    contestedOrders: contested,
    contestedCount,
  };
}
