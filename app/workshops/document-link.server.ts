import { createHmac, timingSafeEqual } from "node:crypto";
import { env } from "~/env.server";
import { refusal } from "~/http/errors.server";
import { systemClock, type Clock } from "~/orders/clock.server";
import { DOCUMENT_LINK_MINUTES } from "./document-link";

// Short-lived signed links to an application's document (docs/decisions/0022). The link names the
// application and when it stops working; its signature also covers the moderator it was made for, so
// a link copied out of one moderator's browser does nothing in anyone else's session. Checked against
// an injectable clock, so tests move time instead of waiting.

export const DOCUMENT_LINK_SECONDS = DOCUMENT_LINK_MINUTES * 60;

function signature(secret: string, applicationId: string, viewerId: string, expires: number): Buffer {
  return createHmac("sha256", secret).update(`workshop-document\n${applicationId}\n${viewerId}\n${expires}`).digest();
}

export function documentPath(applicationId: string): string {
  return `/desk/documents/${applicationId}`;
}

/** A link for `viewerId` that works until DOCUMENT_LINK_SECONDS from the clock's now. */
export function signDocumentLink(applicationId: string, viewerId: string, clock: Clock = systemClock): { href: string; expires: Date } {
  const expires = Math.floor(clock.now().getTime() / 1000) + DOCUMENT_LINK_SECONDS;
  const sig = signature(env().sessionSecrets[0], applicationId, viewerId, expires).toString("base64url");
  return { href: `${documentPath(applicationId)}?expires=${expires}&sig=${sig}`, expires: new Date(expires * 1000) };
}

/**
 * Throws unless `url` carries a signature made for this application and viewer (with any of the
 * session secrets, so a rotation keeps fresh links working) and its time has not passed.
 */
export function checkDocumentLink(url: URL, applicationId: string, viewerId: string, clock: Clock = systemClock): void {
  const expiresText = url.searchParams.get("expires") ?? "";
  const sigText = url.searchParams.get("sig") ?? "";
  const expires = /^\d{1,12}$/.test(expiresText) ? Number(expiresText) : NaN;
  const given = Buffer.from(sigText, "base64url");
  const genuine =
    Number.isFinite(expires) &&
    given.length === 32 &&
    env().sessionSecrets.some((secret) => timingSafeEqual(given, signature(secret, applicationId, viewerId, expires)));
  // A forged or mangled link says no more than a missing document would.
  if (!genuine) throw refusal("not_found", "There is no such document.");
  if (clock.now().getTime() >= expires * 1000)
    throw refusal("link_expired", "This link to the document has expired. Open the application on the desk for a fresh one.");
}
