import { describe, expect, it } from "vitest";
import { holdsRole, ROLES, type Role } from "~/auth/roles";
import { hasRole } from "~/auth/guards.server";
import { canViewListing, isModerator } from "~/listings/visibility";

// The role hierarchy as README's roles table states it: which granted role brings which others.
const HOLDS: Record<Role, Role[]> = {
  buyer: ["buyer"],
  seller: ["buyer", "seller"],
  workshop: ["buyer", "seller", "workshop"],
  moderator: ["buyer", "moderator"],
  admin: ["buyer", "moderator", "admin"],
};

describe("role hierarchy", () => {
  it.each(ROLES)("an account granted %s holds exactly the roles the table lists", (granted) => {
    expect(ROLES.filter((r) => holdsRole([granted], r))).toEqual(HOLDS[granted]);
    expect(ROLES.filter((r) => hasRole({ roles: [granted] }, r))).toEqual(HOLDS[granted]);
  });

  it("nothing includes admin, and the desk does not make anyone a seller", () => {
    expect(holdsRole(["moderator", "workshop", "seller"], "admin")).toBe(false);
    expect(holdsRole(["moderator"], "seller")).toBe(false);
    expect(holdsRole(["seller"], "workshop")).toBe(false);
  });

  it("an admin is a moderator where listings are shown: held, withdrawn and removed units, never drafts", () => {
    const admin = { id: "a", roles: ["buyer", "admin"] as Role[] };
    expect(isModerator(admin)).toBe(true);
    for (const status of ["held", "withdrawn", "removed"] as const) expect(canViewListing(status, "seller-id", admin)).toBe(true);
    expect(canViewListing("draft", "seller-id", admin)).toBe(false);
    expect(canViewListing("held", "seller-id", { id: "b", roles: ["buyer", "workshop"] })).toBe(false);
  });
});
