import { z } from "zod";

// The one shape of a record id (PostgreSQL uuid), for route params, JSON bodies and job data.
export const UUID_PATTERN = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export function isId(value: unknown): value is string {
  return typeof value === "string" && UUID_PATTERN.test(value);
}

/** zod schema for an id; `what` names it in the message ("must be a photo id"). */
export function idSchema(what = "record") {
  return z.string().regex(UUID_PATTERN, `must be a ${what} id`);
}
