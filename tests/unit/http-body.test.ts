import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { HttpError } from "~/http/errors.server";
import { readForm, readJson, readPageForm } from "~/http/body.server";
import { readMultipart } from "~/http/multipart.server";
import { chunkedRequest, countingBody, MiB, multipartFrame } from "../support/bodies";

// The one body reader: every limit holds for bodies sent without a Content-Length, and the reader
// stops pulling at the limit instead of reading the rest into memory.

const URL_ = "http://127.0.0.1/api/v1/anything";
const CHUNK = 64 * 1024;

async function refusal(run: () => Promise<unknown>): Promise<HttpError> {
  try {
    await run();
  } catch (e) {
    if (e instanceof HttpError) return e;
    throw e;
  }
  throw new Error("expected a refusal");
}

const json = (body: BodyInit, headers: Record<string, string> = { "Content-Type": "application/json" }) =>
  new Request(URL_, { method: "POST", body, headers });

describe("readJson", () => {
  it("stops pulling a chunked body at the limit: 40 MiB sent, about 64 KB read, 413 in the one shape", async () => {
    const body = countingBody(40 * MiB, { head: '{"notes":"' });
    const e = await refusal(() => readJson(chunkedRequest(URL_, "POST", body, { "Content-Type": "application/json" }), 64 * 1024));
    expect(e.status).toBe(413);
    expect(e.toJSON()).toEqual({ error: "too_large", message: "The body may be at most 64 KB." });
    expect(new Headers(e.headers).get("Connection")).toBe("close");
    expect(body.pulled()).toBeLessThanOrEqual(64 * 1024 + 2 * CHUNK);
  });

  it("refuses a declared Content-Length over the limit without reading a byte", async () => {
    const body = countingBody(2 * MiB);
    const request = chunkedRequest(URL_, "POST", body, { "Content-Type": "application/json", "Content-Length": String(2 * MiB) });
    const e = await refusal(() => readJson(request, MiB));
    expect(e.status).toBe(413);
    expect(e.message).toBe("The body is 2 MB; it may be at most 1 MB.");
    expect(body.pulled()).toBe(0);
  });

  it("415 for another type, 400 for JSON that does not parse or is empty", async () => {
    expect((await refusal(() => readJson(json("{}", { "Content-Type": "text/plain" }), 1024))).toJSON()).toEqual({
      error: "unsupported_media_type",
      message: "Send the body as application/json.",
    });
    expect((await refusal(() => readJson(json("{ notes: "), 1024))).code).toBe("invalid_json");
    expect((await refusal(() => readJson(json(""), 1024))).code).toBe("invalid_json");
    expect((await refusal(() => readJson(json(new Uint8Array([0x7b, 0xff, 0x7d])), 1024))).code).toBe("bad_request");
  });

  it("names the field holding a NUL character or a broken surrogate, at any depth", async () => {
    const e = await refusal(() => readJson(json(JSON.stringify({ benchSheet: { notes: "a\u0000b" } })), 1024));
    expect(e.status).toBe(400);
    expect(e.toJSON()).toMatchObject({ error: "invalid", issues: [{ path: "benchSheet.notes", message: expect.stringContaining("NUL") }] });
    expect(e.message).toContain("“benchSheet.notes”");
    const lone = await refusal(() => readJson(json('{"item":{"model":"\\ud800"}}'), 1024));
    expect(lone.issues).toEqual([{ path: "item.model", message: expect.stringContaining("unpaired surrogate") }]);
    const deep = "[".repeat(30_000) + '"\\u0000"' + "]".repeat(30_000);
    expect((await refusal(() => readJson(json(deep), MiB))).code).toBe("invalid");
  });

  it("never throws anything but a refusal, whatever the bytes (property)", async () => {
    await fc.assert(
      fc.asyncProperty(fc.uint8Array({ maxLength: 300 }), fc.constantFrom("application/json", "text/plain", ""), async (bytes, type) => {
        try {
          await readJson(json(bytes, type ? { "Content-Type": type } : {}), 200);
        } catch (e) {
          expect(e).toBeInstanceOf(HttpError);
          expect([400, 413, 415]).toContain((e as HttpError).status);
        }
      }),
      { numRuns: 300 },
    );
  });
});

describe("readForm", () => {
  it("reads urlencoded and multipart forms alike", async () => {
    const urlencoded = await readForm(
      new Request(URL_, { method: "POST", body: new URLSearchParams({ email: "a@example.test", note: "x\ny" }) }),
    );
    expect(Object.fromEntries(urlencoded)).toEqual({ email: "a@example.test", note: "x\ny" });
    const form = new FormData();
    form.append("email", "a@example.test");
    form.append("roles", "seller");
    form.append("roles", "workshop");
    const multipart = await readForm(new Request(URL_, { method: "POST", body: form }));
    expect(multipart.getAll("roles")).toEqual(["seller", "workshop"]);
  });

  it("415 for JSON or text, 400 for broken multipart, and a file where a form takes none", async () => {
    const asJson = await refusal(() => readForm(json('{"email":"a@example.test"}')));
    expect(asJson.status).toBe(415);
    expect(asJson.message).toBe("A form is sent as application/x-www-form-urlencoded or multipart/form-data, not application/json.");
    expect((await refusal(() => readForm(json("email=a", { "Content-Type": "text/plain" })))).status).toBe(415);
    const noBoundary = await refusal(() => readForm(json("--x\r\n", { "Content-Type": "multipart/form-data" })));
    expect(noBoundary.toJSON()).toEqual({
      error: "bad_request",
      message: "The multipart body cannot be read: Multipart: Boundary not found.",
    });
    const cut = await refusal(() =>
      readForm(
        json('--x\r\nContent-Disposition: form-data; name="email"\r\n\r\na@b', { "Content-Type": "multipart/form-data; boundary=x" }),
      ),
    );
    expect(cut.toJSON()).toEqual({ error: "bad_request", message: "The multipart body is broken: Unexpected end of form." });
    const withFile = new FormData();
    withFile.append("photo", new Blob(["x"]), "x.jpg");
    expect((await refusal(() => readForm(new Request(URL_, { method: "POST", body: withFile })))).message).toBe(
      "This form takes no files.",
    );
  });

  it("stops a chunked form at its limit", async () => {
    const body = countingBody(40 * MiB, { head: "note=" });
    const e = await refusal(() => readForm(chunkedRequest(URL_, "POST", body, { "Content-Type": "application/x-www-form-urlencoded" })));
    expect(e.status).toBe(413);
    expect(body.pulled()).toBeLessThanOrEqual(64 * 1024 + 2 * CHUNK);
  });

  it("names a field holding a NUL character", async () => {
    const e = await refusal(() =>
      readForm(new Request(URL_, { method: "POST", body: new URLSearchParams({ collectionNote: "by\u0000appointment" }) })),
    );
    expect(e.issues).toEqual([{ path: "collectionNote", message: expect.stringContaining("NUL character") }]);
  });

  it("for pages, a refusal is thrown as data() with its status, for the error boundary", async () => {
    try {
      await readPageForm(json("{}"));
      throw new Error("expected a refusal");
    } catch (thrown) {
      expect(thrown).toMatchObject({
        type: "DataWithResponseInit",
        init: { status: 415 },
        data: { error: "unsupported_media_type", message: expect.any(String) },
      });
    }
  });
});

describe("readMultipart", () => {
  it("a malformed part header, then more parts: 400, and no error event goes unheard", async () => {
    const unheard: unknown[] = [];
    const onUncaught = (e: unknown) => unheard.push(e);
    process.on("uncaughtException", onUncaught);
    try {
      const bodies = [
        "--x\r\nno colon here\r\n\r\nv\r\n--x--\r\n",
        `--x\r\nContent-Disposition: form-data; name="a"\r\n\r\nv\r\n--x\r\n\u0001garbage\r\n\r\n${"y".repeat(100_000)}\r\n--x--\r\n`,
        `--x\r\nContent-Disposition: form-data; name="f"; filename="a.csv"\r\n\r\n${"1".repeat(200_000)}\r\n--x\r\nbroken\r\n\r\n`,
      ];
      for (const body of bodies) {
        const request = new Request(URL_, { method: "POST", body, headers: { "Content-Type": "multipart/form-data; boundary=x" } });
        const e = await refusal(() =>
          readMultipart(request, { maxBytes: MiB, maxFileBytes: MiB, maxFiles: 1, onFile: (f) => collect(f.stream) }),
        );
        expect(e.toJSON()).toEqual({ error: "bad_request", message: "The multipart body is broken: Malformed part header." });
      }
      await new Promise((r) => setTimeout(r, 100));
    } finally {
      process.off("uncaughtException", onUncaught);
    }
    expect(unheard).toEqual([]);
  });

  const frame = multipartFrame("file", "big.csv", "text/csv");
  const collect = async (stream: AsyncIterable<Uint8Array>) => {
    let n = 0;
    for await (const c of stream) n += c.length;
    return n;
  };

  it("stops at the per-file limit of a chunked upload (120 MiB sent)", async () => {
    const body = countingBody(120 * MiB, { head: frame.head, tail: frame.tail });
    const e = await refusal(() =>
      readMultipart(chunkedRequest(URL_, "POST", body, { "Content-Type": frame.contentType }), {
        maxBytes: 2 * MiB,
        maxFileBytes: MiB,
        maxFiles: 1,
        onFile: (f) => collect(f.stream),
      }),
    );
    expect(e.toJSON()).toEqual({ error: "file_too_large", message: "The file “big.csv” is larger than 1 MB." });
    expect(body.pulled()).toBeLessThanOrEqual(MiB + 2 * CHUNK);
  });

  it("stops at the body limit even when each part is small", async () => {
    const boundary = "b";
    const part = `--${boundary}\r\nContent-Disposition: form-data; name="f"\r\n\r\n${"x".repeat(1000)}\r\n`;
    const body = countingBody(120 * MiB, { head: part.repeat(10) });
    const e = await refusal(() =>
      readMultipart(chunkedRequest(URL_, "POST", body, { "Content-Type": `multipart/form-data; boundary=${boundary}` }), {
        maxBytes: MiB,
        maxFileBytes: MiB,
        maxFiles: 1,
        onFile: (f) => collect(f.stream),
      }),
    );
    expect(e.status).toBe(413);
    expect(body.pulled()).toBeLessThanOrEqual(MiB + 2 * CHUNK);
  });

  it("hands each file to its handler as it arrives, and a handler's refusal ends the reading", async () => {
    const body = countingBody(20 * MiB, { head: frame.head, tail: frame.tail });
    const e = await refusal(() =>
      readMultipart(chunkedRequest(URL_, "POST", body, { "Content-Type": frame.contentType }), {
        maxBytes: 30 * MiB,
        maxFileBytes: 25 * MiB,
        maxFiles: 1,
        onFile: async (f) => {
          for await (const chunk of f.stream) if (chunk.length) throw new HttpError(422, "unsupported_format", "not what we take");
          return 0;
        },
      }),
    );
    expect(e.code).toBe("unsupported_format");
    expect(body.pulled()).toBeLessThan(MiB);
  });
});
