import { openSession } from "~/auth/session.server";
import type { ClientInfo } from "~/auth/session-store.server";

// THE way tests sign an account in: a real row in the sessions table and the cookie that carries
// it, made by the same code as a sign-in. Returns the `name=value` pair for a Cookie header.

export const TEST_CLIENT: ClientInfo = { address: "192.0.2.10", userAgent: "Loadline test suite" };

export async function signedInCookie(user: { id: string }, client: ClientInfo = TEST_CLIENT): Promise<string> {
  return (await signedInSession(user, client)).cookie;
}

/** Like signedInCookie, with the session's id (to revoke it, or to find it in a list). */
export async function signedInSession(
  user: { id: string },
  client: ClientInfo = TEST_CLIENT,
): Promise<{ cookie: string; sessionId: string }> {
  const { setCookie, sessionId } = await openSession(user.id, client);
  return { cookie: setCookie.split(";")[0], sessionId };
}

/** The id of the account a cookie is signed in as right now, or null (as every guard sees it). */
export async function signedInAs(cookie: string): Promise<string | null> {
  const { getUser } = await import("~/auth/guards.server");
  return (await getUser(new Request("http://127.0.0.1/account", { headers: { Cookie: cookie } })))?.id ?? null;
}
