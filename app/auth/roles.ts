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
  admin: "Roles, fees and marketplace settings.",
};

export function isRole(value: unknown): value is Role {
  return typeof value === "string" && (ROLES as readonly string[]).includes(value);
}

/** Normalises a role list: known roles only, buyer always present, in canonical order. */
export function normaliseRoles(roles: readonly string[]): Role[] {
  const set = new Set<string>(roles);
  set.add("buyer");
  return ROLES.filter((r) => set.has(r));
}
