import type { z } from "zod";
import { BODY_LIMITS, readJson } from "~/http/body.server";
import { refusal, type Issue } from "~/http/errors.server";

// The threads and offers API's bodies: small JSON read through the one reader, parsed with zod,
// every problem named by its field.

export function zodIssues(error: z.ZodError): Issue[] {
  return error.issues.map((i) => ({ path: i.path.join(".") || "(body)", message: i.message }));
}

export async function readBody<T>(request: Request, schema: z.ZodType<T>): Promise<T> {
  const parsed = schema.safeParse(await readJson(request, BODY_LIMITS.form));
  if (!parsed.success) {
    const issues = zodIssues(parsed.error);
    throw refusal("invalid", issues[0]?.message ?? "Check the request.", { issues });
  }
  return parsed.data;
}
