import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { User } from "~/models/index.server";
import { loader } from "~/routes/account/sign-in";
import { makeUser, removeFixtureUsers } from "../support/listing-fixtures";
import { signedInCookie } from "../support/sessions";

// A signed-in visitor who opens /sign-in is sent straight on to `redirectTo`. The four targets from
// the report each resolved to "//evil.example", which the browser followed to the other site.
const BASE = "http://127.0.0.1";
let visitor: User;
let cookie: string;

beforeAll(async () => {
  visitor = await makeUser("redirect-visitor");
  cookie = await signedInCookie(visitor);
});
afterAll(async () => {
  await removeFixtureUsers([visitor].filter(Boolean));
});

/** Where the sign-in page sends this signed-in visitor (the Location of the thrown redirect). */
async function locationFor(redirectTo: string): Promise<string | null> {
  const url = `${BASE}/sign-in?${new URLSearchParams({ redirectTo })}`;
  try {
    await loader({ request: new Request(url, { headers: { Cookie: cookie } }), params: {}, context: {} } as never);
  } catch (thrown) {
    if (thrown instanceof Response && thrown.status === 302) return thrown.headers.get("Location");
    throw thrown;
  }
  throw new Error("the signed-in visitor was shown the sign-in page");
}

describe("GET /sign-in for a signed-in visitor", () => {
  it.each(["/.//evil.example", "/..//evil.example", "/%2e//evil.example", "/x/../..//evil.example"])(
    "redirectTo=%s stays on the site",
    async (target) => {
      const location = await locationFor(target);
      expect(location).toBe("/");
      expect(new URL(location!, "https://loadline.example").origin).toBe("https://loadline.example");
    },
  );

  it("still goes on to a page of the site", async () => {
    expect(await locationFor("/market?category=turntables")).toBe("/market?category=turntables");
  });
});
