import { data } from "react-router";
import { CAPTURE_ERROR_STATUS } from "@shared/bench/analysis/errors";

// The API's one error shape: { error, message, issues? }. `error` is a stable lower_snake code
// (every one is listed in docs/api.md), `message` is written for a person, `issues` name the fields
// at fault. Pages show the same errors through the error boundary (`pageError`).

export type Issue = { path: string; message: string };

export const ERROR_CODES = {
  // The request itself
  bad_request: 400,
  invalid_json: 400,
  invalid: 400,
  invalid_sheet: 400,
  invalid_conditions: 400,
  invalid_signature: 400,
  no_file: 400,
  one_file_only: 400,
  unauthenticated: 401,
  forbidden: 403,
  cross_origin: 403,
  not_found: 404,
  method_not_allowed: 405,
  too_large: 413,
  unsupported_media_type: 415,
  unsupported_type: 415,
  rate_limited: 429,
  // The listing's state does not allow it
  conflict: 409,
  sold: 409,
  removed: 409,
  published: 409,
  not_published: 409,
  // An order's state (or its unit's) does not allow the step
  order_state: 409,
  // Something done once only (a review of an order, its answer, hiding it) was already done
  already_done: 409,
  // An offer that was answered, withdrawn or has expired
  offer_closed: 409,
  // The review desk: another moderator holds the item; the item has moved on since the page was read
  item_taken: 409,
  item_state: 409,
  // A file that was read but cannot be used (photos; empty_file and file_too_large come with the capture codes)
  damaged_file: 422,
  truncated_file: 422,
  too_many_pixels: 422,
  too_large_to_process: 422,
  too_many_photos: 422,
  listing_closed: 422,
  bad_order: 422,
  bad_cover: 422,
  // A capture that cannot be measured (also a failed capture's `error.error`): the bench's own table
  ...CAPTURE_ERROR_STATUS,
  file_lost: 422,
  // A signed link past its time (the desk's private documents)
  link_expired: 410,
  // Ours
  server_error: 500,
  unavailable: 503,
  storage_unavailable: 503,
} as const;
export type ErrorCode = keyof typeof ERROR_CODES;

export function isErrorCode(code: string): code is ErrorCode {
  return Object.hasOwn(ERROR_CODES, code);
}

export interface ApiErrorBody {
  error: string;
  message: string;
  issues?: Issue[];
}

/** Thrown anywhere below a route; `apiRoute` turns it into its Response, `pageError` into an error page. */
export class HttpError extends Error {
  override name = "HttpError";
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly issues?: Issue[],
    readonly headers: HeadersInit = {},
  ) {
    super(message);
  }

  toJSON(): ApiErrorBody {
    return { error: this.code, message: this.message, ...(this.issues?.length ? { issues: this.issues } : {}) };
  }

  toResponse(): Response {
    const headers = new Headers(this.headers);
    headers.set("Cache-Control", "no-store");
    return Response.json(this.toJSON(), { status: this.status, headers });
  }
}

/** An HttpError with the status its code stands for, to throw from services and helpers. */
export function refusal(code: ErrorCode, message: string, options: { issues?: Issue[]; headers?: HeadersInit } = {}): HttpError {
  return new HttpError(ERROR_CODES[code], code, message, options.issues, options.headers);
}

/** An error Response in the one shape, for returning or throwing from a route. */
export function apiError(
  code: ErrorCode,
  message: string,
  options: { status?: number; issues?: Issue[]; headers?: HeadersInit } = {},
): Response {
  return new HttpError(options.status ?? ERROR_CODES[code], code, message, options.issues, options.headers).toResponse();
}

export function methodNotAllowed(allowed: readonly string[], message = `Use ${allowed.join(" or ")} here.`): Response {
  return apiError("method_not_allowed", message, { headers: { Allow: allowed.join(", ") } });
}

const SERVER_ERROR = "Something went wrong on our side; try again in a moment.";

/** Whatever a handler threw, as the API answers it: refusals in the one shape, anything unexpected as a logged 500. */
export function errorResponse(error: unknown): Response {
  if (error instanceof Response) return error;
  if (error instanceof HttpError) return error.toResponse();
  console.error("[api]", error);
  return apiError("server_error", SERVER_ERROR);
}

const STATUS_TEXT: Record<number, string> = {
  400: "Bad Request",
  403: "Forbidden",
  404: "Not Found",
  405: "Method Not Allowed",
  409: "Conflict",
  413: "Content Too Large",
  415: "Unsupported Media Type",
  410: "Gone",
  422: "Unprocessable Content",
};

/**
 * For page loaders and actions: an HttpError becomes a thrown `data({ message }, { status })`, which
 * the error boundary shows; anything else is thrown on unchanged.
 */
export function pageError(error: unknown): never {
  if (error instanceof HttpError) {
    throw data(
      { message: error.message, error: error.code },
      { status: error.status, statusText: STATUS_TEXT[error.status], headers: error.headers },
    );
  }
  throw error;
}
