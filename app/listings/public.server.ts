import { literal } from "sequelize";
import {
  CATEGORY_LABELS,
  COSMETIC_GRADE_TEXT,
  SERVICE_STATE_TEXT,
  formatEra,
  formatPrice,
  formatWeight,
  listingTitle,
} from "@shared/catalogue";
import { mediaUrl } from "~/catalogue/media-url";
import { signInPath } from "~/auth/redirect";
import { BenchSheet, Listing, ListingPhoto, RestorationEntry, User, Workshop } from "~/models/index.server";
import { benchSection } from "./bench-section.server";
import { countryName, restorationLog, sellerCard, shippingView } from "./sections.server";
import type { GalleryPhoto, ListingHead, ListingPageData, UnitDetails } from "./types";
import { canViewListing, isModerator, type Viewer } from "./visibility";
import { isWatching } from "./watch.server";
import { countryFromAcceptLanguage, parseZone, zoneFor } from "./zones";
import { idSchema } from "@shared/ids";

// The public listing page's data. Visibility first (a listing the viewer may not see is
// indistinguishable from one that does not exist), then everything the page shows, built field by
// field so the serial number, postcode and storage keys of originals never leave the server.

export const ListingIdSchema = idSchema("listing");

const SERIAL_ON_FILE = literal(`("Listing"."serial_number" IS NOT NULL AND btrim("Listing"."serial_number") <> '')`);

export interface PageRequest {
  id: string;
  viewer: Viewer | null;
  /** ?zone= from the URL, when the visitor picked a shipping zone. */
  zone?: string | null;
  acceptLanguage?: string | null;
}

export async function loadListingPage(req: PageRequest): Promise<ListingPageData | null> {
  const id = ListingIdSchema.safeParse(req.id);
  if (!id.success) return null;
  const listing = await Listing.findByPk(id.data, {
    // Whether a serial number is on file, asked without ever loading the number.
    attributes: { include: [[SERIAL_ON_FILE, "serialOnFile"]] },
    include: [
      { model: User, as: "seller", attributes: ["id", "displayName", "createdAt"] },
      {
        model: Workshop,
        as: "workshop",
        attributes: ["id", "name", "about", "town", "region", "country", "verificationStatus", "verifiedAt", "createdAt"],
      },
      // The sheet itself only when its section is not kept (bench-section.server.ts).
      { model: BenchSheet, as: "benchSheet", attributes: ["id", "updatedAt"] },
    ],
  });
  if (!listing) return null;
  // A watcher keeps reading a unit its seller withdrew: the watch notice links here.
  const watcherOfWithdrawn = async () => listing.status === "withdrawn" && !!req.viewer && (await isWatching(req.viewer.id, listing.id));
  if (!canViewListing(listing.status, listing.sellerId, req.viewer) && !(await watcherOfWithdrawn())) return null;
  const serialOnFile = listing.get("serialOnFile") === true;
  const [photos, entries, bench, watching] = await Promise.all([
    ListingPhoto.findAll({
      where: { listingId: listing.id, status: "ready" },
      attributes: ["id", "position", "isCover", "thumbKey", "listingKey", "zoomKey", "width", "height"],
      order: [["position", "ASC"]],
    }),
    RestorationEntry.findAll({ where: { listingId: listing.id } }),
    benchSection(listing.benchSheet, listing.sellerId),
    req.viewer ? isWatching(req.viewer.id, listing.id) : Promise.resolve(false),
  ]);

  const isSeller = req.viewer?.id === listing.sellerId;
  const moderator = isModerator(req.viewer);
  const guessed = countryFromAcceptLanguage(req.acceptLanguage);
  const zone = parseZone(req.zone) ?? zoneFor(listing.country, guessed);
  const title = listingTitle(listing.maker, listing.model);

  return {
    listing: head(listing, title, isSeller || moderator, serialOnFile),
    viewer: {
      signedIn: !!req.viewer,
      isSeller,
      isModerator: moderator,
      watching,
      canWatch: !!req.viewer && !isSeller && listing.status === "live",
      signInHref: signInPath(`/listings/${listing.id}`),
    },
    photos: gallery(photos, title),
    ...bench,
    restoration: restorationLog(entries),
    seller: sellerCard(listing, listing.seller, listing.workshop),
    shipping: shippingView(listing, zone, req.zone ? null : guessed ? countryName(guessed) : null),
  };
}

function head(listing: Listing, title: string, mayReadHeldReason: boolean, serialOnFile: boolean): ListingHead {
  const cosmetic = listing.cosmeticGrade;
  const service = listing.serviceState;
  return {
    id: listing.id,
    status: listing.status,
    title,
    maker: listing.maker,
    model: listing.model,
    category: listing.category,
    categoryLabel: CATEGORY_LABELS[listing.category].one,
    era: formatEra(listing.yearFrom, listing.yearTo),
    priceMinor: listing.priceMinor,
    currency: listing.currency,
    priceText: listing.priceMinor !== null ? formatPrice(listing.priceMinor, listing.currency) : null,
    offersWelcome: listing.offersWelcome,
    benchVerified: listing.benchVerified,
    publishedAt: listing.publishedAt ? listing.publishedAt.toISOString() : null,
    heldReason: mayReadHeldReason && listing.status === "held" ? listing.heldReason : null,
    condition: {
      cosmetic: cosmetic ? { code: cosmetic, ...COSMETIC_GRADE_TEXT[cosmetic] } : null,
      service: service ? { code: service, ...SERVICE_STATE_TEXT[service] } : null,
      note: listing.conditionNote,
    },
    unit: unitDetails(listing, serialOnFile),
    place: { town: listing.town, region: listing.region, country: listing.country, countryName: countryName(listing.country) },
  };
}

function unitDetails(l: Listing, serialOnFile: boolean): UnitDetails {
  const dims = [l.boxedLengthMm, l.boxedWidthMm, l.boxedHeightMm];
  const includes = [
    l.includesManual ? "Owner's manual" : null,
    l.includesRemote ? "Remote control" : null,
    l.includesOriginalPacking ? "Original packing" : null,
  ].filter((s): s is string => s !== null);
  return {
    mains: l.mainsVoltageV ? { voltageV: l.mainsVoltageV, frequencyHz: l.mainsFrequencyHz, switchable: l.mainsSwitchable } : null,
    weightG: l.weightG,
    weightText: l.weightG ? formatWeight(l.weightG) : null,
    boxedText: dims.every((d) => d) ? `${dims.map((d) => Math.round(d! / 10)).join(" × ")} cm boxed` : null,
    includes,
    serialOnFile,
    handlingDays: l.handlingDays,
  };
}

function gallery(photos: ListingPhoto[], title: string): GalleryPhoto[] {
  // The cover leads; the rest keep the seller's order.
  const ordered = [...photos].sort((a, b) => Number(b.isCover) - Number(a.isCover) || a.position - b.position);
  return ordered
    .filter((p) => p.thumbKey && p.listingKey && p.zoomKey)
    .map((p, i) => ({
      id: p.id,
      thumbUrl: mediaUrl(p.thumbKey!),
      listingUrl: mediaUrl(p.listingKey!),
      zoomUrl: mediaUrl(p.zoomKey!),
      width: p.width ?? 4,
      height: p.height ?? 3,
      alt: `${title}, photo ${i + 1} of ${ordered.length}`,
    }));
}
