import type { ListingStatus } from "@shared/catalogue";
import { holdsRole, type Role } from "~/auth/roles";

// Who may open a listing's page. Only live, reserved and sold units are public; a held unit is for its seller
// and the review desk; a draft is the seller's alone. Withdrawn and removed units stay readable by
// their seller and the desk (the record of what was said about a unit), never by the public.

export type ListingAudience = "public" | "seller" | "desk";

export interface Viewer {
  id: string;
  roles: readonly Role[];
}

// A reserved unit (held for one buyer's checkout or order) stays readable: it is still for sale until paid and released.
export const PUBLIC_STATUSES: readonly ListingStatus[] = ["live", "reserved", "sold"];

const AUDIENCES: Record<ListingStatus, readonly ListingAudience[]> = {
  live: ["public", "seller", "desk"],
  reserved: ["public", "seller", "desk"],
  sold: ["public", "seller", "desk"],
  held: ["seller", "desk"],
  withdrawn: ["seller", "desk"],
  removed: ["seller", "desk"],
  draft: ["seller"],
};

export function isModerator(viewer: Viewer | null): boolean {
  return !!viewer && holdsRole(viewer.roles, "moderator"); // admins included
}

/** Whether `viewer` (null: anonymous) may see a listing in `status` belonging to `sellerId`. */
export function canViewListing(status: ListingStatus, sellerId: string, viewer: Viewer | null): boolean {
  const allowed = AUDIENCES[status];
  if (!allowed) return false;
  if (allowed.includes("public")) return true;
  if (!viewer) return false;
  if (allowed.includes("seller") && viewer.id === sellerId) return true;
  return allowed.includes("desk") && isModerator(viewer);
}
