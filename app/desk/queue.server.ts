import { Op, QueryTypes } from "sequelize";
import { sequelize } from "~/db.server";
import { CATEGORY_LABELS, listingTitle } from "@shared/catalogue";
import { DeskFlag, Listing, User, Workshop } from "~/models/index.server";
import { contestedOrders } from "~/buying/desk-queue.server";
import type { DeskSubject } from "./audit.server";
import { words } from "./flag-view.server";

// The review desk's one queue: everything that needs a human, oldest first so nothing waits longest,
// filterable by kind. Held listings and flags are read here; workshop applications and contested
// orders come from their own modules. Each item says who has taken it, if anyone.

export const QUEUE_LIMIT = 100;

export const DESK_KINDS = ["held_listing", "copied_photo", "low_price", "report", "workshop_application", "contested_order"] as const;
export type DeskKind = (typeof DESK_KINDS)[number];

export const DESK_KIND_LABELS: Record<DeskKind, string> = {
  held_listing: "Held listings",
  copied_photo: "Copied photos",
  low_price: "Low prices",
  report: "Reports",
  workshop_application: "Workshop applications",
  contested_order: "Contested orders",
};

export interface DeskItem {
  kind: DeskKind;
  subject: DeskSubject;
  title: string;
  summary: string;
  /** ISO time it has waited since. */
  since: string;
  href: string;
  takenBy: string | null;
}

/** An item and the subject its claim is kept under (a flag is worked on its listing's page). */
type Row = Omit<DeskItem, "takenBy"> & { claim: DeskSubject };

async function heldListings(limit: number): Promise<Row[]> {
  const rows = await Listing.findAll({
    where: { status: "held" },
    include: [
      { model: User, as: "seller", attributes: ["displayName"] },
      { model: Workshop, as: "workshop", attributes: ["name"] },
    ],
    order: [["updatedAt", "ASC"]],
    limit,
  });
  return rows.map((l) => {
    const seller = l.workshop?.name
      ? `${l.workshop.name} (${l.seller?.displayName ?? "unknown seller"})`
      : (l.seller?.displayName ?? "unknown seller");
    return {
      kind: "held_listing",
      subject: { type: "listing", id: l.id },
      claim: { type: "listing", id: l.id },
      title: listingTitle(l.maker, l.model),
      summary: `${CATEGORY_LABELS[l.category]?.one ?? l.category} · ${seller} · ${l.heldReason ?? "held"}`,
      since: l.updatedAt.toISOString(),
      href: `/desk/listings/${l.id}`,
    };
  });
}

async function flagRows(kind: "copied_photo" | "low_price" | "report", limit: number): Promise<Row[]> {
  const flags = await DeskFlag.findAll({
    where: { kind, resolvedAt: { [Op.is]: null } },
    include: [
      { model: Listing, as: "listing", attributes: ["id", "maker", "model"] },
      { model: User, as: "reporter", attributes: ["displayName"] },
    ],
    order: [["createdAt", "ASC"]],
    limit,
  });
  return flags.map((f) => {
    const onListing = !!f.listingId;
    const claim: DeskSubject = onListing ? { type: "listing", id: f.listingId! } : { type: "thread", id: f.threadId! };
    const by = f.reporter ? ` · reported by ${f.reporter.displayName}` : "";
    return {
      kind,
      subject: { type: "flag", id: f.id },
      claim,
      title: onListing ? listingTitle(f.listing?.maker, f.listing?.model) : "A message thread",
      summary: `${words(f.reason)}${f.note ? `: ${f.note.slice(0, 140)}` : ""}${by}`,
      since: f.createdAt.toISOString(),
      href: onListing ? `/desk/listings/${f.listingId}` : `/desk/threads/${f.threadId}`,
    };
  });
}

async function workshopApplications(limit: number): Promise<Row[]> {
  const rows = await Workshop.findAll({
    where: { verificationStatus: "applied" },
    include: [{ model: User, as: "owner", attributes: ["displayName"] }],
    order: [["createdAt", "ASC"]],
    limit,
  });
  return rows.map((w) => ({
    kind: "workshop_application",
    subject: { type: "workshop", id: w.id },
    claim: { type: "workshop", id: w.id },
    title: w.name,
    summary: [[w.town, w.region, w.country].filter(Boolean).join(", "), w.owner?.displayName].filter(Boolean).join(" · "),
    since: w.createdAt.toISOString(),
    href: `/desk/workshops/${w.id}`,
  }));
}

async function contested(limit: number): Promise<Row[]> {
  return (await contestedOrders(limit)).map((o) => ({
    kind: "contested_order",
    subject: { type: "order", id: o.id },
    claim: { type: "order", id: o.id },
    title: o.title,
    summary: `Order ${o.ref} · ${o.buyer} bought from ${o.seller} · ${o.reason}`,
    since: o.since,
    href: `/desk/orders/${o.id}`,
  }));
}

const SOURCES: Record<DeskKind, (limit: number) => Promise<Row[]>> = {
  held_listing: heldListings,
  copied_photo: (n) => flagRows("copied_photo", n),
  low_price: (n) => flagRows("low_price", n),
  report: (n) => flagRows("report", n),
  workshop_application: workshopApplications,
  contested_order: contested,
};

/** How many of each kind wait, one statement. */
export async function deskCounts(): Promise<Record<DeskKind, number>> {
  const [row] = await sequelize.query<Record<DeskKind, string>>(
    `SELECT
       (SELECT count(*) FROM listings WHERE status = 'held') AS held_listing,
       (SELECT count(*) FROM desk_flags WHERE kind = 'copied_photo' AND resolved_at IS NULL) AS copied_photo,
       (SELECT count(*) FROM desk_flags WHERE kind = 'low_price' AND resolved_at IS NULL) AS low_price,
       (SELECT count(*) FROM desk_flags WHERE kind = 'report' AND resolved_at IS NULL) AS report,
       (SELECT count(*) FROM workshops WHERE verification_status = 'applied') AS workshop_application,
       (SELECT count(*) FROM orders WHERE state = 'contested') AS contested_order`,
    { type: QueryTypes.SELECT },
  );
  return Object.fromEntries(DESK_KINDS.map((k) => [k, Number(row?.[k] ?? 0)])) as Record<DeskKind, number>;
}

/** Who holds each claim key now (unexpired claims only). */
async function holders(subjects: DeskSubject[], now: Date): Promise<Map<string, string>> {
  if (!subjects.length) return new Map();
  const rows = await sequelize.query<{ subject_type: string; subject_id: string; display_name: string }>(
    `SELECT c.subject_type, c.subject_id, u.display_name FROM desk_claims c JOIN users u ON u.id = c.moderator_id
     WHERE c.expires_at > :now AND c.subject_id IN (:ids)`,
    { replacements: { now, ids: [...new Set(subjects.map((s) => s.id))] }, type: QueryTypes.SELECT },
  );
  return new Map(rows.map((r) => [`${r.subject_type}:${r.subject_id}`, r.display_name]));
}

/** The queue, oldest first; `kind` narrows it to one kind. */
export async function deskQueue(options: { kind?: DeskKind | null; limit?: number; now?: Date } = {}) {
  const limit = options.limit ?? QUEUE_LIMIT;
  const kinds = options.kind ? [options.kind] : DESK_KINDS;
  const [lists, counts] = await Promise.all([Promise.all(kinds.map((k) => SOURCES[k](limit))), deskCounts()]);
  const rows = lists.flat().sort((a, b) => a.since.localeCompare(b.since));
  const taken = await holders(
    rows.map((r) => r.claim),
    options.now ?? new Date(),
  );
  const items: DeskItem[] = rows
    .slice(0, limit)
    .map(({ claim, ...r }) => ({ ...r, takenBy: taken.get(`${claim.type}:${claim.id}`) ?? null }));
  return { items, counts, total: DESK_KINDS.reduce((n, k) => n + counts[k], 0), kind: options.kind ?? null };
}
export type DeskQueue = Awaited<ReturnType<typeof deskQueue>>;
