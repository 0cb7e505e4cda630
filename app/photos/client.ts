import { PHOTO_LIMITS, formatBytes, type PhotoListView, type PhotoView } from "./limits";

// The browser's side of the photo API: one XMLHttpRequest per file (fetch has no upload progress),
// JSON calls for the rest, and the small pure steps the uploader builds on.

export const photosPath = (listingId: string) => `/api/v1/listings/${encodeURIComponent(listingId)}/photos`;
export const photosQueryKey = (listingId: string) => ["listing-photos", listingId] as const;

export class PhotoApiFailure extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
  ) {
    super(message);
  }
}

async function readJson<T>(res: Response): Promise<T> {
  const body: unknown = await res.json().catch(() => null);
  if (!res.ok) throw failureFrom(res.status, body);
  return body as T;
}

function failureFrom(status: number, body: unknown): PhotoApiFailure {
  const b = (body ?? {}) as { error?: string; message?: string; reason?: string };
  if (status === 401) return new PhotoApiFailure(401, "unauthenticated", "Your session has ended; sign in again to manage photos.");
  const message =
    b.message ??
    b.reason ??
    (status === 0 ? "The connection dropped; check it and try again." : `The server answered ${status}; try again.`);
  return new PhotoApiFailure(status, b.error ?? "error", message);
}

export async function fetchPhotos(listingId: string): Promise<PhotoListView> {
  return readJson(await fetch(photosPath(listingId), { headers: { Accept: "application/json" } }));
}

export type ArrangeBody = { order?: string[]; coverId?: string };

export async function arrangePhotos(listingId: string, body: ArrangeBody): Promise<PhotoListView> {
  return readJson(
    await fetch(photosPath(listingId), {
      method: "PATCH",
      headers: { "Content-Type": "application/json", Accept: "application/json" },
      body: JSON.stringify(body),
    }),
  );
}

export async function deletePhoto(listingId: string, photoId: string): Promise<PhotoListView> {
  return readJson(
    await fetch(`${photosPath(listingId)}/${encodeURIComponent(photoId)}`, { method: "DELETE", headers: { Accept: "application/json" } }),
  );
}

export type SendResult = { ok: true; photo: PhotoView } | { ok: false; failure: PhotoApiFailure; aborted?: boolean };
export type SendHandle = { done: Promise<SendResult>; abort: () => void };

/** Uploads one file, reporting bytes sent; never rejects (a refusal is a result). */
export function sendPhoto(listingId: string, file: File, onProgress: (loaded: number, total: number) => void): SendHandle {
  const xhr = new XMLHttpRequest();
  let aborted = false;
  const done = new Promise<SendResult>((resolve) => {
    xhr.open("POST", photosPath(listingId));
    xhr.setRequestHeader("Accept", "application/json");
    xhr.responseType = "text";
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) onProgress(e.loaded, e.total);
    };
    xhr.onload = () => {
      let body: unknown = null;
      try {
        body = JSON.parse(xhr.responseText);
      } catch {
        // a proxy's HTML error page, say
      }
      if (xhr.status === 202 && body && typeof body === "object" && "photo" in body) {
        resolve({ ok: true, photo: (body as { photo: PhotoView }).photo });
      } else {
        resolve({ ok: false, failure: failureFrom(xhr.status, body) });
      }
    };
    xhr.onerror = () => resolve({ ok: false, failure: failureFrom(0, null) });
    xhr.onabort = () => resolve({ ok: false, aborted: true, failure: new PhotoApiFailure(0, "aborted", "Upload cancelled.") });
    const form = new FormData();
    form.append("photo", file, file.name);
    xhr.send(form);
  });
  return {
    done,
    abort: () => {
      if (!aborted) {
        aborted = true;
        xhr.abort();
      }
    },
  };
}

/**
 * Which of the chosen files may be sent: the rest are refused here, before any byte leaves, with the
 * same limits the server holds (the server still checks everything).
 */
export function planSelection(
  files: ReadonlyArray<{ name: string; size: number }>,
  slotsLeft: number,
  limits: { maxPhotos: number; maxBytes: number } = PHOTO_LIMITS,
): Array<{ send: true } | { send: false; message: string }> {
  let slots = Math.max(0, slotsLeft);
  return files.map((file) => {
    if (file.size > limits.maxBytes) {
      return { send: false, message: `This file is ${formatBytes(file.size)}; photos may be at most ${formatBytes(limits.maxBytes)}.` };
    }
    if (slots === 0) {
      return { send: false, message: `A listing can have ${limits.maxPhotos} photos; this one was not sent. Delete one to make room.` };
    }
    slots -= 1;
    return { send: true };
  });
}

/** The ids with the one at `from` moved to `to`. */
export function moveId(ids: readonly string[], from: number, to: number): string[] {
  const next = [...ids];
  const [id] = next.splice(from, 1);
  next.splice(Math.max(0, Math.min(to, next.length)), 0, id);
  return next;
}

/** The list as it will be once the server applies `body` (for an immediate, optimistic redraw). */
export function applyArrange(list: PhotoListView, body: ArrangeBody): PhotoListView {
  let photos = [...list.photos];
  if (body.order) {
    const byId = new Map(photos.map((p) => [p.id, p]));
    photos = body.order.map((id) => byId.get(id)).filter((p): p is PhotoView => Boolean(p));
  }
  photos = photos.map((p, position) => ({ ...p, position, isCover: body.coverId ? p.id === body.coverId : p.isCover }));
  return { ...list, photos };
}
