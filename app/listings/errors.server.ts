// What the listing services refuse with. Route modules turn these into a 404 page, field messages or JSON.

export type Issue = { path: string; message: string };

/** No listing with that id belongs to this account (also for someone else's: they get the same 404). */
export class ListingNotFound extends Error {
  override name = "ListingNotFound";
  constructor() {
    super("No listing of yours has that address.");
  }
}

/** Input that does not fit; `issues` name the fields (paths as the API sends them, or form field names). */
export class ListingInputError extends Error {
  override name = "ListingInputError";
  constructor(
    readonly issues: Issue[],
    message = issues[0]?.message ?? "Some fields need attention.",
  ) {
    super(message);
  }
}

/** The listing is in a state that does not allow this (sold, removed, already live …). */
export class ListingStateError extends Error {
  override name = "ListingStateError";
  constructor(
    message: string,
    readonly code = "conflict",
  ) {
    super(message);
  }
}
