import { Readable } from "node:stream";
import { WorkshopApplication } from "~/models/index.server";
import { refusal } from "~/http/errors.server";
import { getPrivateObject } from "~/services/private-storage.server";
import { systemClock, type Clock } from "~/orders/clock.server";
import { checkDocumentLink } from "./document-link.server";
import { DOCUMENT_TYPES, type DocumentType } from "./document.server";

/**
 * An application's document for the moderator the link was signed for. Answered inline (a PDF or an
 * image the browser shows), never cached, never sniffed as anything else; an image is sandboxed.
 */
export async function documentResponse(url: URL, applicationId: string, viewerId: string, clock: Clock = systemClock): Promise<Response> {
  checkDocumentLink(url, applicationId, viewerId, clock);
  const application = await WorkshopApplication.findByPk(applicationId, { attributes: ["id", "documentKey", "documentType"] });
  const stored = application ? await getPrivateObject(application.documentKey) : null;
  if (!application || !stored) throw refusal("not_found", "There is no such document.");
  const type = application.documentType as DocumentType; // checked by the table's constraint
  const headers = new Headers({
    "Content-Type": type,
    "Content-Disposition": `inline; filename="application-${application.id.slice(0, 8)}.${DOCUMENT_TYPES[type].ext}"`,
    "Cache-Control": "private, no-store",
    "X-Content-Type-Options": "nosniff",
    "Referrer-Policy": "no-referrer",
  });
  if (type !== "application/pdf") headers.set("Content-Security-Policy", "default-src 'none'; img-src 'self'; sandbox");
  if (stored.contentLength !== undefined) headers.set("Content-Length", String(stored.contentLength));
  return new Response(Readable.toWeb(stored.body) as ReadableStream, { status: 200, headers });
}
