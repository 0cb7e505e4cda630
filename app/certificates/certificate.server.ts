import { QueryTypes } from "sequelize";
import { sequelize } from "~/db.server";
import { env } from "~/env.server";
import { BenchSheet, Listing, User, Workshop } from "~/models/index.server";
import { BenchCertificate } from "~/models/bench-certificate.server";
import type { Capture } from "~/models/capture.server";
import { CATEGORY_LABELS, formatEra, listingTitle } from "@shared/catalogue";
import { checkBenchSheet } from "@shared/bench";
import { idSchema } from "@shared/ids";
import { benchView, keyFigureViews } from "~/listings/bench-view.server";
import { capturesForSheet } from "~/listings/captures.server";
import { plotsFor } from "~/listings/plots.server";
import { sellerCard } from "~/listings/sections.server";
import { canViewListing, type Viewer } from "~/listings/visibility";
import type { BenchView, KeyFigureView, PlotSet, SellerCard } from "~/listings/types";
import { sheetHash } from "./sheet-hash.server";

// Issuing a bench certificate: whoever may open a bench-verified listing may print its certificate
// (docs/decisions/0033). One certificate per listing and sheet version: printing again gives the same
// id and issue date; a changed sheet gets a new one, and the old one's page says it was superseded.

export const CertificateIdSchema = idSchema("certificate");
const ListingIdSchema = idSchema("listing");

export interface CertificateData {
  id: string;
  issuedAt: Date;
  confirmUrl: string;
  listing: { id: string; title: string; category: string; era: string | null };
  seller: SellerCard;
  keyFigures: KeyFigureView[];
  bench: BenchView;
  plots: PlotSet;
}

/** The confirm page's address, printed on the certificate and in its QR code. */
export function confirmUrl(id: string): string {
  return new URL(`/certificates/${id}`, env().appUrl).href;
}

/** The certificate of the listing's sheet as it is now, issued on first request; null where there is none to give. */
export async function certificateForListing(listingId: string, viewer: Viewer | null): Promise<CertificateData | null> {
  const id = ListingIdSchema.safeParse(listingId);
  if (!id.success) return null;
  const listing = await Listing.findByPk(id.data, {
    include: [
      { model: User, as: "seller", attributes: ["id", "displayName", "createdAt"] },
      {
        model: Workshop,
        as: "workshop",
        attributes: ["id", "name", "about", "town", "region", "country", "verificationStatus", "verifiedAt", "createdAt"],
      },
      { model: BenchSheet, as: "benchSheet" },
    ],
  });
  if (!listing || !canViewListing(listing.status, listing.sellerId, viewer)) return null;
  const row = listing.benchSheet;
  const sheet = row?.sheet;
  // The sheet must still earn bench-verified today, not only when it was published.
  if (!listing.benchVerified || !row || !sheet || !(row.verdict ?? checkBenchSheet(sheet)).benchVerified) return null;
  const certificate = await issue(listing.id, sheetHash(sheet));
  const captures = await capturesForSheet(sheet, listing.sellerId).catch(() => new Map<string, Capture>());
  return {
    id: certificate.id,
    issuedAt: certificate.issuedAt,
    confirmUrl: confirmUrl(certificate.id),
    listing: {
      id: listing.id,
      title: listingTitle(listing.maker, listing.model),
      category: CATEGORY_LABELS[listing.category].one,
      era: formatEra(listing.yearFrom, listing.yearTo),
    },
    seller: sellerCard(listing, listing.seller, listing.workshop),
    keyFigures: keyFigureViews(sheet),
    bench: benchView(row, sheet, captures),
    plots: await plotsFor(sheet, captures),
  };
}

/** The row for this listing and hash, made once (two simultaneous downloads get the same one). */
async function issue(listingId: string, hash: string): Promise<BenchCertificate> {
  await sequelize.query(
    `INSERT INTO bench_certificates (id, listing_id, sheet_hash) VALUES (gen_random_uuid(), :listingId, :hash)
     ON CONFLICT (listing_id, sheet_hash) DO NOTHING`,
    { replacements: { listingId, hash }, type: QueryTypes.INSERT },
  );
  const row = await BenchCertificate.findOne({ where: { listingId, sheetHash: hash }, rejectOnEmpty: true });
  // The sheet was changed and changed back: this version is current again.
  if (row.supersededAt) await row.update({ supersededAt: null });
  return row;
}
