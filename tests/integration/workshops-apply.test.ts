import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { randomBytes } from "node:crypto";

// Applying as a workshop through the server module /account/workshop calls: the document goes to the
// private bucket (never the media bucket, never /media), the workshop and its application are written
// together, and whatever is refused (a field, the file's type, the row itself) leaves no document
// behind. Then the document's signed link: only for the moderator it was made for, only until it expires.

const putKeys = vi.hoisted((): string[] => []);
vi.mock("~/services/private-storage.server", async (importOriginal) => {
  const real = await importOriginal<typeof import("~/services/private-storage.server")>();
  return {
    ...real,
    putPrivateObject: (key: string, body: Buffer, type: string) => {
      putKeys.push(key);
      return real.putPrivateObject(key, body, type);
    },
  };
});

const { sequelize } = await import("~/db.server");
const { User, Workshop, WorkshopApplication } = await import("~/models/index.server");
const { ensureBucket, headObject } = await import("~/services/storage.server");
const { getPrivateObject } = await import("~/services/private-storage.server");
const { submitApplication, applicationState, slugOf } = await import("~/workshops/apply.server");
const { documentResponse } = await import("~/workshops/document-response.server");
const { signDocumentLink, DOCUMENT_LINK_SECONDS } = await import("~/workshops/document-link.server");
const { mediaResponse } = await import("~/catalogue/media.server");
const { HttpError } = await import("~/http/errors.server");
const { testClock } = await import("../support/clock");
const { registrationPdf } = await import("../support/document-files");
const { plainPng, textFile } = await import("../support/photo-files");

const RUN = randomBytes(4).toString("hex");
let n = 0;
async function person(label: string, roles: ("buyer" | "seller" | "moderator")[] = ["buyer", "seller"]) {
  n++;
  return User.create({
    email: `workshops-it-${RUN}-${label}-${n}@example.test`,
    displayName: `Workshops ${label} ${n}`,
    passwordHash: null,
    roles,
    emailVerifiedAt: new Date(),
    lastSignInAt: null,
  });
}

const FIELDS = {
  businessName: "Quillmoor Bench Repairs",
  address: "Unit 4, Ferrow Yard\nMill Lane",
  town: "Quillmoor",
  region: "Lowfell",
  country: "GB",
  registrationNumber: "TB-40417",
};

function applicationRequest(fields: Record<string, string>, document?: { name: string; bytes: Buffer; type: string }): Request {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) form.append(k, v);
  if (document) form.append("document", new File([new Uint8Array(document.bytes)], document.name, { type: document.type }));
  return new Request("http://loadline.test/account/workshop", { method: "POST", body: form });
}

const pdf = { name: "register extract.pdf", bytes: registrationPdf(), type: "application/pdf" };

async function expectGone(keys: string[]) {
  for (const key of keys) expect(await getPrivateObject(key), key).toBeNull();
}

beforeAll(async () => {
  await ensureBucket();
});
afterAll(() => sequelize.close());

describe("applying as a workshop", () => {
  it("keeps the document in the private bucket and writes the workshop with its application", async () => {
    const seller = await person("seller");
    const result = await submitApplication(applicationRequest({ ...FIELDS, businessName: `Quillmoor Bench ${RUN}` }, pdf), seller.id);
    if (!result.ok) throw new Error(JSON.stringify(result.errors));
    const application = await WorkshopApplication.findByPk(result.application.id, { rejectOnEmpty: true });
    expect(application).toMatchObject({
      applicantId: seller.id,
      registrationNumber: "TB-40417",
      address: FIELDS.address,
      documentType: "application/pdf",
      documentName: "register extract.pdf",
      documentBytes: pdf.bytes.length,
      status: "waiting",
    });
    const workshop = await Workshop.findByPk(application.workshopId, { rejectOnEmpty: true });
    expect(workshop).toMatchObject({
      ownerId: seller.id,
      verificationStatus: "applied",
      town: "Quillmoor",
      country: "GB",
      slug: `quillmoor-bench-${RUN}`,
    });

    // The private bucket has it, byte for byte; the media bucket does not, and /media refuses the key.
    const stored = await getPrivateObject(application.documentKey);
    expect(Buffer.concat(await stored!.body.toArray())).toEqual(pdf.bytes);
    expect(await headObject(application.documentKey)).toBeNull();
    expect((await mediaResponse(application.documentKey, new Request("http://loadline.test/media/x"))).status).toBe(404);

    // One application waits at a time: a second is refused before anything is stored.
    const before = putKeys.length;
    const again = await submitApplication(applicationRequest(FIELDS, pdf), seller.id);
    expect(again).toMatchObject({ ok: false, errors: { _form: "Your application is already with the review desk." } });
    expect(putKeys.length).toBe(before);
    expect((await applicationState(seller.id)).stage).toBe("waiting");
  });

  it("refuses missing fields and a document that is not a PDF, JPEG or PNG, keeping nothing", async () => {
    const seller = await person("seller");
    const before = putKeys.length;
    const missing = await submitApplication(applicationRequest({ ...FIELDS, registrationNumber: "", country: "XX" }, pdf), seller.id);
    expect(missing.ok).toBe(false);
    if (missing.ok) return;
    expect(missing.errors.registrationNumber).toMatch(/registration number/);
    expect(missing.errors.country).toBe("Choose the country.");
    expect(missing.values.businessName).toBe(FIELDS.businessName);
    // The PDF was stored as it arrived, then deleted when the form was refused.
    expect(putKeys.length).toBe(before + 1);
    await expectGone(putKeys.slice(before));

    // A text file named .pdf is told by its bytes and never stored.
    const text = await submitApplication(
      applicationRequest(FIELDS, { name: "papers.pdf", bytes: textFile(), type: "application/pdf" }),
      seller.id,
    );
    expect(text).toMatchObject({ ok: false, errors: { document: "Send the document as a PDF, JPEG or PNG file." } });
    const none = await submitApplication(applicationRequest(FIELDS), seller.id);
    expect(none).toMatchObject({ ok: false, errors: { document: expect.stringMatching(/^Attach a document/) } });
    expect(putKeys.length).toBe(before + 1);
    expect(await Workshop.count({ where: { ownerId: seller.id } })).toBe(0);
  });

  it("deletes the stored document when the rows cannot be written", async () => {
    const seller = await person("seller");
    const before = putKeys.length;
    const spy = vi.spyOn(WorkshopApplication, "create").mockRejectedValueOnce(new Error("the database went away"));
    try {
      await expect(submitApplication(applicationRequest(FIELDS, pdf), seller.id)).rejects.toThrow("the database went away");
    } finally {
      spy.mockRestore();
    }
    expect(putKeys.length).toBe(before + 1);
    await expectGone(putKeys.slice(before));
    // The transaction took the workshop row with it.
    expect(await Workshop.count({ where: { ownerId: seller.id } })).toBe(0);
  });

  it("makes an address out of any business name", () => {
    expect(slugOf("Fennick & Söhne Röhrenwerk")).toBe("fennick-sohne-rohrenwerk");
    expect(slugOf("!!!")).toBe("workshop");
  });
});

describe("the document's signed link", () => {
  it("opens for the moderator it was signed for until it expires, and for no one else", async () => {
    const seller = await person("seller");
    const moderator = await person("moderator", ["buyer", "moderator"]);
    const other = await person("moderator", ["buyer", "moderator"]);
    const png = await plainPng(40, 30);
    const result = await submitApplication(
      applicationRequest({ ...FIELDS, businessName: `Link Test ${RUN}` }, { name: "scan.png", bytes: png, type: "image/png" }),
      seller.id,
    );
    if (!result.ok) throw new Error(JSON.stringify(result.errors));
    const id = result.application.id;
    const clock = testClock("2026-12-31T09:00:00Z");
    const { href, expires } = signDocumentLink(id, moderator.id, clock);
    expect(expires.toISOString()).toBe(new Date(Date.parse("2026-12-31T09:00:00Z") + DOCUMENT_LINK_SECONDS * 1000).toISOString());
    const url = new URL(href, "http://loadline.test");

    const opened = await documentResponse(url, id, moderator.id, clock);
    expect(opened.status).toBe(200);
    expect(opened.headers.get("Content-Type")).toBe("image/png");
    expect(opened.headers.get("Cache-Control")).toBe("private, no-store");
    expect(opened.headers.get("X-Content-Type-Options")).toBe("nosniff");
    expect(Buffer.from(await opened.arrayBuffer())).toEqual(png);

    const code = async (u: URL, viewer: string, c = clock) => {
      try {
        await documentResponse(u, id, viewer, c);
        return "opened";
      } catch (e) {
        if (e instanceof HttpError) return `${e.status} ${e.code}`;
        throw e;
      }
    };
    // Another moderator's session, another application's id, a changed expiry or signature: as if missing.
    expect(await code(url, other.id)).toBe("404 not_found");
    const later = new URL(url);
    later.searchParams.set("expires", String(Number(url.searchParams.get("expires")) + 3600));
    expect(await code(later, moderator.id)).toBe("404 not_found");
    const bent = new URL(url);
    bent.searchParams.set("sig", `${url.searchParams.get("sig")!.slice(0, -2)}AA`);
    expect(await code(bent, moderator.id)).toBe("404 not_found");
    const bare = new URL(url);
    bare.search = "";
    expect(await code(bare, moderator.id)).toBe("404 not_found");

    // One second before its time it still opens; at its time it is refused as expired.
    clock.advance(DOCUMENT_LINK_SECONDS * 1000 - 1000);
    expect(await code(url, moderator.id)).toBe("opened");
    clock.advance(1000);
    expect(await code(url, moderator.id)).toBe("410 link_expired");
  });
});
