import { data, redirect } from "react-router";
import { User } from "~/models/user.server";
import { getSession, SESSION_MAX_AGE_SECONDS } from "~/auth/session.server";
import { signInPath } from "~/auth/redirect";
import { normaliseRoles, ROLE_LABELS, type Role } from "~/auth/roles";
import { apiError } from "~/http/errors.server";
import { isId } from "@shared/ids";

// THE path for authentication and authorisation: every loader, action and API route that needs a
// signed-in account or a role goes through requireUser / requireRole here.

export interface SessionUser {
  id: string;
  email: string;
  displayName: string;
  roles: Role[];
  emailVerified: boolean;
}

// Root and route loaders of one request share the lookup.
const perRequest = new WeakMap<Request, Promise<SessionUser | null>>();

/** The signed-in account, or null. A cookie for a suspended account, or from before a password reset, counts as none. */
export function getUser(request: Request): Promise<SessionUser | null> {
  let pending = perRequest.get(request);
  if (!pending) {
    pending = loadUser(request);
    perRequest.set(request, pending);
  }
  return pending;
}

async function loadUser(request: Request): Promise<SessionUser | null> {
  const session = await getSession(request);
  const userId = session.get("userId");
  if (!isId(userId)) return null;
  // The cookie's own expiry is the browser's business; a copied cookie stops working here too.
  const signedInAt = Date.parse(session.get("signedInAt") ?? "");
  if (!(Date.now() - signedInAt < SESSION_MAX_AGE_SECONDS * 1000)) return null;
  const user = await User.findByPk(userId);
  if (!user || user.status !== "active" || user.sessionVersion !== session.get("sessionVersion")) return null;
  return {
    id: user.id,
    email: user.email,
    displayName: user.displayName,
    roles: normaliseRoles(user.roles),
    emailVerified: user.emailVerifiedAt !== null,
  };
}

export function isApiRequest(request: Request): boolean {
  return new URL(request.url).pathname.startsWith("/api/");
}

/**
 * The signed-in account, or a refusal: pages redirect to sign-in (and come back afterwards),
 * API routes get 401 JSON.
 */
export async function requireUser(request: Request, options: { redirectTo?: string } = {}): Promise<SessionUser> {
  const user = await getUser(request);
  if (user) return user;
  if (isApiRequest(request)) {
    throw apiError("unauthenticated", "Sign in to use this.");
  }
  const url = new URL(request.url);
  throw redirect(signInPath(options.redirectTo ?? `${url.pathname}${url.search}`));
}

export function hasRole(user: Pick<SessionUser, "roles"> | null, role: Role | readonly Role[]): boolean {
  if (!user) return false;
  const wanted = typeof role === "string" ? [role] : role;
  return wanted.some((r) => user.roles.includes(r));
}

/** The body of a 403 page; the root error boundary shows `message`. */
export interface ForbiddenData {
  message: string;
  roles: Role[];
}

/** Like requireUser, and the account must hold one of the roles: otherwise 403 (a page, or JSON for APIs). */
export async function requireRole(request: Request, role: Role | readonly Role[]): Promise<SessionUser> {
  const user = await requireUser(request);
  if (hasRole(user, role)) return user;
  const wanted = typeof role === "string" ? [role] : [...role];
  const names = wanted.map((r) => ROLE_LABELS[r].toLowerCase() + "s");
  if (isApiRequest(request)) {
    throw apiError("forbidden", `This needs the ${wanted.join(" or ")} role.`);
  }
  const message = `This page is for ${names.join(" and ")} only. Your account does not have that role.`;
  throw data<ForbiddenData>({ message, roles: wanted }, { status: 403, statusText: "Forbidden" });
}
