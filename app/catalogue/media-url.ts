// Where the browser fetches a stored photo size. Keys are random, so the URL is unguessable;
// the /media route serves derived sizes only (see media.server.ts).
export function mediaUrl(key: string): string {
  return `/media/${key.split("/").map(encodeURIComponent).join("/")}`;
}

/** Key prefixes of the sizes made for the public (metadata stripped); originals live elsewhere. */
export const PUBLIC_PHOTO_PREFIXES = ["photos/thumb/", "photos/listing/", "photos/zoom/"] as const;

/** S3 key for a new photo size, e.g. photoKeyPrefix("thumb") → "photos/thumb". */
export function photoKeyPrefix(size: "thumb" | "listing" | "zoom" | "original"): string {
  return size === "original" ? "originals/photos" : `photos/${size}`;
}
