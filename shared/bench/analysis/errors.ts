// One error type for every refused capture, so the API can answer with a machine code and a sentence.

export type CaptureErrorCode =
  | "FILE_TOO_LARGE"
  | "EMPTY_FILE"
  | "NOT_WAV"
  | "UNSUPPORTED_FORMAT"
  | "TOO_LONG"
  | "TOO_SHORT"
  | "CLIPPED"
  | "NO_FUNDAMENTAL"
  | "CSV_COLUMNS_MISSING"
  | "CSV_NOT_NUMBER"
  | "CSV_TOO_FEW_ROWS"
  | "CSV_NOT_INCREASING"
  | "SWEEP_INVALID"
  | "SQUARE_NO_EDGE"
  | "KIND_MISMATCH";

/** HTTP status that fits each code: 413 for size, 422 for a file we read but cannot accept. */
export const CAPTURE_ERROR_STATUS: Record<CaptureErrorCode, 413 | 422> = {
  FILE_TOO_LARGE: 413,
  EMPTY_FILE: 422,
  NOT_WAV: 422,
  UNSUPPORTED_FORMAT: 422,
  TOO_LONG: 422,
  TOO_SHORT: 422,
  CLIPPED: 422,
  NO_FUNDAMENTAL: 422,
  CSV_COLUMNS_MISSING: 422,
  CSV_NOT_NUMBER: 422,
  CSV_TOO_FEW_ROWS: 422,
  CSV_NOT_INCREASING: 422,
  SWEEP_INVALID: 422,
  SQUARE_NO_EDGE: 422,
  KIND_MISMATCH: 422,
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

  toJSON(): { error: CaptureErrorCode; message: string; details?: Record<string, unknown> } {
    return this.details ? { error: this.code, message: this.message, details: this.details } : { error: this.code, message: this.message };
  }
}

export function isCaptureError(e: unknown): e is CaptureError {
  return e instanceof CaptureError;
}
