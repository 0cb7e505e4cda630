// What a listing's photos may be. Isomorphic: the uploader warns early with the same numbers the
// server enforces.

export const PHOTO_LIMITS = {
  /** Photos per listing. */
  maxPhotos: 24,
  /** Bytes per file (20 MB, counted as 20 × 1024 × 1024). */
  maxBytes: 20 * 1024 * 1024,
  /** Decoding a bigger image would need more memory than one photo deserves (4 bytes per pixel). */
  maxMegapixels: 50,
  acceptedTypes: ["image/jpeg", "image/png"] as const,
} as const;

/** Long edge in pixels of each derived size; smaller images are never enlarged. */
export const PHOTO_SIZES = { thumb: 400, listing: 1200, zoom: 2400 } as const;
export type PhotoSize = keyof typeof PHOTO_SIZES;

/** `20 MB`, `1.4 MB`, `812 kB` — binary multiples, as the limit above. */
export function formatBytes(bytes: number): string {
  if (bytes >= 1024 * 1024) {
    const mb = bytes / (1024 * 1024);
    return `${mb >= 10 || Number.isInteger(mb) ? Math.round(mb) : mb.toFixed(1)} MB`;
  }
  if (bytes >= 1024) return `${Math.round(bytes / 1024)} kB`;
  return `${bytes} bytes`;
}

/** What the photo API answers for one photo (GET list, POST upload). */
export interface PhotoView {
  id: string;
  position: number;
  isCover: boolean;
  status: "processing" | "ready" | "failed";
  width: number | null;
  height: number | null;
  /** Why processing failed, in words for the seller. */
  error: string | null;
  /** Owner-only image addresses, present once the photo is ready. */
  urls: Record<PhotoSize, string> | null;
}

export interface PhotoListView {
  photos: PhotoView[];
  maxPhotos: number;
  maxBytes: number;
}

/** Body of every refusal from the photo API. */
export interface PhotoApiError {
  error: string;
  message: string;
}
