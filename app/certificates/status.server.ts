import { BenchSheet, Listing, User, Workshop } from "~/models/index.server";
import { BenchCertificate } from "~/models/bench-certificate.server";
import { listingTitle } from "@shared/catalogue";
import { PUBLIC_STATUSES } from "~/listings/visibility";
import { CertificateIdSchema } from "./certificate.server";
import { sheetHash } from "./sheet-hash.server";

// What the QR code's page says about a certificate: open to anyone holding the paper. It compares the
// hash certified with the listing's bench sheet as it is now. Nothing private is in here: the title,
// who listed it, the dates, and a link to the listing while the public may open it.

export interface CertificateStatus {
  id: string;
  issuedAt: string;
  state: "matches" | "superseded";
  /** When the certified sheet first changed (or was removed); null while it matches. */
  supersededAt: string | null;
  listing: { id: string; title: string; publicPage: boolean; benchVerified: boolean };
  listedBy: string;
  /** The first 16 hex digits of the hash, as the certificate prints them. */
  fingerprint: string;
}

export async function certificateStatus(rawId: string): Promise<CertificateStatus | null> {
  const id = CertificateIdSchema.safeParse(rawId);
  if (!id.success) return null;
  const certificate = await BenchCertificate.findByPk(id.data);
  if (!certificate) return null;
  const listing = await Listing.findByPk(certificate.listingId, {
    include: [
      { model: User, as: "seller", attributes: ["id", "displayName"] },
      { model: Workshop, as: "workshop", attributes: ["id", "name"] },
      { model: BenchSheet, as: "benchSheet", attributes: ["id", "sheet", "updatedAt"] },
    ],
  });
  if (!listing) return null;
  const sheet = listing.benchSheet?.sheet ?? null;
  const matches = sheet !== null && sheetHash(sheet) === certificate.sheetHash;
  // The trigger's date; a sheet changed before the trigger existed falls back to its last save.
  const supersededAt = matches ? null : (certificate.supersededAt ?? listing.benchSheet?.updatedAt ?? certificate.issuedAt);
  return {
    id: certificate.id,
    issuedAt: certificate.issuedAt.toISOString(),
    state: matches ? "matches" : "superseded",
    supersededAt: supersededAt ? supersededAt.toISOString() : null,
    listing: {
      id: listing.id,
      title: listingTitle(listing.maker, listing.model),
      publicPage: PUBLIC_STATUSES.includes(listing.status),
      benchVerified: listing.benchVerified,
    },
    listedBy: listing.workshop?.name ?? listing.seller?.displayName ?? "A private seller",
    fingerprint: certificate.sheetHash.slice(0, 16),
  };
}
