import { createHmac, timingSafeEqual } from "node:crypto";
import { Readable } from "node:stream";
import { isId } from "@shared/ids";
import { env } from "~/env.server";
import { hasRole, type SessionUser } from "~/auth/guards.server";
import { Order, OrderContest } from "~/models/index.server";
import { getObject, headObject } from "~/services/storage.server";
import type { Clock } from "./clock.server";
import { cleanContestKey } from "./contest-photos.server";

// Short-lived links to a contest's photos, for the buyer who sent them and for moderators (admins
// included). A link names the order, the photo, its viewer and an expiry, signed with an HMAC of the
// session secret: it opens nothing for anyone else, and nothing after it expires (the page that shows
// it makes a fresh one each time). Only the metadata-free copy is served, never cached.

export const CONTEST_PHOTO_LINK_SECONDS = 5 * 60;

export interface ContestPhotoLink {
  href: string;
  /** False while the worker is still making the metadata-free copy (or it could not be read). */
  ready: boolean;
}

type Viewer = Pick<SessionUser, "id" | "roles">;

function key(secret: string): Buffer {
  // A key of its own, derived from the session secret, so a link's signature never signs a cookie.
  return createHmac("sha256", secret).update("loadline contest photo links").digest();
}

function signature(secret: string, orderId: string, index: number, viewerId: string, until: number): string {
  return createHmac("sha256", key(secret)).update(`${orderId}:${index}:${viewerId}:${until}`).digest("base64url");
}

export function contestPhotoHref(orderId: string, index: number, viewerId: string, clock: Clock): string {
  const until = Math.floor(clock.now().getTime() / 1000) + CONTEST_PHOTO_LINK_SECONDS;
  const sig = signature(env().sessionSecrets[0], orderId, index, viewerId, until);
  return `/orders/${orderId}/contest-photos/${index}?until=${until}&sig=${sig}`;
}

export type LinkCheck = "ok" | "expired" | "invalid";

/** Whether a link's signature is one we made for this order, photo and viewer, and is still in time. */
export function checkContestPhotoLink(
  link: { orderId: string; index: number; viewerId: string; until: string | null; sig: string | null },
  clock: Clock,
): LinkCheck {
  if (!link.until || !/^\d{1,12}$/.test(link.until) || !link.sig) return "invalid";
  const until = Number(link.until);
  const given = Buffer.from(link.sig);
  // Any of the session secrets (a rotation keeps links made a moment before it working).
  const signed = env().sessionSecrets.some((secret) => {
    const want = Buffer.from(signature(secret, link.orderId, link.index, link.viewerId, until));
    return want.length === given.length && timingSafeEqual(want, given);
  });
  if (!signed) return "invalid";
  return clock.now().getTime() >= until * 1000 ? "expired" : "ok";
}

/** May this viewer see this order's contest photos at all: its buyer, or a moderator. */
function maySee(order: Pick<Order, "buyerId">, viewer: Viewer): boolean {
  return order.buyerId === viewer.id || hasRole(viewer, "moderator");
}

/** Fresh links to the contest's photos for a viewer who may see them; none for anyone else. */
export async function contestPhotoLinks(orderId: string, viewer: Viewer, clock: Clock): Promise<ContestPhotoLink[]> {
  const [order, contest] = await Promise.all([
    Order.findByPk(orderId, { attributes: ["id", "buyerId"] }),
    OrderContest.findByPk(orderId, { attributes: ["orderId", "photoKeys"] }),
  ]);
  if (!order || !contest || !maySee(order, viewer)) return [];
  return Promise.all(
    contest.photoKeys.map(async (upload, i) => ({
      href: contestPhotoHref(orderId, i, viewer.id, clock),
      ready: !!(await headObject(cleanContestKey(upload))),
    })),
  );
}

const text = (status: number, body: string) =>
  new Response(body, { status, headers: { "Content-Type": "text/plain; charset=utf-8", "Cache-Control": "no-store" } });

/** The photo behind a link: 404 for anyone else or a forged link, 410 once it has expired. */
export async function contestPhotoResponse(
  request: Request,
  params: { orderId?: string; n?: string },
  viewer: Viewer,
  clock: Clock,
): Promise<Response> {
  const notFound = () => text(404, "Not found");
  const { orderId = "", n = "" } = params;
  if (!isId(orderId) || !/^\d{1,2}$/.test(n)) return notFound();
  const index = Number(n);
  const order = await Order.findByPk(orderId, { attributes: ["id", "buyerId"] });
  if (!order || !maySee(order, viewer)) return notFound();
  const url = new URL(request.url);
  const check = checkContestPhotoLink(
    { orderId, index, viewerId: viewer.id, until: url.searchParams.get("until"), sig: url.searchParams.get("sig") },
    clock,
  );
  if (check === "invalid") return notFound();
  if (check === "expired") return text(410, "This link has expired. Open the photo again from the order's page.");
  const contest = await OrderContest.findByPk(orderId, { attributes: ["orderId", "photoKeys"] });
  const upload = contest?.photoKeys[index];
  const obj = upload ? await getObject(cleanContestKey(upload)) : null;
  if (!obj) return notFound();
  const headers = new Headers({
    "Content-Type": "image/jpeg",
    "Cache-Control": "private, no-store",
    "X-Content-Type-Options": "nosniff",
    "Content-Security-Policy": "default-src 'none'; sandbox",
    "Referrer-Policy": "no-referrer",
  });
  if (obj.contentLength !== undefined) headers.set("Content-Length", String(obj.contentLength));
  if (request.method === "HEAD") {
    obj.body.destroy();
    return new Response(null, { status: 200, headers });
  }
  return new Response(Readable.toWeb(obj.body) as ReadableStream, { status: 200, headers });
}
