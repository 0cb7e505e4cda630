import { data } from "react-router";
import { ITEM_FORM_FIELD, type FieldErrors } from "@shared/listing-draft";
import { ListingInputError, ListingNotFound, ListingStateError, type Issue } from "./errors.server";

// The listing services' refusals as HTTP: JSON for the API, a 404 page or field messages for pages.

const json = (body: unknown, status: number) => Response.json(body, { status, headers: { "Cache-Control": "no-store" } });

/** Runs an API handler; refusals become JSON with a reason and, for bad input, the paths. */
export async function listingApi(work: () => Promise<Response>): Promise<Response> {
  try {
    return await work();
  } catch (e) {
    if (e instanceof Response) throw e;
    if (e instanceof ListingNotFound) return json({ error: "not_found", message: e.message }, 404);
    if (e instanceof ListingInputError) return json({ error: "invalid", message: e.message, issues: e.issues }, 400);
    if (e instanceof ListingStateError) return json({ error: e.code, message: e.message }, 409);
    throw e;
  }
}

/** For page loaders and actions: someone else's (or no) listing is a plain 404 page. */
export function notFoundPage(): never {
  throw data({ message: "There is no listing of yours at this address. It may belong to someone else, or it was never made." }, { status: 404, statusText: "Not Found" });
}

export type StepFailure = { ok: false; errors: FieldErrors; formError: string | undefined };

/** Service refusals as the step forms show them: messages next to fields, or one for the whole form. */
export function stepFailure(e: unknown, fieldOf: Record<string, string | undefined> = {}): StepFailure {
  if (e instanceof ListingNotFound) notFoundPage();
  if (e instanceof ListingInputError) return { ok: false, errors: issuesToForm(e.issues, fieldOf), formError: e.issues.length > 1 ? e.message : undefined };
  if (e instanceof ListingStateError) return { ok: false, errors: {}, formError: e.message };
  // Unknown failures are not the seller's to fix: let the error page say so.
  throw e;
}

export function issuesToForm(issues: Issue[], fieldOf: Record<string, string | undefined> = ITEM_FORM_FIELD): FieldErrors {
  const out: FieldErrors = {};
  for (const i of issues) {
    const head = i.path.split(".")[0] ?? "form";
    const name = fieldOf[head] ?? (i.path || "form");
    out[name] ??= i.message;
  }
  return out;
}

/** Reads a JSON body of at most `maxBytes`, or refuses with a reason. */
export async function readJsonBody(request: Request, maxBytes: number): Promise<unknown> {
  const type = request.headers.get("Content-Type") ?? "";
  if (!type.includes("application/json")) throw json({ error: "unsupported_media_type", message: "Send the body as application/json." }, 415);
  const text = await request.text();
  if (text.length > maxBytes) throw json({ error: "too_large", message: `The body may be at most ${Math.round(maxBytes / 1024)} KB.` }, 413);
  try {
    return JSON.parse(text);
  } catch {
    throw json({ error: "invalid_json", message: "The body is not valid JSON." }, 400);
  }
}
