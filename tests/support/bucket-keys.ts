import { ListObjectsV2Command } from "@aws-sdk/client-s3";
import { env } from "~/env.server";
import { createStorageClient } from "~/services/storage.server";

/** Every key in the media bucket: a test of clean-up looks at storage itself, not at what the rows say. */
export async function bucketKeys(): Promise<Set<string>> {
  const client = createStorageClient();
  const keys = new Set<string>();
  let token: string | undefined;
  do {
    const out = await client.send(new ListObjectsV2Command({ Bucket: env().s3.bucket, ContinuationToken: token }));
    for (const o of out.Contents ?? []) keys.add(o.Key!);
    token = out.IsTruncated ? out.NextContinuationToken : undefined;
  } while (token);
  return keys;
}
