// The API's one error shape: { error, message, issues? }. `error` is a stable lower_snake code
// (listed in docs/api.md), `message` is written for a person, `issues` name the fields at fault.

export type Issue = { path: string; message: string };

export const ERROR_CODES = {
  invalid: 400,
  invalid_json: 400,
  bad_request: 400,
  unauthenticated: 401,
  forbidden: 403,
  cross_origin: 403,
  not_found: 404,
  method_not_allowed: 405,
  conflict: 409,
  too_large: 413,
  unsupported_media_type: 415,
  unprocessable: 422,
  rate_limited: 429,
  server_error: 500,
  unavailable: 503,
} as const;
export type ErrorCode = keyof typeof ERROR_CODES;

export interface ApiErrorBody {
  error: string;
  message: string;
  issues?: Issue[];
}

/** Thrown anywhere below a route; `apiRoute` (or React Router itself) turns it into its Response. */
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
