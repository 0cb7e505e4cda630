import { loadListingPage } from "./public.server";
import type { ListingPageData } from "./types";

// GET /api/v1/listings/:id for anyone who is not the owner: a live or sold unit as the public page
// shows it (the page's own data, so the two never disagree), without the viewer's state. Null for
// anything else. Never the serial number or the postcode (the page data carries neither).

export type PublicListing = Omit<ListingPageData, "viewer">;

export async function publicListing(id: string, zone: string | null = null): Promise<PublicListing | null> {
  const page = await loadListingPage({ id, viewer: null, zone });
  if (!page) return null;
  const { viewer: _viewer, ...rest } = page;
  return rest;
}
