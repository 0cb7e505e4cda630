import { beforeEach, describe, expect, it, vi } from "vitest";

// The guards with the account lookup replaced by a table in memory: what matters here is what a
// page or an API route answers for each kind of visitor.
const accounts = new Map<string, Record<string, unknown>>();
vi.mock("~/models/user.server", () => ({
  User: { findByPk: async (id: string) => accounts.get(id) ?? null },
}));

const { getUser, requireRole, requireUser } = await import("~/auth/guards.server");
const { sessionStorage } = await import("~/auth/session.server");

const ADA = "0b7e3c1e-8d4f-4a43-9c0e-5f7a1d2b3c4d";

function account(overrides: Record<string, unknown> = {}) {
  return {
    id: ADA,
    email: "ada@example.test",
    displayName: "Ada",
    roles: ["buyer"],
    status: "active",
    sessionVersion: 3,
    emailVerifiedAt: new Date(),
    ...overrides,
  };
}

async function cookieFor(userId: string, sessionVersion: number, signedInAt = new Date()) {
  const session = await sessionStorage().getSession();
  session.set("userId", userId);
  session.set("sessionVersion", sessionVersion);
  session.set("signedInAt", signedInAt.toISOString());
  return (await sessionStorage().commitSession(session)).split(";")[0];
}

async function request(path: string, cookie?: string) {
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

beforeEach(() => accounts.clear());

describe("getUser", () => {
  it("returns the signed-in account in the shape the header uses", async () => {
    accounts.set(ADA, account());
    const user = await getUser(await request("/", await cookieFor(ADA, 3)));
    expect(user).toEqual({ id: ADA, email: "ada@example.test", displayName: "Ada", roles: ["buyer"], emailVerified: true });
  });

  it("treats a cookie from before a password reset or suspension as signed out", async () => {
    accounts.set(ADA, account({ sessionVersion: 4 }));
    expect(await getUser(await request("/", await cookieFor(ADA, 3)))).toBeNull();
    accounts.set(ADA, account({ status: "suspended" }));
    expect(await getUser(await request("/", await cookieFor(ADA, 3)))).toBeNull();
  });

  it("treats a session older than 14 days as signed out, whatever the cookie says", async () => {
    accounts.set(ADA, account());
    const day = 24 * 60 * 60 * 1000;
    expect(await getUser(await request("/", await cookieFor(ADA, 3, new Date(Date.now() - 13 * day))))).not.toBeNull();
    expect(await getUser(await request("/", await cookieFor(ADA, 3, new Date(Date.now() - 15 * day))))).toBeNull();
  });

  it("ignores a cookie whose signature does not match", async () => {
    accounts.set(ADA, account());
    const cookie = await cookieFor(ADA, 3);
    const [name, value] = cookie.split("=");
    const forged = `${name}=${encodeURIComponent(btoa(JSON.stringify({ userId: ADA, sessionVersion: 3 })))}${value.slice(value.indexOf("."))}`;
    expect(await getUser(await request("/", forged))).toBeNull();
  });
});

describe("requireUser", () => {
  it("sends an anonymous page request to sign in with the way back", async () => {
    const response = (await thrown(requireUser(await request("/desk?tab=held")))) as Response;
    expect(response.status).toBe(302);
    expect(response.headers.get("Location")).toBe("/sign-in?redirectTo=%2Fdesk%3Ftab%3Dheld");
  });

  it("answers an anonymous API request with 401 JSON", async () => {
    const response = (await thrown(requireUser(await request("/api/v1/watchlist")))) as Response;
    expect(response.status).toBe(401);
    expect(await response.json()).toEqual({ error: "unauthenticated", message: "Sign in to use this." });
  });
});

describe("requireRole", () => {
  it("lets an account with one of the roles through", async () => {
    accounts.set(ADA, account({ roles: ["buyer", "moderator"] }));
    const cookie = await cookieFor(ADA, 3);
    await expect(requireRole(await request("/desk", cookie), "moderator")).resolves.toMatchObject({ id: ADA });
    await expect(requireRole(await request("/desk", cookie), ["admin", "moderator"])).resolves.toMatchObject({ id: ADA });
  });

  it("refuses a page with a 403 the error boundary can explain", async () => {
    accounts.set(ADA, account());
    const error = await thrown(requireRole(await request("/admin/users", await cookieFor(ADA, 3)), "admin"));
    // A thrown `data(…)`: React Router turns it into the route error response the boundary renders.
    expect(error).toMatchObject({
      init: { status: 403 },
      data: { message: expect.stringContaining("for admins only"), roles: ["admin"] },
    });
  });

  it("refuses an API call with 403 JSON naming the role", async () => {
    accounts.set(ADA, account());
    const response = (await thrown(requireRole(await request("/api/v1/desk", await cookieFor(ADA, 3)), "moderator"))) as Response;
    expect(response.status).toBe(403);
    expect(await response.json()).toEqual({ error: "forbidden", message: "This needs the moderator role." });
  });

  it("sends an anonymous visitor to sign in rather than showing 403", async () => {
    const response = (await thrown(requireRole(await request("/desk"), "moderator"))) as Response;
    expect(response.status).toBe(302);
    expect(response.headers.get("Location")).toBe("/sign-in?redirectTo=%2Fdesk");
  });
});
