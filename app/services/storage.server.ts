import {
  AbortMultipartUploadCommand,
  CompleteMultipartUploadCommand,
  CreateBucketCommand,
  CreateMultipartUploadCommand,
  DeleteObjectCommand,
  DeleteObjectsCommand,
  GetObjectCommand,
  HeadBucketCommand,
  HeadObjectCommand,
  NotFound,
  NoSuchKey,
  PutObjectCommand,
  S3Client,
  S3ServiceException,
  UploadPartCommand,
} from "@aws-sdk/client-s3";
import { randomUUID } from "node:crypto";
import type { Readable } from "node:stream";
import { buffer } from "node:stream/consumers";
import { env, type Env } from "~/env.server";

// Photos and captures live in object storage; the database keeps only their keys.

export function createStorageClient(s3: Env["s3"] = env().s3): S3Client {
  return new S3Client({
    endpoint: s3.endpoint,
    region: s3.region,
    forcePathStyle: true,
    credentials: { accessKeyId: s3.accessKeyId, secretAccessKey: s3.secretAccessKey },
    // The local stand-in predates the SDK's default CRC32 trailers; checksums only where S3 demands them.
    ...(s3.mode === "fake"
      ? { requestChecksumCalculation: "WHEN_REQUIRED" as const, responseChecksumValidation: "WHEN_REQUIRED" as const }
      : {}),
  });
}

let client: S3Client | undefined;
/** The shared client (app/services/private-storage.server.ts uses it for the private bucket). */
export function s3(): S3Client {
  client ??= createStorageClient();
  return client;
}
const bucket = () => env().s3.bucket;

/** A fresh, unguessable key such as `photos/2026/12/3f…e1.jpg`. */
export function randomKey(prefix: string, ext: string): string {
  const now = new Date();
  const month = String(now.getUTCMonth() + 1).padStart(2, "0");
  const clean = prefix.replace(/^\/+|\/+$/g, "");
  const dot = ext.replace(/^\./, "").toLowerCase();
  return `${clean}/${now.getUTCFullYear()}/${month}/${randomUUID()}${dot ? `.${dot}` : ""}`;
}

export async function putObject(
  key: string,
  body: Buffer | Uint8Array | string | Readable,
  opts: { contentType: string; contentLength?: number; metadata?: Record<string, string> },
): Promise<{ key: string; etag?: string }> {
  const out = await s3().send(
    new PutObjectCommand({
      Bucket: bucket(),
      Key: key,
      Body: body,
      ContentType: opts.contentType,
      ContentLength: opts.contentLength,
      Metadata: opts.metadata,
    }),
  );
  return { key, etag: out.ETag };
}

/** Parts of a streamed upload: S3 wants at least 5 MiB for every part but the last. */
const PART_BYTES = 8 * 1024 * 1024;

/**
 * Streams a body of unknown length into a new object, holding at most one part in memory: one PUT
 * when it fits in a part, else a multipart upload that is aborted if the source fails (so no object
 * appears). Answers the number of bytes stored.
 */
export async function putObjectStream(
  key: string,
  source: AsyncIterable<Uint8Array>,
  opts: { contentType: string },
): Promise<{ key: string; bytes: number }> {
  let pending: Uint8Array[] = [];
  let pendingBytes = 0;
  let total = 0;
  let uploadId: string | undefined;
  const parts: { ETag?: string; PartNumber: number }[] = [];
  const sendPart = async (body: Buffer) => {
    uploadId ??= (await s3().send(new CreateMultipartUploadCommand({ Bucket: bucket(), Key: key, ContentType: opts.contentType })))
      .UploadId;
    const PartNumber = parts.length + 1;
    const out = await s3().send(
      new UploadPartCommand({ Bucket: bucket(), Key: key, UploadId: uploadId, PartNumber, Body: body, ContentLength: body.length }),
    );
    parts.push({ ETag: out.ETag, PartNumber });
  };
  try {
    for await (const chunk of source) {
      pending.push(chunk);
      pendingBytes += chunk.byteLength;
      total += chunk.byteLength;
      if (pendingBytes >= PART_BYTES) {
        const joined = Buffer.concat(pending);
        pending = [joined.subarray(PART_BYTES)];
        pendingBytes = joined.length - PART_BYTES;
        await sendPart(joined.subarray(0, PART_BYTES));
      }
    }
    const rest = Buffer.concat(pending);
    if (!uploadId) {
      await putObject(key, rest, { contentType: opts.contentType, contentLength: rest.length });
      return { key, bytes: total };
    }
    if (rest.length) await sendPart(rest);
    await s3().send(
      new CompleteMultipartUploadCommand({ Bucket: bucket(), Key: key, UploadId: uploadId, MultipartUpload: { Parts: parts } }),
    );
    return { key, bytes: total };
  } catch (error) {
    if (uploadId) {
      await s3()
        .send(new AbortMultipartUploadCommand({ Bucket: bucket(), Key: key, UploadId: uploadId }))
        .catch(() => {}); // the local stand-in keeps no parts to abort
    }
    throw error;
  }
}

export interface StoredObject {
  body: Readable;
  contentType?: string;
  contentLength?: number;
  etag?: string;
  lastModified?: Date;
}

/** The object as a stream, or null when the key does not exist. */
export async function getObject(key: string): Promise<StoredObject | null> {
  try {
    const out = await s3().send(new GetObjectCommand({ Bucket: bucket(), Key: key }));
    return {
      body: out.Body as Readable,
      contentType: out.ContentType,
      contentLength: out.ContentLength,
      etag: out.ETag,
      lastModified: out.LastModified,
    };
  } catch (err) {
    if (isMissing(err)) return null;
    throw err;
  }
}

export async function getObjectBuffer(key: string): Promise<Buffer | null> {
  const obj = await getObject(key);
  if (!obj) return null;
  return buffer(obj.body);
}

export async function headObject(
  key: string,
): Promise<{ contentType?: string; contentLength?: number; etag?: string; metadata?: Record<string, string> } | null> {
  try {
    const out = await s3().send(new HeadObjectCommand({ Bucket: bucket(), Key: key }));
    return { contentType: out.ContentType, contentLength: out.ContentLength, etag: out.ETag, metadata: out.Metadata };
  } catch (err) {
    if (isMissing(err)) return null;
    throw err;
  }
}

export async function deleteObject(key: string): Promise<void> {
  await s3().send(new DeleteObjectCommand({ Bucket: bucket(), Key: key }));
}

/** Deletes in batches of 1000 (the S3 limit); throws if any key could not be removed. */
export async function deleteObjects(keys: string[]): Promise<void> {
  for (let i = 0; i < keys.length; i += 1000) {
    const batch = keys.slice(i, i + 1000);
    const out = await s3().send(
      new DeleteObjectsCommand({
        Bucket: bucket(),
        Delete: { Objects: batch.map((Key) => ({ Key })), Quiet: true },
      }),
    );
    if (out.Errors?.length) {
      const first = out.Errors[0];
      throw new Error(`could not delete ${out.Errors.length} object(s), first ${first.Key}: ${first.Message}`);
    }
  }
}

/**
 * Creates the media bucket and the private one when missing (the stand-in creates both at start; real
 * buckets may be pre-made).
 */
export async function ensureBucket(): Promise<void> {
  for (const name of [bucket(), env().s3.privateBucket]) {
    try {
      await s3().send(new HeadBucketCommand({ Bucket: name }));
    } catch (err) {
      if (!isMissing(err)) throw err;
      await s3().send(new CreateBucketCommand({ Bucket: name }));
    }
  }
}

export async function ping(): Promise<void> {
  await s3().send(new HeadBucketCommand({ Bucket: bucket() }));
}

export function isMissing(err: unknown): boolean {
  if (err instanceof NoSuchKey || err instanceof NotFound) return true;
  return err instanceof S3ServiceException && (err.$metadata.httpStatusCode === 404 || err.name === "NoSuchBucket");
}
