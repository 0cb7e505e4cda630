// Roles are a set on the account (isomorphic: the UI shows them, the server enforces them).
// Every account is a buyer; the others are granted.
export const ROLES = ["buyer", "seller", "workshop", "moderator", "admin"] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  buyer: "Buyer",
  seller: "Private seller",
  workshop: "Workshop",
  moderator: "Moderator",
  admin: "Admin",
};

export const ROLE_DESCRIPTIONS: Record<Role, string> = {
  buyer: "Every account: search, watch, make offers, buy.",
  seller: "Lists a few units of their own.",
  workshop: "A restoration business whose bench sheets the market relies on.",
  moderator: "Works the review desk.",
  admin: "Roles, fees and marketplace settings; includes everything a moderator may do.",
};

// What each role includes besides itself (README, "Roles"): an admin can do whatever a moderator can,
// a workshop whatever a private seller can, and every account is a buyer. Nothing includes admin, and
// working the desk does not make anyone a seller. Accounts store only the roles granted; checks go
// through holdsRole so a granted role brings the ones it includes.
export const ROLE_INCLUDES: Record<Role, readonly Role[]> = {
  buyer: [],
  seller: ["buyer"],
  workshop: ["seller"],
  moderator: ["buyer"],
  admin: ["moderator"],
};

/** Whether an account granted `granted` holds `role`, directly or through a role that includes it. */
export function holdsRole(granted: readonly Role[], role: Role): boolean {
  const seen = new Set<Role>();
  const queue: Role[] = ["buyer", ...granted];
  while (queue.length) {
    const r = queue.pop()!;
    if (r === role) return true;
    if (seen.has(r) || !isRole(r)) continue;
    seen.add(r);
    queue.push(...ROLE_INCLUDES[r]);
  }
  return false;
}

export function isRole(value: unknown): value is Role {
  return typeof value === "string" && (ROLES as readonly string[]).includes(value);
}

/** Normalises a role list: known roles only, buyer always present, in canonical order. */
export function normaliseRoles(roles: readonly string[]): Role[] {
  const set = new Set<string>(roles);
  set.add("buyer");
  return ROLES.filter((r) => set.has(r));
}
