import { afterAll, describe, expect, it } from "vitest";
import { RUN, testEmail, TEST_EMAIL_PATTERN } from "./auth-support";
import { signedInAs, signedInCookie } from "../support/sessions";

// Loadline pass sign-in against the running local identity provider (started by the test stack):
// the app's remix-auth-oauth2 strategy does the real authorization-code + PKCE + state exchange,
// and the account rules (link on a verified address, create otherwise) are checked in the database.
const { sequelize } = await import("~/db.server");
const { env } = await import("~/env.server");
const { User } = await import("~/models/user.server");
const { OAuthIdentity } = await import("~/models/oauth-identity.server");
const { createAccount } = await import("~/auth/accounts.server");
const { signInWithIdentity } = await import("~/auth/identities.server");
const { startOAuth, finishOAuth, LOADLINE_ID } = await import("~/auth/authenticator.server");

afterAll(async () => {
  await sequelize.query(`DELETE FROM users WHERE email LIKE :p`, { replacements: { p: TEST_EMAIL_PATTERN } });
  await sequelize.close();
});

function cookieHeader(response: Response): string {
  return response.headers
    .getSetCookie()
    .map((c) => c.split(";")[0])
    .join("; ");
}

/** App → provider → (person picks an address) → back at the callback URL with code and state. */
async function throughProvider(email: string, { redirectTo = "/desk", deny = false } = {}) {
  const app = env().appUrl;
  const start = await startOAuth(
    new Request(`${app}/auth/oauth`, {
      method: "POST",
      headers: { "Content-Type": "application/x-www-form-urlencoded" },
      body: new URLSearchParams({ redirectTo }),
    }),
    redirectTo,
  );
  expect(start.status).toBe(302);
  const authorize = new URL(start.headers.get("Location")!);
  const form = new URLSearchParams(authorize.searchParams);
  form.set("email", email);
  form.set("action", deny ? "deny" : "allow");
  const answer = await fetch(`${authorize.origin}${authorize.pathname}`, { method: "POST", body: form, redirect: "manual" });
  expect(answer.status).toBe(302);
  return { authorize, callback: answer.headers.get("Location")!, cookies: cookieHeader(start) };
}

describe("the authorization request", () => {
  it("asks for a code with PKCE (S256), a state, the registered callback and the profile scopes", async () => {
    const { authorize, cookies } = await throughProvider(testEmail("request"));
    const p = authorize.searchParams;
    expect(p.get("response_type")).toBe("code");
    expect(p.get("client_id")).toBe(env().oauth.clientId);
    expect(p.get("redirect_uri")).toBe(`${env().appUrl}/auth/oauth/callback`);
    expect(p.get("code_challenge_method")).toBe("S256");
    expect(p.get("code_challenge")).toMatch(/^[A-Za-z0-9_-]{43}$/);
    expect(p.get("scope")).toBe("openid email profile");
    expect(cookies).toContain(`loadline_oauth:`);
    expect(cookies).toContain(`${p.get("state")}=`);
  });
});

describe("the callback", () => {
  it("signs in a new person as a new, confirmed account and returns to the page asked for", async () => {
    const email = testEmail("fresh");
    const { callback, cookies } = await throughProvider(email, { redirectTo: "/desk" });
    const outcome = await finishOAuth(new Request(callback, { headers: { Cookie: cookies } }));
    expect(outcome).toMatchObject({ ok: true, redirectTo: "/desk" });
    const user = await User.findOne({ where: { email } });
    expect(user).toMatchObject({ roles: ["buyer"], passwordHash: null });
    expect(user!.emailVerifiedAt).toBeInstanceOf(Date);
    // The one-time cookies are expired in the answer.
    expect(outcome.clearCookies.some((c) => /^loadline_oauth:[^=]+=; .*Max-Age=0/.test(c))).toBe(true);
  });

  it("refuses a callback whose state is not the one this browser started with", async () => {
    const { callback, cookies } = await throughProvider(testEmail("tampered"));
    const forged = new URL(callback);
    forged.searchParams.set("state", `forged-${RUN}`);
    expect(await finishOAuth(new Request(forged, { headers: { Cookie: cookies } }))).toMatchObject({ ok: false, code: "failed" });
    // A callback without the browser's state cookie (e.g. a link sent to someone else) fails too.
    const other = await throughProvider(testEmail("no-cookie"));
    expect(await finishOAuth(new Request(other.callback))).toMatchObject({ ok: false, code: "failed" });
    expect(await User.count({ where: { email: [testEmail("tampered"), testEmail("no-cookie")] } })).toBe(0);
  });

  it("reports a cancelled sign-in as cancelled", async () => {
    const { callback, cookies } = await throughProvider(testEmail("cancel"), { deny: true });
    expect(await finishOAuth(new Request(callback, { headers: { Cookie: cookies } }))).toMatchObject({ ok: false, code: "cancelled" });
  });
});

describe("linking identities to accounts", () => {
  const profile = (label: string, overrides: Partial<Parameters<typeof signInWithIdentity>[0]> = {}) => ({
    provider: LOADLINE_ID,
    subject: `sub-${RUN}-${label}`,
    email: testEmail(label),
    emailVerified: true,
    name: `Person ${label}`,
    ...overrides,
  });

  it("links to the confirmed account with the same address and keeps its password", async () => {
    const existing = await createAccount({
      email: testEmail("linked"),
      displayName: "Linda",
      password: "her-own-password",
      emailVerified: true,
    });
    const user = await signInWithIdentity(profile("linked"));
    expect(user.id).toBe(existing.id);
    expect(user.passwordHash).toBe(existing.passwordHash);
    expect(await OAuthIdentity.count({ where: { userId: existing.id } })).toBe(1);
  });

  it("takes over an unconfirmed account's address from whoever typed the unproven password", async () => {
    const squatter = await createAccount({ email: testEmail("squatted"), displayName: "Not The Owner", password: "squatters-password" });
    const squattersCookie = await signedInCookie(squatter);
    expect(await signedInAs(squattersCookie)).toBe(squatter.id);
    const user = await signInWithIdentity(profile("squatted"));
    expect(user.id).toBe(squatter.id);
    await user.reload();
    expect(user.passwordHash).toBeNull();
    expect(user.emailVerifiedAt).toBeInstanceOf(Date);
    // The session made with the unproven password ends.
    expect(await signedInAs(squattersCookie)).toBeNull();
  });

  it("recognises a returning identity even after its address changed at the provider", async () => {
    const first = await signInWithIdentity(profile("mover"));
    const again = await signInWithIdentity(profile("mover", { email: testEmail("moved") }));
    expect(again.id).toBe(first.id);
  });

  it("refuses an address the provider has not verified", async () => {
    await expect(signInWithIdentity(profile("unverified", { emailVerified: false }))).rejects.toMatchObject({ code: "oauth_unverified" });
    expect(await User.count({ where: { email: testEmail("unverified") } })).toBe(0);
  });

  it("refuses a suspended account", async () => {
    await createAccount({ email: testEmail("banned"), displayName: "Banned", emailVerified: true });
    await User.update({ status: "suspended" }, { where: { email: testEmail("banned") } });
    await expect(signInWithIdentity(profile("banned"))).rejects.toMatchObject({ code: "suspended" });
  });
});
