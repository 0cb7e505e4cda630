import { ListObjectsV2Command } from "@aws-sdk/client-s3";
import { randomBytes } from "node:crypto";
import { QueryTypes } from "sequelize";
import { sequelize } from "~/db.server";
import { env } from "~/env.server";
import { User } from "~/models/user.server";
import { Listing, ListingPhoto } from "~/models/index.server";
import { photoKeys } from "~/photos/access.server";
import { signedInCookie } from "../support/sessions";
import { createStorageClient, deleteObjects } from "~/services/storage.server";
import { QUEUES } from "~/services/jobs.server";
import { action as photosAction, loader as photosLoader } from "~/routes/api.v1.listings.$id.photos";
import { action as photoAction } from "~/routes/api.v1.listings.$id.photos.$photoId";
import { routeArgs } from "../support/route-args";
import { blankListing } from "../support/blank-listing";

// Shared by the photo integration suites: sellers with session cookies, draft listings, the photo
// routes called as the server would call them, and what object storage and the queue hold.

const BASE = "http://127.0.0.1";
export const RUN = randomBytes(4).toString("hex");

export async function makeSeller(label: string): Promise<{ user: User; cookie: string }> {
  const user = await User.create({
    email: `photos-it-${RUN}-${label}@example.test`,
    displayName: `Photo test ${label}`,
    passwordHash: null,
    emailVerifiedAt: new Date(),
    lastSignInAt: null,
  });
  return { user, cookie: await signedInCookie(user) };
}

export function makeDraft(sellerId: string): Promise<Listing> {
  return Listing.create(blankListing(sellerId, "integrated_amplifier"));
}

export async function removeSellers(ids: string[]) {
  const listings = await Listing.findAll({ where: { sellerId: ids }, attributes: ["id"] });
  const photos = await ListingPhoto.findAll({ where: { listingId: listings.map((l) => l.id) } });
  await deleteObjects(photos.flatMap(photoKeys));
  await Listing.destroy({ where: { sellerId: ids } });
  await User.destroy({ where: { id: ids } });
}

async function call(run: () => Promise<Response>): Promise<Response> {
  try {
    return await run();
  } catch (thrown) {
    if (thrown instanceof Response) return thrown;
    throw thrown;
  }
}

export function uploadRequest(listingId: string, file: Uint8Array, name: string, cookie?: string): Request {
  const form = new FormData();
  form.append("photo", new Blob([new Uint8Array(file)], { type: "image/jpeg" }), name);
  return new Request(`${BASE}/api/v1/listings/${listingId}/photos`, {
    method: "POST",
    body: form,
    headers: cookie ? { Cookie: cookie } : {},
  });
}

export const upload = (listingId: string, file: Uint8Array, name: string, cookie?: string) =>
  call(() => photosAction(routeArgs(uploadRequest(listingId, file, name, cookie), { id: listingId })));

export const listPhotos = (listingId: string, cookie?: string) =>
  call(() =>
    photosLoader(
      routeArgs(new Request(`${BASE}/api/v1/listings/${listingId}/photos`, { headers: cookie ? { Cookie: cookie } : {} }), {
        id: listingId,
      }),
    ),
  );

export const arrange = (listingId: string, body: unknown, cookie?: string) =>
  call(() =>
    photosAction(
      routeArgs(
        new Request(`${BASE}/api/v1/listings/${listingId}/photos`, {
          method: "PATCH",
          body: JSON.stringify(body),
          headers: { "Content-Type": "application/json", ...(cookie ? { Cookie: cookie } : {}) },
        }),
        { id: listingId },
      ),
    ),
  );

export const removePhoto = (listingId: string, photoId: string, cookie?: string) =>
  call(() =>
    photoAction(
      routeArgs(
        new Request(`${BASE}/api/v1/listings/${listingId}/photos/${photoId}`, {
          method: "DELETE",
          headers: cookie ? { Cookie: cookie } : {},
        }),
        { id: listingId, photoId },
      ),
    ),
  );

/** Every key under the prefixes the photo pipeline writes to. */
export async function photoObjectKeys(): Promise<Set<string>> {
  const client = createStorageClient();
  const keys = new Set<string>();
  for (const prefix of ["incoming/", "photos/", "originals/"]) {
    let token: string | undefined;
    do {
      const out = await client.send(new ListObjectsV2Command({ Bucket: env().s3.bucket, Prefix: prefix, ContinuationToken: token }));
      for (const o of out.Contents ?? []) keys.add(o.Key!);
      token = out.IsTruncated ? out.NextContinuationToken : undefined;
    } while (token);
  }
  return keys;
}

export async function photoJobCount(): Promise<number> {
  const rows = await sequelize.query<{ n: number }>(`SELECT count(*)::int AS n FROM pgboss.job WHERE name = $1`, {
    bind: [QUEUES.photoProcess],
    type: QueryTypes.SELECT,
  });
  return rows[0]?.n ?? 0;
}

export async function jobsFor(photoId: string): Promise<number> {
  const rows = await sequelize.query<{ n: number }>(`SELECT count(*)::int AS n FROM pgboss.job WHERE name = $1 AND data->>'photoId' = $2`, {
    bind: [QUEUES.photoProcess, photoId],
    type: QueryTypes.SELECT,
  });
  return rows[0]?.n ?? 0;
}
