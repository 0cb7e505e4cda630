import { createCookieSessionStorage, redirect } from "react-router";
import { env } from "~/env.server";
import {
  clientInfo,
  createSessionRecord,
  findLiveSession,
  revokeSessionToken,
  SESSION_LIFETIME_MS,
  touchSession,
  type ClientInfo,
  type LiveSession,
} from "~/auth/session-store.server";

// The session cookie. Signed, and it carries no account id: only the random token of a row in the
// sessions table (session-store.server.ts), which is what makes a session end when it is revoked.
// One-time notices ride in the same cookie, so they work for visitors who are not signed in too.
type CookieData = { sid: string };
type FlashData = { notice: string };

function createStorage() {
  const { secureCookies, sessionSecrets } = env();
  return createCookieSessionStorage<CookieData, FlashData>({
    cookie: {
      // The __Host- prefix makes browsers refuse the cookie unless it is Secure, host-only and path=/.
      name: secureCookies ? "__Host-loadline_session" : "loadline_session",
      httpOnly: true,
      sameSite: "lax",
      secure: secureCookies,
      path: "/",
      maxAge: SESSION_LIFETIME_MS / 1000,
      // The first signs, all verify: rotation without signing everyone out at once.
      secrets: sessionSecrets,
    },
  });
}

let storage: ReturnType<typeof createStorage> | undefined;
function sessionStorage() {
  storage ??= createStorage();
  return storage;
}

function getSession(request: Request) {
  return sessionStorage().getSession(request.headers.get("Cookie"));
}

/** The live session this request's cookie points at (its account may be suspended: the guards decide). */
export async function readSession(request: Request): Promise<LiveSession | null> {
  const token = (await getSession(request)).get("sid");
  if (!token) return null;
  const record = await findLiveSession(token);
  if (record) await touchSession(record, clientInfo(request));
  return record;
}

/**
 * Opens a session row for the account and returns the Set-Cookie value that carries it. The one
 * way a session begins: sign-in routes through startSession, test helpers directly.
 */
export async function openSession(userId: string, client: ClientInfo, notice?: string): Promise<{ setCookie: string; sessionId: string }> {
  const { token, record } = await createSessionRecord(userId, client);
  const fresh = await sessionStorage().getSession();
  fresh.set("sid", token);
  if (notice) fresh.flash("notice", notice);
  return { setCookie: await sessionStorage().commitSession(fresh), sessionId: record.id };
}

/**
 * Signs an account in with a brand-new session sent on a redirect. The session the browser had
 * before (another account's, say) ends, and the fresh cookie replaces the old one whole.
 */
export async function startSession(
  request: Request,
  account: { id: string },
  redirectTo: string,
  options: { notice?: string; headers?: HeadersInit } = {},
): Promise<Response> {
  const previous = (await getSession(request)).get("sid");
  if (previous) await revokeSessionToken(previous);
  const { setCookie } = await openSession(account.id, clientInfo(request), options.notice);
  const headers = new Headers(options.headers);
  headers.append("Set-Cookie", setCookie);
  return redirect(redirectTo, { headers });
}

/** Signs out: the session row is revoked, so a copy of the cookie is worthless too; the cookie is expired. */
export async function endSession(request: Request, redirectTo = "/"): Promise<Response> {
  const session = await getSession(request);
  const token = session.get("sid");
  if (token) await revokeSessionToken(token);
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
