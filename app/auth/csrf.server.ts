import { data } from "react-router";
import { env } from "~/env.server";

// Session cookies are SameSite=Lax, so another site's form cannot act as a signed-in user. It could
// still post to the forms that *create* a session (sign-in, confirm, sign-out) and switch the
// browser to an account of the attacker's choosing; browsers send Origin on every POST, so a
// foreign one is refused. React Router makes a similar check before any action runs; this one keeps
// the sign-in family safe whatever the server configuration, and also accepts APP_URL's origin.
export function assertSameOrigin(request: Request): void {
  if (request.method === "GET" || request.method === "HEAD") return;
  const origin = request.headers.get("Origin");
  if (origin === null) return; // older clients and non-browser tools send none
  const allowed = new Set([new URL(request.url).origin, new URL(env().appUrl).origin]);
  if (!allowed.has(origin)) {
    throw data({ message: "This form was sent from another site, so it was refused." }, { status: 403, statusText: "Forbidden" });
  }
}
