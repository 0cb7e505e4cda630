import type { Route } from "./+types/certificate";
import { getUser } from "~/auth/guards.server";
import { certificateForListing } from "~/certificates/certificate.server";
import { certificatePdf } from "~/certificates/pdf/document.server";

// The bench certificate of a bench-verified unit, as a PDF: for whoever may open the listing's page
// (docs/decisions/0033). Anything else — a unit that is not bench-verified, one the viewer may not
// see, no such listing — is the same short 404.
export async function loader({ request, params }: Route.LoaderArgs) {
  const viewer = await getUser(request);
  const certificate = await certificateForListing(params.id, viewer);
  if (!certificate) {
    return new Response("There is no bench certificate for this listing.", {
      status: 404,
      headers: { "Content-Type": "text/plain; charset=utf-8", "Cache-Control": "no-store" },
    });
  }
  const pdf = await certificatePdf(certificate);
  return new Response(new Uint8Array(pdf), {
    headers: {
      "Content-Type": "application/pdf",
      "Content-Disposition": `attachment; filename="loadline-bench-certificate-${certificate.id.slice(0, 8)}.pdf"`,
      "Content-Length": String(pdf.length),
      // A held or withdrawn unit's certificate is its seller's: never from a shared cache.
      "Cache-Control": "private, no-store",
    },
  });
}
