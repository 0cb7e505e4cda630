import { data, redirect } from "react-router";
import { readSession } from "~/auth/session.server";
import { signInPath } from "~/auth/redirect";
import { holdsRole, normaliseRoles, ROLE_LABELS, type Role } from "~/auth/roles";
import { apiError } from "~/http/errors.server";

// THE path for authentication and authorisation: every loader, action and API route that needs a
// signed-in account or a role goes through requireUser / requireRole here.

export interface SessionUser {
  id: string;
  email: string;
  displayName: string;
  roles: Role[];
  emailVerified: boolean;
}

/** The account a request is signed in as, and the id of the session (row) it came with. */
export interface SignedIn {
  user: SessionUser;
  sessionId: string;
}

// Root and route loaders of one request share the lookup.
const perRequest = new WeakMap<Request, Promise<SignedIn | null>>();

function signedIn(request: Request): Promise<SignedIn | null> {
  let pending = perRequest.get(request);
  if (!pending) {
    pending = loadSignedIn(request);
    perRequest.set(request, pending);
  }
  return pending;
}

/** The signed-in account, or null. A revoked or expired session, or a suspended account, counts as none. */
export async function getUser(request: Request): Promise<SessionUser | null> {
  return (await signedIn(request))?.user ?? null;
}

async function loadSignedIn(request: Request): Promise<SignedIn | null> {
  const session = await readSession(request);
  if (!session || session.user.status !== "active") return null;
  const user = session.user;
  return {
    sessionId: session.id,
    user: {
      id: user.id,
      email: user.email,
      displayName: user.displayName,
      roles: normaliseRoles(user.roles),
      emailVerified: user.emailVerifiedAt !== null,
    },
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

/** Like requireUser, with the session the request came with (the account page lists and ends sessions). */
export async function requireSession(request: Request): Promise<SignedIn> {
  const user = await requireUser(request);
  const found = await signedIn(request);
  // requireUser read the same cached lookup, so this only guards against a broken cache.
  if (found?.user.id !== user.id) throw new Error("the session lookup changed within one request");
  return found;
}

/** Whether the account holds one of the roles, granted or included by another (an admin is a moderator). */
export function hasRole(user: Pick<SessionUser, "roles"> | null, role: Role | readonly Role[]): boolean {
  if (!user) return false;
  const wanted = typeof role === "string" ? [role] : role;
  return wanted.some((r) => holdsRole(user.roles, r));
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
