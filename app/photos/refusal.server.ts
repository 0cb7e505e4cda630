// A photo request the server turns down, with a code for programs and a sentence for the seller.
// The HTTP status travels with it so routes stay thin.

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

const STATUS: Record<RefusalCode, number> = {
  no_file: 400,
  one_file_only: 400,
  bad_request: 400,
  empty_file: 422,
  file_too_large: 413,
  unsupported_type: 415,
  damaged_file: 422,
  truncated_file: 422,
  too_many_pixels: 422,
  too_large_to_process: 422,
  too_many_photos: 422,
  listing_closed: 422,
  bad_order: 422,
  bad_cover: 422,
  not_found: 404,
  storage_unavailable: 503,
};

export class PhotoRefusal extends Error {
  readonly code: RefusalCode;
  readonly status: number;
  constructor(code: RefusalCode, message: string) {
    super(message);
    this.name = "PhotoRefusal";
    this.code = code;
    this.status = STATUS[code];
  }
  toJSON() {
    return { error: this.code, message: this.message };
  }
}

/** Same answer whether the listing is missing or someone else's, so ids reveal nothing. */
export function listingNotFound(): PhotoRefusal {
  return new PhotoRefusal("not_found", "There is no such listing among yours.");
}

export function photoNotFound(): PhotoRefusal {
  return new PhotoRefusal("not_found", "This listing has no such photo; it may have been deleted already.");
}
