// Errors in Stripe's shape: {error: {type, code, message, param, ...}} with its HTTP statuses.

export type StripeErrorType = "invalid_request_error" | "card_error" | "idempotency_error" | "api_error";

export class StripeFakeError extends Error {
  constructor(
    readonly status: number,
    readonly type: StripeErrorType,
    message: string,
    readonly fields: { code?: string; param?: string; decline_code?: string; [key: string]: unknown } = {},
  ) {
    super(message);
  }

  toJSON() {
    return { error: { type: this.type, message: this.message, ...this.fields } };
  }
}

export const invalid = (message: string, param?: string, code = param ? "parameter_invalid" : undefined) =>
  new StripeFakeError(400, "invalid_request_error", message, { ...(code ? { code } : {}), ...(param ? { param } : {}) });

export const missingParam = (param: string) =>
  new StripeFakeError(400, "invalid_request_error", `Missing required param: ${param}.`, { code: "parameter_missing", param });

export const unknownParam = (param: string) =>
  new StripeFakeError(400, "invalid_request_error", `Received unknown parameter: ${param}`, { code: "parameter_unknown", param });

export const noSuch = (noun: string, id: string, param = "id") =>
  new StripeFakeError(404, "invalid_request_error", `No such ${noun}: '${id}'`, { code: "resource_missing", param });

export const unexpectedState = (message: string) =>
  new StripeFakeError(400, "invalid_request_error", message, { code: "payment_intent_unexpected_state" });
