import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { env } from "~/env.server";
import { User } from "~/models/index.server";
import { payments } from "~/services/payments.server";
import { accountCanBePaid } from "~/payments/payouts.server";
import { reserveUnit } from "~/orders/transitions.server";
import { signedInCookie } from "../support/sessions";
import { routeArgs } from "../support/route-args";
import { deliverClean, liveUnit, startWorld, stopWorld, type World } from "../support/payments-world";

const account = await import("~/routes/account/account");

// Payout accounts: /account's Payouts section sends a seller to the stand-in's onboarding page; coming
// back (or the account.updated webhook) turns payouts on; until then their unit cannot be reserved.
// And the demo seed connected the two demo sellers at the test stack's own stand-in.

const BASE = env().appUrl;

type Outcome = { status: number; location: string | null; body: unknown };
async function run(fn: () => Promise<unknown>): Promise<Outcome> {
  let out: unknown;
  try {
    out = await fn();
  } catch (thrown) {
    out = thrown;
  }
  if (out instanceof Response) return { status: out.status, location: out.headers.get("Location"), body: null };
  if (out && typeof out === "object" && "type" in out && out.type === "DataWithResponseInit") {
    const d = out as unknown as { data: unknown; init: { status?: number } | null };
    return { status: d.init?.status ?? 200, location: null, body: d.data };
  }
  return { status: 200, location: null, body: out };
}

describe("demo sellers", () => {
  it("are connected by the seed at the stand-in, all but one private seller", async () => {
    for (const email of ["workshop@loadline.test", "valves@loadline.test", "platters@loadline.test", "seller@loadline.test"]) {
      const user = await User.findOne({ where: { email }, rejectOnEmpty: true });
      expect(user.payoutsEnabled, email).toBe(true);
      expect(accountCanBePaid(await payments().accounts.retrieve(user.payoutAccountId ?? ""))).toBe(true);
    }
    const unconnected = await User.findOne({ where: { email: "seller2@loadline.test" }, rejectOnEmpty: true });
    expect(unconnected).toMatchObject({ payoutsEnabled: false, payoutAccountId: null });
  });
});

describe("payout accounts", () => {
  let world: World;

  beforeAll(async () => {
    world = await startWorld("2026-12-30T07:00:00Z");
  });
  afterAll(async () => {
    await stopWorld(world);
  });

  async function newSeller(label: string) {
    return User.create({
      email: `payouts-${label}-${Date.now()}@example.test`,
      displayName: `Payouts ${label}`,
      passwordHash: null,
      emailVerifiedAt: new Date(),
      lastSignInAt: null,
      roles: ["buyer", "seller"],
    });
  }

  const page = async (cookie: string, query = "") =>
    run(() => account.loader(routeArgs(new Request(`${BASE}/account${query}`, { headers: { Cookie: cookie } }), {})));

  const connect = async (cookie: string) =>
    run(() =>
      account.action(
        routeArgs(
          new Request(`${BASE}/account`, {
            method: "POST",
            headers: { Cookie: cookie, Origin: BASE, "content-type": "application/x-www-form-urlencoded" },
            body: "intent=connect-payouts",
          }),
          {},
        ),
      ),
    );

  it("sends a seller to onboarding and turns payouts on when they come back", async () => {
    const seller = await newSeller("return");
    const cookie = await signedInCookie(seller);
    expect((await page(cookie)).body).toMatchObject({ payouts: { connected: false, enabled: false } });
    // Not connected: their unit is shown but cannot be reserved.
    world.seller = seller;
    const unit = await liveUnit(world);
    await expect(
      reserveUnit({ listingId: unit.id, buyerId: world.buyer.id, deliveryMethod: "parcel", deliveryZone: "domestic" }, world.clock.app),
    ).rejects.toMatchObject({ code: "order_state" });

    const sent = await connect(cookie);
    expect(sent.status).toBe(302);
    expect(sent.location).toMatch(new RegExp(`^${world.fake.url}/connect/onboarding/`));
    await seller.reload();
    expect(seller.payoutAccountId).toMatch(/^acct_/);
    expect((await page(cookie)).body).toMatchObject({ payouts: { connected: true, enabled: false } });

    const done = await fetch(sent.location!, { method: "POST", body: new URLSearchParams({ business_name: "Bench" }), redirect: "manual" });
    expect(done.headers.get("location")).toBe(`${BASE}/account?payouts=back#payouts`);
    expect((await page(cookie, "?payouts=back")).body).toMatchObject({ payouts: { connected: true, enabled: true } });
    expect((await seller.reload()).payoutsEnabled).toBe(true);
    // Connecting again keeps the same account.
    await connect(cookie);
    expect((await seller.reload()).payoutAccountId).toBe(seller.payoutAccountId);
  });

  it("turns payouts on from the account.updated webhook alone", async () => {
    const seller = await newSeller("webhook");
    const cookie = await signedInCookie(seller);
    const sent = await connect(cookie);
    await fetch(sent.location!, { method: "POST", body: new URLSearchParams({ business_name: "Bench" }), redirect: "manual" });
    expect((await seller.reload()).payoutsEnabled).toBe(false);
    await deliverClean(world);
    expect((await seller.reload()).payoutsEnabled).toBe(true);
  });

  it("offers no Payouts section to an account that does not sell", async () => {
    const cookie = await signedInCookie(world.buyer);
    expect((await page(cookie)).body).toMatchObject({ payouts: null });
    expect((await connect(cookie)).status).toBe(403);
  });
});
