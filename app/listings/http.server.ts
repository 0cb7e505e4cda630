import { data } from "react-router";
import { ITEM_FORM_FIELD, type FieldErrors } from "@shared/listing-draft";
import { ListingInputError, ListingNotFound, ListingStateError, type Issue } from "./errors.server";

// The listing services' refusals on pages: a 404 page or field messages. (The API answers them as
// they are: they are HttpErrors in the one shape.)

/** For page loaders and actions: someone else's (or no) listing is a plain 404 page. */
export function notFoundPage(): never {
  throw data(
    { message: "There is no listing of yours at this address. It may belong to someone else, or it was never made." },
    { status: 404, statusText: "Not Found" },
  );
}

export type StepFailure = { ok: false; errors: FieldErrors; formError: string | undefined };

/** Service refusals as the step forms show them: messages next to fields, or one for the whole form. */
export function stepFailure(e: unknown, fieldOf: Record<string, string | undefined> = {}): StepFailure {
  if (e instanceof ListingNotFound) notFoundPage();
  if (e instanceof ListingInputError)
    return { ok: false, errors: issuesToForm(e.issues, fieldOf), formError: e.issues.length > 1 ? e.message : undefined };
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
