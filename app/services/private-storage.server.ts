import { DeleteObjectCommand, GetObjectCommand, PutObjectCommand } from "@aws-sdk/client-s3";
import type { Readable } from "node:stream";
import { env } from "~/env.server";
import { isMissing, s3 } from "~/services/storage.server";

// The private bucket: documents people hand us for checking (a workshop's registration papers). Its
// keys never reach /media (which reads only the media bucket); the desk opens them through its own
// short-lived signed links (app/workshops/document-link.server.ts).

const privateBucket = () => env().s3.privateBucket;

export async function putPrivateObject(key: string, body: Buffer, contentType: string): Promise<void> {
  await s3().send(
    new PutObjectCommand({ Bucket: privateBucket(), Key: key, Body: body, ContentType: contentType, ContentLength: body.length }),
  );
}

export async function getPrivateObject(key: string): Promise<{ body: Readable; contentLength?: number } | null> {
  try {
    const out = await s3().send(new GetObjectCommand({ Bucket: privateBucket(), Key: key }));
    return { body: out.Body as Readable, contentLength: out.ContentLength };
  } catch (err) {
    if (isMissing(err)) return null;
    throw err;
  }
}

export async function deletePrivateObject(key: string): Promise<void> {
  await s3().send(new DeleteObjectCommand({ Bucket: privateBucket(), Key: key }));
}
