import S3rver from "s3rver";
import { mkdirSync } from "node:fs";

// Object storage stand-in: s3rver keeps objects as plain files under `directory`, so photos and
// captures survive a restart. Path-style only (the app's client sets forcePathStyle).

export interface S3FakeOptions {
  port: number;
  directory: string;
  buckets: string[];
  host?: string;
}

export interface RunningS3Fake {
  endpoint: string;
  stop: () => Promise<void>;
}

// CORS so the browser may upload straight to a presigned URL during development.
const cors = `<CORSConfiguration><CORSRule><AllowedOrigin>*</AllowedOrigin><AllowedMethod>GET</AllowedMethod>
<AllowedMethod>PUT</AllowedMethod><AllowedMethod>HEAD</AllowedMethod><AllowedHeader>*</AllowedHeader>
<ExposeHeader>ETag</ExposeHeader><MaxAgeSeconds>3000</MaxAgeSeconds></CORSRule></CORSConfiguration>`;

export async function startS3Fake(opts: S3FakeOptions): Promise<RunningS3Fake> {
  const host = opts.host ?? "127.0.0.1";
  mkdirSync(opts.directory, { recursive: true });
  const server = new S3rver({
    address: host,
    port: opts.port,
    directory: opts.directory,
    silent: true,
    vhostBuckets: false,
    configureBuckets: opts.buckets.map((name) => ({ name, configs: [cors] })),
  });
  const address = await server.run();
  return {
    endpoint: `http://${host}:${address.port}`,
    stop: () => server.close(),
  };
}
