import { Listing } from "~/models/index.server";
import { certificateForListing } from "~/certificates/certificate.server";

// A bench-verified demo unit and its certificate, for the suites that probe every route: the matrix
// needs one certificate that exists. Issuing is idempotent per sheet, so every run gets the same one.
export async function certifiedDemoUnit(): Promise<{ listingId: string; certificateId: string }> {
  const units = await Listing.findAll({ where: { status: "live", benchVerified: true }, order: [["id", "ASC"]], limit: 20 });
  for (const unit of units) {
    const certificate = await certificateForListing(unit.id, null);
    if (certificate) return { listingId: unit.id, certificateId: certificate.id };
  }
  throw new Error("The demo scenario has no live bench-verified unit: is the seed loaded?");
}
