import { createCookieSessionStorage, redirect } from "react-router";
import { env } from "~/env.server";

// Cookie sessions keep the app servers stateless. The cookie holds only who signed in and the
// account's session version at that moment; guards re-read the account on every request, so a
// password reset or a suspension (both bump the version) ends every open session.
export type SessionData = { userId: string; sessionVersion: number; signedInAt: string };
type FlashData = { notice: string };

export const SESSION_MAX_AGE_SECONDS = 14 * 24 * 60 * 60;

function createStorage() {
  const { secureCookies, sessionSecret } = env();
  return createCookieSessionStorage<SessionData, FlashData>({
    cookie: {
      // The __Host- prefix makes browsers refuse the cookie unless it is Secure, host-only and path=/.
      name: secureCookies ? "__Host-loadline_session" : "loadline_session",
      httpOnly: true,
      sameSite: "lax",
      secure: secureCookies,
      path: "/",
      maxAge: SESSION_MAX_AGE_SECONDS,
      secrets: [sessionSecret],
    },
  });
}

let storage: ReturnType<typeof createStorage> | undefined;
export function sessionStorage() {
  storage ??= createStorage();
  return storage;
}

export function getSession(request: Request) {
  return sessionStorage().getSession(request.headers.get("Cookie"));
}

/**
 * Signs an account in with a brand-new session sent on a redirect. Nothing is carried over from
 * the cookie the browser had: the fresh cookie of the same name replaces it whole.
 */
export async function startSession(
  account: { id: string; sessionVersion: number },
  redirectTo: string,
  options: { notice?: string; headers?: HeadersInit } = {},
): Promise<Response> {
  const fresh = await sessionStorage().getSession();
  fresh.set("userId", account.id);
  fresh.set("sessionVersion", account.sessionVersion);
  fresh.set("signedInAt", new Date().toISOString());
  if (options.notice) fresh.flash("notice", options.notice);
  const headers = new Headers(options.headers);
  headers.append("Set-Cookie", await sessionStorage().commitSession(fresh));
  return redirect(redirectTo, { headers });
}

/** Signs out: the cookie is expired and the browser is sent on. */
export async function endSession(request: Request, redirectTo = "/"): Promise<Response> {
  const session = await getSession(request);
  return redirect(redirectTo, { headers: { "Set-Cookie": await sessionStorage().destroySession(session) } });
}

/** A one-time message for the next page the browser shows (read it with takeNotice). */
export async function redirectWithNotice(request: Request, to: string, notice: string): Promise<Response> {
  const session = await getSession(request);
  session.flash("notice", notice);
  return redirect(to, { headers: { "Set-Cookie": await sessionStorage().commitSession(session) } });
}

/** Reads and clears the one-time message; send `headers` with the response. */
export async function takeNotice(request: Request): Promise<{ notice: string | null; headers: HeadersInit }> {
  const session = await getSession(request);
  const notice = session.get("notice") ?? null;
  if (!notice) return { notice: null, headers: {} };
  return { notice, headers: { "Set-Cookie": await sessionStorage().commitSession(session) } };
}
