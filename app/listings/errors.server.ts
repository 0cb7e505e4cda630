import { HttpError, type Issue } from "~/http/errors.server";

// What the listing services refuse with: HttpErrors in the API's one shape. Route modules turn them
// into a 404 page or field messages; the API answers them as they are.

export type { Issue };

/** No listing with that id belongs to this account (also for someone else's: they get the same 404). */
export class ListingNotFound extends HttpError {
  override name = "ListingNotFound";
  constructor() {
    super(404, "not_found", "No listing of yours has that address.");
  }
}

/** Input that does not fit; `issues` name the fields (paths as the API sends them, or form field names). */
export class ListingInputError extends HttpError {
  override name = "ListingInputError";
  declare readonly issues: Issue[];
  constructor(issues: Issue[], message = issues[0]?.message ?? "Some fields need attention.") {
    super(400, "invalid", message, issues);
  }
}

/** The listing is in a state that does not allow this (sold, removed, already live …). */
export class ListingStateError extends HttpError {
  override name = "ListingStateError";
  constructor(message: string, code: "conflict" | "sold" | "removed" | "published" | "not_published" = "conflict") {
    super(409, code, message);
  }
}
