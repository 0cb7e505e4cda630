// Request bodies as an attacker sends them: chunked (no Content-Length), as large as wanted, produced
// only when the server pulls, so a test can tell how much the server read before it stopped.

export type CountingBody = { stream: ReadableStream<Uint8Array>; pulled: () => number };

/** `total` bytes: `head`, then `fill` bytes, then `tail`, in chunks of `chunk`, each made when pulled. */
export function countingBody(
  total: number,
  {
    head = "",
    tail = "",
    fill = 0x41,
    chunk = 64 * 1024,
  }: { head?: string | Uint8Array; tail?: string; fill?: number; chunk?: number } = {},
): CountingBody {
  const start = typeof head === "string" ? new TextEncoder().encode(head) : head;
  const end = new TextEncoder().encode(tail);
  const filler = new Uint8Array(chunk).fill(fill);
  let sent = 0;
  const stream = new ReadableStream<Uint8Array>(
    {
      pull(controller) {
        if (sent >= total) return controller.close();
        let bytes: Uint8Array;
        if (sent === 0 && start.length) bytes = start;
        else if (total - sent <= end.length) bytes = end.subarray(end.length - (total - sent));
        else bytes = filler.subarray(0, Math.min(chunk, total - sent - end.length));
        sent += bytes.length;
        controller.enqueue(bytes.slice());
      },
    },
    { highWaterMark: 0 },
  );
  return { stream, pulled: () => sent };
}

/** A chunked request: the body is a stream, so no Content-Length is sent. */
export function chunkedRequest(url: string, method: string, body: CountingBody, headers: Record<string, string> = {}): Request {
  // Node needs `duplex` for a streamed body; the DOM's RequestInit does not know it.
  const init: RequestInit & { duplex: "half" } = { method, headers, body: body.stream, duplex: "half" };
  return new Request(url, init);
}

export const MiB = 1024 * 1024;

/** Multipart framing around one file, as the first and last bytes of a body. */
export function multipartFrame(field: string, filename: string, type: string, boundary = "loadline-test-boundary") {
  return {
    contentType: `multipart/form-data; boundary=${boundary}`,
    head: `--${boundary}\r\nContent-Disposition: form-data; name="${field}"; filename="${filename}"\r\nContent-Type: ${type}\r\n\r\n`,
    tail: `\r\n--${boundary}--\r\n`,
  };
}

/** Calls a route module's loader or action as the server would; a thrown Response or data() is the answer. */
export async function answer(run: () => unknown): Promise<{ status: number; body: any; headers: Headers }> {
  try {
    const out = await run();
    if (out instanceof Response) return { status: out.status, body: await readBody(out), headers: out.headers };
    return fromData(out);
  } catch (thrown) {
    if (thrown instanceof Response) return { status: thrown.status, body: await readBody(thrown), headers: thrown.headers };
    if (isData(thrown)) return fromData(thrown);
    throw thrown;
  }
}

type DataLike = { type: "DataWithResponseInit"; data: unknown; init: ResponseInit | null };
const isData = (v: unknown): v is DataLike => typeof v === "object" && v !== null && (v as DataLike).type === "DataWithResponseInit";

function fromData(out: unknown) {
  if (isData(out)) return { status: out.init?.status ?? 200, body: out.data as any, headers: new Headers(out.init?.headers) };
  return { status: 200, body: out as any, headers: new Headers() };
}

async function readBody(res: Response) {
  const text = await res.text();
  try {
    return JSON.parse(text);
  } catch {
    return text;
  }
}
