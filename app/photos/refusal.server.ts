import { HttpError, ERROR_CODES } from "~/http/errors.server";

// A photo request the server turns down, with a code for programs and a sentence for the seller, in
// the API's one error shape. The HTTP status comes with the code.

export type RefusalCode =
  | "no_file"
  | "one_file_only"
  | "bad_request"
  | "empty_file"
  | "file_too_large"
  | "unsupported_type"
  | "damaged_file"
  | "truncated_file"
  | "too_many_pixels"
  | "too_large_to_process"
  | "too_many_photos"
  | "listing_closed"
  | "bad_order"
  | "bad_cover"
  | "not_found"
  | "storage_unavailable";

export class PhotoRefusal extends HttpError {
  override name = "PhotoRefusal";
  declare readonly code: RefusalCode;
  constructor(code: RefusalCode, message: string) {
    super(ERROR_CODES[code], code, message);
  }
}

export function photoNotFound(): PhotoRefusal {
  return new PhotoRefusal("not_found", "This listing has no such photo; it may have been deleted already.");
}
