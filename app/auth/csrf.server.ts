import { data } from "react-router";
import { env } from "~/env.server";
import { refusal } from "~/http/errors.server";

// One rule for every state-changing request, page form or API: it must come from Loadline's own
// origin. Session cookies are SameSite=Lax, but "same site" includes another port or subdomain of the
// same host, and a no-cors form POST from there carries the cookie. Browsers say where a request comes
// from in Sec-Fetch-Site and Origin: anything but same-origin is refused. Requests with neither header
// (curl, older clients) pass; they carry no victim's cookie by accident. APP_URL's origin counts as
// ours too (behind a proxy the request URL may differ).

const SAFE_METHODS = new Set(["GET", "HEAD", "OPTIONS"]);

/** Why the request counts as cross-origin, or null when it is allowed. */
export function crossOriginReason(request: Request): string | null {
  if (SAFE_METHODS.has(request.method.toUpperCase())) return null;
  const site = request.headers.get("Sec-Fetch-Site");
  if (site === "cross-site" || site === "same-site")
    return `the browser says it came from a ${site === "cross-site" ? "different" : "neighbouring"} site`;
  const origin = request.headers.get("Origin");
  if (origin === null) return null;
  const ours = new Set([new URL(request.url).origin, new URL(env().appUrl).origin]);
  return ours.has(origin) ? null : `it came from ${origin === "null" ? "an opaque origin" : origin}`;
}

/** Refuses a cross-origin request: 403 `cross_origin` JSON under /api/, a 403 page elsewhere. */
export function assertSameOrigin(request: Request): void {
  const reason = crossOriginReason(request);
  if (!reason) return;
  if (new URL(request.url).pathname.startsWith("/api/")) {
    throw refusal(
      "cross_origin",
      `This request was refused because ${reason}; use Loadline's own pages or call the API without a browser.`,
    );
  }
  throw data({ message: "This form was sent from another site, so it was refused." }, { status: 403, statusText: "Forbidden" });
}
