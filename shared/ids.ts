import { z } from "zod";

import { UUID_PATTERN } from "./id-pattern";

// The one shape of a record id (PostgreSQL uuid), for route params, JSON bodies and job data.
export { UUID_PATTERN, isId } from "./id-pattern";

/** zod schema for an id; `what` names it in the message ("must be a photo id"). */
export function idSchema(what = "record") {
  return z.string().regex(UUID_PATTERN, `must be a ${what} id`);
}
