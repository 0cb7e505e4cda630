// One error type for every refused capture, so the API can answer with a machine code and a sentence.

export type CaptureErrorCode =
  | "file_too_large"
  | "empty_file"
  | "not_wav"
  | "unsupported_format"
  | "too_long"
  | "too_short"
  | "clipped"
  | "no_fundamental"
  | "csv_columns_missing"
  | "csv_not_number"
  | "csv_too_few_rows"
  | "csv_not_increasing"
  | "sweep_invalid"
  | "square_no_edge"
  | "kind_mismatch"
  | "wrong_test_tone";

/** HTTP status that fits each code: 413 for size, 422 for a file we read but cannot accept. */
export const CAPTURE_ERROR_STATUS: Record<CaptureErrorCode, 413 | 422> = {
  file_too_large: 413,
  empty_file: 422,
  not_wav: 422,
  unsupported_format: 422,
  too_long: 422,
  too_short: 422,
  clipped: 422,
  no_fundamental: 422,
  csv_columns_missing: 422,
  csv_not_number: 422,
  csv_too_few_rows: 422,
  csv_not_increasing: 422,
  sweep_invalid: 422,
  square_no_edge: 422,
  kind_mismatch: 422,
  wrong_test_tone: 422,
};

export class CaptureError extends Error {
  readonly code: CaptureErrorCode;
  readonly status: 413 | 422;
  /** Extra facts for the caller (row number, sample rate found, …). */
  readonly details?: Record<string, unknown>;

  constructor(code: CaptureErrorCode, message: string, details?: Record<string, unknown>) {
    super(message);
    this.name = "CaptureError";
    this.code = code;
    this.status = CAPTURE_ERROR_STATUS[code];
    this.details = details;
  }

  /** The API's one error shape; `details` stay with the error for code that wants them. */
  toJSON(): { error: CaptureErrorCode; message: string } {
    return { error: this.code, message: this.message };
  }
}

export function isCaptureError(e: unknown): e is CaptureError {
  return e instanceof CaptureError;
}
