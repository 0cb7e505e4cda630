import { z } from "zod";
import { UniqueConstraintError, type Transaction } from "sequelize";
import { sequelize } from "~/db.server";
import { Workshop, WorkshopApplication } from "~/models/index.server";
import { HttpError, pageError, refusal } from "~/http/errors.server";
import { mediaType } from "~/http/limited-stream.server";
import { readMultipart } from "~/http/multipart.server";
import { COUNTRY_CODES } from "@shared/countries";
import { isOneOf } from "@shared/one-of";
import { freeText, nameText } from "@shared/text";
import { deleteDocuments, DOCUMENT_MAX_BYTES, receiveDocument, type ReceivedDocument } from "./document.server";

// A seller's application to be a workshop, from /account/workshop: the business's particulars and a
// document, in one multipart form that works without JavaScript. The document is stored first (in the
// private bucket); the workshop row and the application are then written in one transaction, and the
// stored document is deleted again when the form is refused or the transaction fails.

export type ApplicationErrors = Partial<
  Record<"businessName" | "address" | "town" | "region" | "country" | "registrationNumber" | "document" | "_form", string>
>;
export type ApplyResult =
  { ok: true; application: WorkshopApplication } | { ok: false; errors: ApplicationErrors; values: Record<string, string> };

const FORM_OVERHEAD = 64 * 1024;

export const ApplicationFields = z.object({
  businessName: nameText("The business name")
    .min(2, { message: "Give the business's name (at least 2 characters)." })
    .max(120, { message: "At most 120 characters." }),
  address: freeText("The address")
    .transform((s) => s.trim())
    .pipe(z.string().min(5, { message: "Give the street address of the workshop." }).max(400, { message: "At most 400 characters." })),
  town: nameText("The town").min(1, { message: "Give the town." }).max(80, { message: "At most 80 characters." }),
  region: nameText("The region").max(80, { message: "At most 80 characters." }),
  country: z.string().refine((c) => isOneOf(COUNTRY_CODES, c), { message: "Choose the country." }),
  registrationNumber: nameText("The registration number")
    .min(3, { message: "Give the business's registration number (at least 3 characters)." })
    .max(40, { message: "At most 40 characters." }),
});
export type ApplicationInput = z.infer<typeof ApplicationFields>;

/** Where the account stands: no workshop yet, an application waiting, refused (may apply again) or verified. */
export async function applicationState(userId: string) {
  const workshop = await Workshop.findOne({ where: { ownerId: userId } });
  const latest = workshop
    ? await WorkshopApplication.findOne({ where: { workshopId: workshop.id }, order: [["createdAt", "DESC"]] })
    : null;
  const stage: "none" | "waiting" | "refused" | "verified" = !workshop
    ? "none"
    : workshop.verificationStatus === "verified"
      ? "verified"
      : workshop.verificationStatus === "rejected"
        ? "refused"
        : latest?.status === "waiting" || !latest
          ? "waiting"
          : "refused";
  return { workshop, latest, stage, mayApply: stage === "none" || stage === "refused" };
}

function valuesOf(form: FormData): Record<string, string> {
  const out: Record<string, string> = {};
  for (const key of Object.keys(ApplicationFields.shape)) {
    const v = form.get(key);
    if (typeof v === "string") out[key] = v.slice(0, 1000);
  }
  return out;
}

export async function submitApplication(request: Request, applicantId: string): Promise<ApplyResult> {
  const state = await applicationState(applicantId);
  if (!state.mayApply)
    return {
      ok: false,
      errors: {
        _form: state.stage === "verified" ? "Your workshop is already verified." : "Your application is already with the review desk.",
      },
      values: {},
    };
  if (mediaType(request) !== "multipart/form-data")
    pageError(refusal("unsupported_media_type", "Send the application as multipart/form-data."));

  const written: string[] = [];
  try {
    let read: { fields: FormData; files: ReceivedDocument[] };
    try {
      read = await readMultipart(request, {
        maxBytes: DOCUMENT_MAX_BYTES + FORM_OVERHEAD,
        maxFileBytes: DOCUMENT_MAX_BYTES,
        maxFiles: 1,
        maxFields: 20,
        fileTooLarge: () => refusal("file_too_large", "The document is larger than 8 MB."),
        tooManyFiles: () => refusal("bad_request", "Send one document with an application."),
        onFile: (part) => receiveDocument(part, written),
      });
    } catch (e) {
      // A document over the limit is the applicant's to fix: say so beside the field.
      if (e instanceof HttpError && e.code === "file_too_large") return { ok: false, errors: { document: e.message }, values: {} };
      pageError(e);
    }
    const form = read.fields;
    const errors: ApplicationErrors = {};
    const get = (k: string) => {
      const v = form.get(k);
      return typeof v === "string" ? v : "";
    };
    const parsed = ApplicationFields.safeParse(Object.fromEntries(Object.keys(ApplicationFields.shape).map((k) => [k, get(k)])));
    if (!parsed.success) for (const i of parsed.error.issues) errors[String(i.path[0] ?? "_form") as keyof ApplicationErrors] ??= i.message;
    const document = read.files.find((f) => f !== null) ?? null;
    if (!document) errors.document = "Attach a document that shows the business's registration (PDF, JPEG or PNG).";
    else if ("error" in document) errors.document = document.error;

    if (!parsed.success || Object.keys(errors).length || !document || "error" in document) {
      await deleteDocuments(written);
      return { ok: false, errors, values: valuesOf(form) };
    }
    try {
      const application = await sequelize.transaction((t) => writeApplication(applicantId, parsed.data, document, t));
      written.length = 0; // kept: the application holds it now
      return { ok: true, application };
    } catch (e) {
      if (!(e instanceof UniqueConstraintError) && !(e instanceof HttpError)) throw e;
      await deleteDocuments(written);
      const message =
        e instanceof HttpError ? e.message : "That business name is taken by another workshop, or your application was just sent.";
      return { ok: false, errors: { _form: message }, values: valuesOf(form) };
    }
  } finally {
    await deleteDocuments(written);
  }
}

/** The workshop row (new, or the refused one again) and the application, under the workshop's row lock. */
async function writeApplication(
  applicantId: string,
  input: ApplicationInput,
  document: { key: string; type: string; name: string; bytes: number },
  transaction: Transaction,
): Promise<WorkshopApplication> {
  const place = { name: input.businessName, town: input.town, region: input.region || null, country: input.country };
  let workshop = await Workshop.findOne({ where: { ownerId: applicantId }, lock: transaction.LOCK.UPDATE, transaction });
  if (workshop?.verificationStatus === "verified") throw refusal("conflict", "Your workshop is already verified.");
  if (workshop) {
    const waiting = await WorkshopApplication.count({ where: { workshopId: workshop.id, status: "waiting" }, transaction });
    if (waiting) throw refusal("conflict", "Your application is already with the review desk.");
    await workshop.update({ ...place, verificationStatus: "applied", verifiedAt: null }, { transaction });
  } else {
    workshop = await Workshop.create(
      { ownerId: applicantId, slug: await freeSlug(input.businessName, transaction), about: null, ...place },
      { transaction },
    );
  }
  return WorkshopApplication.create(
    {
      workshopId: workshop.id,
      applicantId,
      businessName: input.businessName,
      address: input.address,
      registrationNumber: input.registrationNumber,
      documentKey: document.key,
      documentType: document.type,
      documentName: document.name,
      documentBytes: document.bytes,
    },
    { transaction },
  );
}

/** The business name as a workshop address (`/workshops/:slug`), with a number added when it is taken. */
export function slugOf(name: string): string {
  const slug = name
    .normalize("NFKD")
    .replace(/[\u0300-\u036f]/g, "")
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-+|-+$/g, "")
    .slice(0, 60)
    .replace(/-+$/g, "");
  return slug || "workshop";
}

async function freeSlug(name: string, transaction: Transaction): Promise<string> {
  const base = slugOf(name);
  for (let n = 1; n < 50; n++) {
    const slug = n === 1 ? base : `${base}-${n}`;
    if (!(await Workshop.count({ where: { slug }, transaction }))) return slug;
  }
  throw refusal("conflict", "Choose a more distinctive business name.");
}
