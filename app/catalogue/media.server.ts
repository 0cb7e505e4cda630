import { Readable } from "node:stream";
import { getObject } from "~/services/storage.server";
import { PUBLIC_PHOTO_PREFIXES } from "./media-url";

// Serves photo sizes from object storage. Only the derived sizes (metadata stripped by the photo
// pipeline) are public; originals may carry a camera's location and are never served here.
// Keys are random and never rewritten, so responses are cacheable for a year.

const KEY_SHAPE = /^photos\/(thumb|listing|zoom)\/\d{4}\/\d{2}\/[0-9a-f-]{36}\.(jpg|png|webp)$/;
const TYPES: Record<string, string> = { jpg: "image/jpeg", png: "image/png", webp: "image/webp" };

export function isPublicMediaKey(key: string): boolean {
  return PUBLIC_PHOTO_PREFIXES.some((p) => key.startsWith(p)) && KEY_SHAPE.test(key);
}

export async function mediaResponse(key: string, request: Request): Promise<Response> {
  if (!isPublicMediaKey(key)) return notFound();
  const obj = await getObject(key);
  if (!obj) return notFound();
  const ext = key.slice(key.lastIndexOf(".") + 1);
  const headers = new Headers({
    "Content-Type": TYPES[ext],
    "Cache-Control": "public, max-age=31536000, immutable",
    "X-Content-Type-Options": "nosniff",
    "Content-Security-Policy": "default-src 'none'; sandbox",
  });
  if (obj.etag) headers.set("ETag", obj.etag);
  if (obj.lastModified) headers.set("Last-Modified", obj.lastModified.toUTCString());
  if (obj.etag && request.headers.get("If-None-Match") === obj.etag) {
    obj.body.destroy();
    return new Response(null, { status: 304, headers });
  }
  if (obj.contentLength !== undefined) headers.set("Content-Length", String(obj.contentLength));
  if (request.method === "HEAD") {
    obj.body.destroy();
    return new Response(null, { status: 200, headers });
  }
  return new Response(Readable.toWeb(obj.body) as ReadableStream, { status: 200, headers });
}

function notFound(): Response {
  return new Response("Not found", { status: 404, headers: { "Content-Type": "text/plain; charset=utf-8", "Cache-Control": "no-store" } });
}
