import { afterAll, describe, expect, it } from "vitest";
import { RUN, testEmail, TEST_EMAIL_PATTERN } from "./auth-support";
import type { Role } from "~/auth/roles";
import { blankListing } from "../support/blank-listing";
import { signedInAs, signedInCookie } from "../support/sessions";

// Admin work on accounts and the review desk's queue, against the real database.
const { sequelize } = await import("~/db.server");
const { User, Workshop, Listing } = await import("~/models/index.server");
const { createAccount } = await import("~/auth/accounts.server");
const { listAccounts, setAccountRoles, setAccountStatus } = await import("~/auth/admin.server");
const { deskQueue } = await import("~/desk/queue.server");

afterAll(async () => {
  const users = `SELECT id FROM users WHERE email LIKE :p`;
  await sequelize.query(`DELETE FROM listings WHERE seller_id IN (${users})`, { replacements: { p: TEST_EMAIL_PATTERN } });
  await sequelize.query(`DELETE FROM workshops WHERE owner_id IN (${users})`, { replacements: { p: TEST_EMAIL_PATTERN } });
  await sequelize.query(`DELETE FROM users WHERE email LIKE :p`, { replacements: { p: TEST_EMAIL_PATTERN } });
  await sequelize.close();
});

async function sessionUserOf(label: string, roles: Role[] = []) {
  const u = await createAccount({ email: testEmail(label), displayName: `Person ${label}`, roles, emailVerified: true });
  return { id: u.id, email: u.email, displayName: u.displayName, roles: u.roles, emailVerified: true };
}

describe("roles", () => {
  it("grants and removes roles; buyer always stays", async () => {
    const admin = await sessionUserOf("admin-a", ["admin"]);
    const target = await sessionUserOf("target");
    expect(await setAccountRoles(admin, target.id, ["moderator", "seller"])).toMatchObject({ ok: true });
    expect((await User.findByPk(target.id))!.roles).toEqual(["buyer", "seller", "moderator"]);
    expect(await setAccountRoles(admin, target.id, [])).toMatchObject({ ok: true });
    expect((await User.findByPk(target.id))!.roles).toEqual(["buyer"]);
  });

  it("does not let an admin remove their own admin role", async () => {
    const admin = await sessionUserOf("admin-self", ["admin"]);
    const result = await setAccountRoles(admin, admin.id, ["moderator"]);
    expect(result).toEqual({ ok: false, message: "You cannot remove your own admin role. Ask another admin to do it." });
    expect((await User.findByPk(admin.id))!.roles).toEqual(["buyer", "admin"]);
    // Adding a role to oneself while keeping admin is fine.
    expect(await setAccountRoles(admin, admin.id, ["admin", "moderator"])).toMatchObject({ ok: true });
  });

  it("drops roles nobody knows; the database would refuse them anyway", async () => {
    const admin = await sessionUserOf("admin-b", ["admin"]);
    const target = await sessionUserOf("target-b");
    await expect(
      sequelize.query(`UPDATE users SET roles = ARRAY['buyer','owner'] WHERE id = :id`, { replacements: { id: target.id } }),
    ).rejects.toThrow(/users_roles_known/);
    expect(await setAccountRoles(admin, target.id, ["owner" as never])).toMatchObject({ ok: true });
    expect((await User.findByPk(target.id))!.roles).toEqual(["buyer"]);
  });
});

describe("suspension", () => {
  it("suspends (ending every session) and reinstates; an admin cannot suspend themself", async () => {
    const admin = await sessionUserOf("admin-c", ["admin"]);
    const target = await sessionUserOf("target-c");
    const [phone, laptop] = [await signedInCookie(target), await signedInCookie(target)];
    expect(await setAccountStatus(admin, target.id, "suspended")).toMatchObject({ ok: true });
    const suspended = (await User.findByPk(target.id))!;
    expect(suspended.status).toBe("suspended");
    expect(await signedInAs(phone)).toBeNull();
    expect(await setAccountStatus(admin, target.id, "active")).toMatchObject({ ok: true });
    expect((await User.findByPk(target.id))!.status).toBe("active");
    // Reinstating does not bring the ended sessions back: the account signs in afresh.
    expect(await signedInAs(phone)).toBeNull();
    expect(await signedInAs(laptop)).toBeNull();
    expect(await signedInAs(await signedInCookie(target))).toBe(target.id);
    expect(await setAccountStatus(admin, admin.id, "suspended")).toMatchObject({ ok: false });
  });
});

describe("account list", () => {
  it("finds accounts by part of the address or name, treating % and _ literally", async () => {
    await sessionUserOf("findme");
    const found = await listAccounts({ query: `${RUN}-findme`, page: 1 });
    expect(found.accounts.map((a) => a.email)).toEqual([testEmail("findme")]);
    expect((await listAccounts({ query: `${RUN}%findme`, page: 1 })).total).toBe(0);
  });
});

describe("review desk queue", () => {
  it("lists held listings and workshop applications, and nothing that is not waiting", async () => {
    const owner = await sessionUserOf("workshop-owner", ["seller"]);
    const verifiedOwner = await sessionUserOf("verified-owner", ["workshop"]);
    const applied = await Workshop.create({
      ownerId: owner.id,
      name: `Quietwater Valve Works ${RUN}`,
      slug: `quietwater-${RUN}`,
      about: null,
      country: "NL",
      region: null,
      town: "Eastmoor",
      verifiedAt: null,
    });
    const verified = await Workshop.create({
      ownerId: verifiedOwner.id,
      name: `Settled Bench ${RUN}`,
      slug: `settled-${RUN}`,
      about: null,
      country: "NL",
      region: null,
      town: null,
      verificationStatus: "verified",
      verifiedAt: new Date(),
    });
    const base = {
      sellerId: owner.id,
      category: "integrated_amplifier" as const,
      maker: "Harrowgate",
      priceMinor: 42_000,
      country: "NL",
      cosmeticGrade: "clean" as const,
      serviceState: "serviced_measured" as const,
      publishedAt: new Date(),
    };
    const held = await Listing.create(
      blankListing(owner.id, base.category, {
        ...base,
        model: `Held ${RUN}`,
        status: "held",
        heldReason: "Power claim above the supply's limit",
      }),
    );
    const live = await Listing.create(blankListing(owner.id, base.category, { ...base, model: `Live ${RUN}`, status: "live" }));

    const queue = await deskQueue();
    expect(queue.items).toContainEqual(
      expect.objectContaining({
        kind: "held_listing",
        subject: { type: "listing", id: (held as { id: string }).id },
        title: `Harrowgate Held ${RUN}`,
        summary: "Integrated amplifier · Person workshop-owner · Power claim above the supply's limit",
        href: `/desk/listings/${(held as { id: string }).id}`,
      }),
    );
    expect(queue.items.map((i) => i.subject.id)).not.toContain((live as { id: string }).id);
    const applications = (await deskQueue({ kind: "workshop_application" })).items;
    expect(applications).toContainEqual(
      expect.objectContaining({ subject: { type: "workshop", id: applied.id }, title: `Quietwater Valve Works ${RUN}` }),
    );
    expect(applications.every((i) => i.kind === "workshop_application")).toBe(true);
    expect(applications.map((w) => w.subject.id)).not.toContain(verified.id);
    expect(queue.counts.held_listing).toBeGreaterThanOrEqual(1);
    expect(queue.counts.workshop_application).toBeGreaterThanOrEqual(1);
  });
});
