import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { User } from "~/models/index.server";
import { loader as deskLoader } from "~/routes/desk/desk";
import { loader as usersLoader } from "~/routes/admin/users";
import { loader as listingLoader } from "~/routes/listings/listing";
import { createAmplifierListing, makeUser, removeFixtureUsers, type AmplifierFixture } from "../support/listing-fixtures";
import { signedInCookie } from "../support/sessions";
import { routeArgs } from "../support/route-args";

// The role hierarchy through the real loaders (README, "Roles"): an admin includes the moderator,
// a moderator does not include the admin.
const BASE = "http://127.0.0.1";

type Answer = { status: number; body: unknown };

/** What a loader answers, returned or thrown: a Response, data() with its status, or plain data. */
async function answer(fn: () => Promise<unknown>): Promise<Answer> {
  let value: unknown;
  try {
    value = await fn();
  } catch (thrown) {
    value = thrown;
  }
  if (value instanceof Response) return { status: value.status, body: null };
  const v = value as { type?: string; data?: unknown; init?: ResponseInit | null };
  if (v?.type === "DataWithResponseInit") return { status: v.init?.status ?? 200, body: v.data };
  return { status: 200, body: value };
}

const get = (path: string, cookie: string) => new Request(`${BASE}${path}`, { headers: { Cookie: cookie } });

let held: AmplifierFixture;
let admin: User;
let moderator: User;
const cookies: Record<string, string> = {};

beforeAll(async () => {
  held = await createAmplifierListing({ label: "roles-held", status: "held", heldReason: "Rated power above what the supply can give." });
  admin = await makeUser("roles-admin", ["buyer", "admin"]);
  moderator = await makeUser("roles-moderator", ["buyer", "moderator"]);
  cookies.admin = await signedInCookie(admin);
  cookies.moderator = await signedInCookie(moderator);
}, 60_000);

afterAll(async () => {
  await removeFixtureUsers([held?.seller, admin, moderator].filter(Boolean));
});

describe("an admin includes the moderator", () => {
  it("opens the review desk, and the held listing appears in its queue", async () => {
    const desk = await answer(() => deskLoader(routeArgs(get("/desk", cookies.admin), {})));
    expect(desk.status).toBe(200);
    const queue = desk.body as { items: { kind: string; subject: { id: string } }[] };
    expect(queue.items.filter((i) => i.kind === "held_listing").map((i) => i.subject.id)).toContain(held.listing.id);
  });

  it("sees a held listing's page with the desk's reason", async () => {
    const id = held.listing.id;
    const page = await answer(() => listingLoader(routeArgs(get(`/listings/${id}`, cookies.admin), { id })));
    expect(page.status).toBe(200);
    expect(page.body).toMatchObject({ listing: { status: "held", heldReason: "Rated power above what the supply can give." } });
  });

  it("opens the account list", async () => {
    expect((await answer(() => usersLoader(routeArgs(get("/admin/users", cookies.admin), {})))).status).toBe(200);
  });
});

describe("a moderator does not include the admin", () => {
  it("is refused the account list with 403", async () => {
    expect((await answer(() => usersLoader(routeArgs(get("/admin/users", cookies.moderator), {})))).status).toBe(403);
  });

  it("still works the desk", async () => {
    expect((await answer(() => deskLoader(routeArgs(get("/desk", cookies.moderator), {})))).status).toBe(200);
  });
});
