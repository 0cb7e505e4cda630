import { z } from "zod";
import { idSchema } from "@shared/ids";
import { LISTING_STATUS_LABELS, type ListingStatus } from "@shared/catalogue";
import { ListingPhoto, Listing, User } from "~/models/index.server";
import { mediaUrl } from "~/catalogue/media-url";
import type { CopiedPhotoPairData, PairSide } from "./ui/CopiedPhotoPair";

// The copied_photo flag's two photos for the desk's listing page (app/desk/ui/CopiedPhotoPair.tsx):
// the flagged listing's photo and the one it matches, each with its listing's title and seller.

const Details = z.object({ photoId: idSchema("photo"), matchesPhotoId: idSchema("photo"), distance: z.number().int().min(0).max(64) });

/** The pair behind a copied_photo flag's details, or null when the details do not read or a photo is gone. */
export async function copiedPhotoPair(details: unknown): Promise<CopiedPhotoPairData | null> {
  const parsed = Details.safeParse(details);
  if (!parsed.success) return null;
  const [photo, original] = await Promise.all([side(parsed.data.photoId), side(parsed.data.matchesPhotoId)]);
  if (!photo || !original) return null;
  return { photo, original, distance: parsed.data.distance };
}

async function side(photoId: string): Promise<PairSide | null> {
  const photo = await ListingPhoto.findByPk(photoId);
  const listing = photo
    ? await Listing.findByPk(photo.listingId, {
        attributes: ["id", "maker", "model", "status", "publishedAt", "sellerId"],
        include: [{ model: User, as: "seller", attributes: ["id", "displayName"] }],
      })
    : null;
  if (!photo || !listing) return null;
  const key = photo.listingKey ?? photo.thumbKey;
  return {
    photoId: photo.id,
    imageUrl: key ? mediaUrl(key) : null,
    listingId: listing.id,
    listingTitle: [listing.maker, listing.model].filter(Boolean).join(" ") || "Untitled unit",
    listingStatus: LISTING_STATUS_LABELS[listing.status as ListingStatus], // CreationOptional hides the union from indexing
    publishedAt: listing.publishedAt?.toISOString() ?? null,
    sellerId: listing.sellerId,
    sellerName: listing.seller?.displayName ?? "unknown seller",
  };
}
