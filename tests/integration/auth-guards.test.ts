import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createCookie } from "react-router";
import { testEmail, TEST_EMAIL_PATTERN } from "./auth-support";
import { signedInCookie, signedInSession } from "../support/sessions";
import type { User } from "~/models/user.server";

// The guards against the real sessions table: what a page or an API route answers for each kind of
// visitor, and which cookies count as signed in.
const { sequelize } = await import("~/db.server");
const { env } = await import("~/env.server");
const { createAccount } = await import("~/auth/accounts.server");
const { getUser, requireRole, requireUser } = await import("~/auth/guards.server");
const { AccountSession } = await import("~/models/account-session.server");
let ada: User;
let desk: User;

beforeAll(async () => {
  ada = await createAccount({ email: testEmail("guard-ada"), displayName: "Ada", emailVerified: true });
  desk = await createAccount({ email: testEmail("guard-desk"), displayName: "Desk", roles: ["moderator"], emailVerified: true });
});

afterAll(async () => {
  await sequelize.query(`DELETE FROM users WHERE email LIKE :p`, { replacements: { p: TEST_EMAIL_PATTERN } });
  await sequelize.close();
});

function request(path: string, cookie?: string) {
  return new Request(`http://app.test${path}`, { headers: cookie ? { Cookie: cookie } : {} });
}

async function thrown(promise: Promise<unknown>): Promise<unknown> {
  try {
    await promise;
  } catch (error) {
    return error;
  }
  throw new Error("expected the guard to refuse");
}

/** A cookie under the session cookie's name, signed with the app's own secret, holding whatever is given. */
async function handMade(value: object): Promise<string> {
  const name = env().secureCookies ? "__Host-loadline_session" : "loadline_session";
  const cookie = createCookie(name, { secrets: env().sessionSecrets });
  return (await cookie.serialize(value)).split(";")[0];
}

describe("getUser", () => {
  it("returns the signed-in account in the shape the header uses", async () => {
    const user = await getUser(request("/", await signedInCookie(ada)));
    expect(user).toEqual({ id: ada.id, email: ada.email, displayName: "Ada", roles: ["buyer"], emailVerified: true });
  });

  it("puts no account id in the cookie, only an opaque token whose hash alone is stored", async () => {
    const { cookie, sessionId } = await signedInSession(ada);
    const decoded = Buffer.from(decodeURIComponent(cookie.split("=")[1]).split(".")[0], "base64").toString("utf8");
    expect(decoded).not.toContain(ada.id);
    const { sid } = JSON.parse(decoded) as { sid: string };
    expect(sid).toMatch(/^[A-Za-z0-9_-]{43}$/); // 256 random bits
    const row = (await AccountSession.findByPk(sessionId))!;
    expect(row.tokenHash).toMatch(/^[0-9a-f]{64}$/);
    expect(row.tokenHash).not.toContain(sid);
    expect(await AccountSession.count({ where: { tokenHash: sid } })).toBe(0);
  });

  it("ignores a hand-made cookie for an account id, even one signed with the real secret", async () => {
    expect(
      await getUser(request("/", await handMade({ userId: desk.id, sessionVersion: 0, signedInAt: new Date().toISOString() }))),
    ).toBeNull();
    // A token of the right shape that no session has.
    expect(await getUser(request("/", await handMade({ sid: "A".repeat(43) })))).toBeNull();
  });

  it("ignores a cookie whose signature does not match", async () => {
    const cookie = await signedInCookie(ada);
    const [name, value] = cookie.split("=");
    const unsigned = decodeURIComponent(value).split(".")[0];
    expect(await getUser(request("/", `${name}=${encodeURIComponent(`${unsigned}.forged`)}`))).toBeNull();
  });

  it("treats a revoked session, an expired one and a suspended account as signed out", async () => {
    const revoked = await signedInSession(ada);
    await AccountSession.update({ revokedAt: new Date() }, { where: { id: revoked.sessionId } });
    expect(await getUser(request("/", revoked.cookie))).toBeNull();

    const day = 24 * 60 * 60 * 1000;
    const old = await signedInSession(ada);
    await AccountSession.update(
      { createdAt: new Date(Date.now() - 15 * day), expiresAt: new Date(Date.now() - day) },
      { where: { id: old.sessionId } },
    );
    expect(await getUser(request("/", old.cookie))).toBeNull();

    const suspendedAccount = await createAccount({ email: testEmail("guard-suspended"), displayName: "S", emailVerified: true });
    const cookie = await signedInCookie(suspendedAccount);
    await suspendedAccount.update({ status: "suspended" });
    expect(await getUser(request("/", cookie))).toBeNull();
  });

  it("expires a session 14 days after sign-in, as the cookie does", async () => {
    const { sessionId } = await signedInSession(ada);
    const row = (await AccountSession.findByPk(sessionId))!;
    expect(row.expiresAt.getTime() - row.createdAt.getTime()).toBe(14 * 24 * 60 * 60 * 1000);
  });

  it("notes when a session was last seen at most once a minute", async () => {
    const { cookie, sessionId } = await signedInSession(ada, { address: "192.0.2.30", userAgent: "t" });
    const lastSeen = async () => (await AccountSession.findByPk(sessionId))!;
    const start = (await lastSeen()).lastSeenAt;
    const from = (address: string) => new Request("http://app.test/", { headers: { Cookie: cookie, "X-Forwarded-For": address } });
    await getUser(from("192.0.2.31"));
    expect((await lastSeen()).lastSeenAt).toEqual(start);

    const earlier = new Date(Date.now() - 2 * 60_000);
    await AccountSession.update({ lastSeenAt: earlier }, { where: { id: sessionId } });
    await getUser(from("192.0.2.32"));
    const seen = await lastSeen();
    expect(seen.lastSeenAt.getTime()).toBeGreaterThan(earlier.getTime() + 60_000);
    expect(seen.address).toBe("192.0.2.32");
  });
});

describe("requireUser", () => {
  it("sends an anonymous page request to sign in with the way back", async () => {
    const response = (await thrown(requireUser(request("/desk?tab=held")))) as Response;
    expect(response.status).toBe(302);
    expect(response.headers.get("Location")).toBe("/sign-in?redirectTo=%2Fdesk%3Ftab%3Dheld");
  });

  it("answers an anonymous API request with 401 JSON", async () => {
    const response = (await thrown(requireUser(request("/api/v1/watchlist")))) as Response;
    expect(response.status).toBe(401);
    expect(await response.json()).toEqual({ error: "unauthenticated", message: "Sign in to use this." });
  });
});

describe("requireRole", () => {
  it("lets an account with one of the roles through", async () => {
    const cookie = await signedInCookie(desk);
    await expect(requireRole(request("/desk", cookie), "moderator")).resolves.toMatchObject({ id: desk.id });
    await expect(requireRole(request("/desk", cookie), ["admin", "moderator"])).resolves.toMatchObject({ id: desk.id });
  });

  it("refuses a page with a 403 the error boundary can explain", async () => {
    const error = await thrown(requireRole(request("/admin/users", await signedInCookie(ada)), "admin"));
    // A thrown `data(…)`: React Router turns it into the route error response the boundary renders.
    expect(error).toMatchObject({
      init: { status: 403 },
      data: { message: expect.stringContaining("for admins only"), roles: ["admin"] },
    });
  });

  it("refuses an API call with 403 JSON naming the role", async () => {
    const response = (await thrown(requireRole(request("/api/v1/desk", await signedInCookie(ada)), "moderator"))) as Response;
    expect(response.status).toBe(403);
    expect(await response.json()).toEqual({ error: "forbidden", message: "This needs the moderator role." });
  });

  it("sends an anonymous visitor to sign in rather than showing 403", async () => {
    const response = (await thrown(requireRole(request("/desk"), "moderator"))) as Response;
    expect(response.status).toBe(302);
    expect(response.headers.get("Location")).toBe("/sign-in?redirectTo=%2Fdesk");
  });
});
