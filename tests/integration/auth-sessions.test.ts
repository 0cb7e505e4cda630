import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { testEmail, TEST_EMAIL_PATTERN } from "./auth-support";
import { signedInAs, signedInSession } from "../support/sessions";
import { routeArgs } from "../support/route-args";

// Server-side sessions through the real route modules: signing in and out, the session list on
// /account and its forms. A session ends on the server, so a copied cookie ends with it.
const { sequelize } = await import("~/db.server");
const { createAccount } = await import("~/auth/accounts.server");
const { AccountSession } = await import("~/models/account-session.server");
const signInRoute = await import("~/routes/account/sign-in");
const signOutRoute = await import("~/routes/account/sign-out");
const accountRoute = await import("~/routes/account/account");

const BASE = "http://127.0.0.1";
const PASSWORD = "steady-bias-current";
let addressCounter = 100;
const nextAddress = () => `192.0.2.${addressCounter++}`;

afterAll(async () => {
  await sequelize.query(`DELETE FROM sign_in_attempts WHERE email LIKE :p`, { replacements: { p: TEST_EMAIL_PATTERN } });
  await sequelize.query(`DELETE FROM users WHERE email LIKE :p`, { replacements: { p: TEST_EMAIL_PATTERN } });
  await sequelize.close();
});

type Outcome = { status: number; location: string | null; setCookie: string | null; body: unknown };

/** Runs a loader or action as the server does; thrown responses and `data()` results are unwrapped. */
async function run(fn: () => Promise<unknown>): Promise<Outcome> {
  let out: unknown;
  try {
    out = await fn();
  } catch (thrown) {
    out = thrown;
  }
  if (out instanceof Response) {
    return { status: out.status, location: out.headers.get("Location"), setCookie: out.headers.get("Set-Cookie"), body: null };
  }
  if (out && typeof out === "object" && "type" in out && out.type === "DataWithResponseInit") {
    const d = out as unknown as { data: unknown; init: { status?: number } | null };
    return { status: d.init?.status ?? 200, location: null, setCookie: null, body: d.data };
  }
  return { status: 200, location: null, setCookie: null, body: out };
}

function post(path: string, fields: Record<string, string>, cookie?: string, address = "192.0.2.99") {
  return new Request(`${BASE}${path}`, {
    method: "POST",
    body: new URLSearchParams(fields),
    headers: {
      "Content-Type": "application/x-www-form-urlencoded",
      "X-Forwarded-For": address,
      "User-Agent": "Mozilla/5.0 (X11; Linux x86_64; rv:128.0) Gecko/20100101 Firefox/128.0",
      ...(cookie ? { Cookie: cookie } : {}),
    },
  });
}

const get = (path: string, cookie?: string) => new Request(`${BASE}${path}`, { headers: cookie ? { Cookie: cookie } : {} });
const args = (request: Request) => routeArgs(request, {});

async function signIn(email: string, address = nextAddress()): Promise<string> {
  const out = await run(() =>
    signInRoute.action(args(post("/sign-in", { email, password: PASSWORD, redirectTo: "/account" }, undefined, address))),
  );
  expect(out.status).toBe(302);
  expect(out.location).toBe("/account");
  return out.setCookie!.split(";")[0];
}

const accountPage = (cookie: string) => run(() => accountRoute.loader(args(get("/account", cookie))));
const accountForm = (cookie: string, fields: Record<string, string>) =>
  run(() => accountRoute.action(args(post("/account", fields, cookie))));

async function account(label: string) {
  return createAccount({ email: testEmail(label), displayName: `Person ${label}`, password: PASSWORD, emailVerified: true });
}

describe("signing out", () => {
  it("ends the session on the server: the same cookie replayed afterwards is anonymous", async () => {
    const user = await account("replay");
    const cookie = await signIn(user.email);
    expect((await accountPage(cookie)).body).toMatchObject({ user: { id: user.id } });

    const out = await run(() => signOutRoute.action(args(post("/sign-out", {}, cookie))));
    expect(out.status).toBe(302);
    expect(out.setCookie).toMatch(/Max-Age=0|Expires=Thu, 01 Jan 1970/);

    // The browser forgot the cookie; someone who copied it replays it.
    const replay = await accountPage(cookie);
    expect(replay.status).toBe(302);
    expect(replay.location).toBe("/sign-in?redirectTo=%2Faccount");
    expect(await signedInAs(cookie)).toBeNull();
  });

  it("a fresh sign-in in the same browser ends the session it replaces", async () => {
    const first = await account("switch-a");
    const second = await account("switch-b");
    const cookieA = await signIn(first.email);
    const request = new Request(`${BASE}/sign-in`, {
      method: "POST",
      body: new URLSearchParams({ email: second.email, password: PASSWORD }),
      headers: { "Content-Type": "application/x-www-form-urlencoded", "X-Forwarded-For": nextAddress(), Cookie: cookieA },
    });
    const out = await run(() => signInRoute.action(args(request)));
    expect(await signedInAs(out.setCookie!.split(";")[0])).toBe(second.id);
    expect(await signedInAs(cookieA)).toBeNull();
  });
});

describe("the session list on /account", () => {
  let owner: Awaited<ReturnType<typeof account>>;
  beforeAll(async () => {
    owner = await account("list");
  });

  it("lists the open sessions with browser, address, times and which one is this device", async () => {
    const here = await signIn(owner.email, "192.0.2.61");
    const phone = await signedInSession(owner, {
      address: "198.51.100.7",
      userAgent: "Mozilla/5.0 (Linux; Android 14) AppleWebKit/537.36 (KHTML, like Gecko) Chrome/126.0 Mobile Safari/537.36",
    });
    const page = await accountPage(here);
    const sessions = (page.body as { sessions: Record<string, unknown>[] }).sessions;
    expect(sessions[0]).toMatchObject({ current: true, browser: "Firefox on Linux", address: "192.0.2.61" });
    expect(sessions).toContainEqual(
      expect.objectContaining({
        id: phone.sessionId,
        current: false,
        browser: "Chrome on Android",
        address: "198.51.100.7",
        signedInLabel: expect.stringMatching(/UTC$/),
        lastSeenLabel: expect.stringMatching(/UTC$/),
      }),
    );
    // Nothing in the list could be used as a cookie.
    expect(JSON.stringify(sessions)).not.toMatch(/tokenHash|token_hash|sid/);
  });

  it("signs out one other device, and only that one", async () => {
    const here = await signIn(owner.email);
    const other = await signedInSession(owner);
    const out = await accountForm(here, { intent: "sign-out-session", sessionId: other.sessionId });
    expect(out).toMatchObject({ status: 200, body: { ok: true, section: "sessions" } });
    expect(await signedInAs(other.cookie)).toBeNull();
    expect(await signedInAs(here)).toBe(owner.id);
  });

  it("signing out this device from the list is signing out", async () => {
    const { cookie, sessionId } = await signedInSession(owner);
    const out = await accountForm(cookie, { intent: "sign-out-session", sessionId });
    expect(out.status).toBe(302);
    expect(await signedInAs(cookie)).toBeNull();
  });

  it("does not let another account sign your session out", async () => {
    const victim = await signedInSession(owner);
    const stranger = await account("list-stranger");
    const strangersCookie = await signIn(stranger.email);
    const out = await accountForm(strangersCookie, { intent: "sign-out-session", sessionId: victim.sessionId });
    // The same answer as for a session that has ended: nothing about whose it is.
    expect(out).toMatchObject({ status: 404, body: { ok: false, text: "That session had already ended." } });
    expect(await signedInAs(victim.cookie)).toBe(owner.id);
    expect((await AccountSession.findByPk(victim.sessionId))!.revokedAt).toBeNull();
    // And "everywhere else" from the stranger's account touches only the stranger's sessions.
    await accountForm(strangersCookie, { intent: "sign-out-others" });
    expect(await signedInAs(victim.cookie)).toBe(owner.id);
  });

  it("signs out everywhere else and keeps this device signed in", async () => {
    const person = await account("everywhere");
    const here = await signIn(person.email);
    const others = [await signedInSession(person), await signedInSession(person)];
    const out = await accountForm(here, { intent: "sign-out-others" });
    expect(out).toMatchObject({ status: 200, body: { ok: true, text: "Signed out everywhere else (2 sessions)." } });
    expect(await signedInAs(here)).toBe(person.id);
    for (const o of others) expect(await signedInAs(o.cookie)).toBeNull();
    const page = await accountPage(here);
    expect((page.body as { sessions: unknown[] }).sessions).toHaveLength(1);
  });

  it("refuses a malformed session id, and nobody anonymous gets to post", async () => {
    const here = await signIn(owner.email);
    expect((await accountForm(here, { intent: "sign-out-session", sessionId: "1 OR 1=1" })).status).toBe(400);
    expect((await accountForm(here, { intent: "drop-tables" })).status).toBe(400);
    const anonymous = await run(() => accountRoute.action(args(post("/account", { intent: "sign-out-others" }))));
    expect(anonymous.status).toBe(302);
  });
});
