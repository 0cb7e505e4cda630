// The one shape of a record id (PostgreSQL uuid), without zod: public pages (the compare toggle on
// every card) test ids with it, and importing shared/ids.ts there would bring zod to every page once
// any browser module uses idSchema.
export const UUID_PATTERN = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export function isId(value: unknown): value is string {
  return typeof value === "string" && UUID_PATTERN.test(value);
}
