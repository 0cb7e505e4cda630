import { z } from "zod";
import { QueryTypes, UniqueConstraintError } from "sequelize";
import { sequelize } from "~/db.server";
import { Listing } from "~/models/index.server";
import { MessageThread } from "~/models/message-thread.server";
import { refusal } from "~/http/errors.server";
import { raiseFlag } from "~/desk/flags.server";
import { threadFor } from "~/messages/access.server";
import { PUBLIC_STATUSES } from "~/listings/visibility";
import { listingTitle } from "@shared/catalogue";
import { isId } from "@shared/ids";
import { freeText } from "@shared/text";
import { LISTING_REPORT_REASONS, REPORT_NOTE_MAX, REPORT_NOTE_MIN, THREAD_REPORT_REASONS } from "./words";

// Reports from signed-in people: "Report" on every public listing and on a conversation (by either of
// its two sides). A report is a desk flag of kind 'report' (app/desk/flags.server.ts), so it joins the
// desk's queue; one open report per person and item (a partial unique index backs the check).

export type ReportTarget = { kind: "listing"; id: string } | { kind: "thread"; id: string };
export type ReportErrors = Partial<Record<"reason" | "note" | "_form", string>>;
export type ReportResult = { ok: true } | { ok: false; status: number; errors: ReportErrors; values: Record<string, string> };

function reportForm(reasons: Record<string, string>) {
  return z.object({
    reason: z.string().refine((r) => Object.hasOwn(reasons, r), { message: "Choose what is wrong." }),
    note: freeText("Your note")
      .transform((s) => s.trim())
      .pipe(
        z
          .string()
          .min(REPORT_NOTE_MIN, { message: `Say in a sentence what is wrong (at least ${REPORT_NOTE_MIN} characters).` })
          .max(REPORT_NOTE_MAX, { message: `At most ${REPORT_NOTE_MAX} characters.` }),
      ),
  });
}
const ListingReportForm = reportForm(LISTING_REPORT_REASONS);
const ThreadReportForm = reportForm(THREAD_REPORT_REASONS);

export interface ReportPage {
  target: ReportTarget;
  title: string;
  backHref: string;
  reasons: { value: string; label: string }[];
  /** When the viewer's open report of this item was made, if there is one. */
  reportedAt: string | null;
}

/** A public listing someone other than its seller may report; anything else is the same 404 as a missing one. */
async function reportableListing(reporterId: string, rawId: unknown) {
  const listing = isId(rawId) ? await Listing.findByPk(rawId, { attributes: ["id", "sellerId", "status", "maker", "model"] }) : null;
  if (!listing || !PUBLIC_STATUSES.includes(listing.status)) throw refusal("not_found", "There is no listing here.");
  if (listing.sellerId === reporterId) throw refusal("forbidden", "This is your own listing.");
  return listing;
}

async function openReportAt(reporterId: string, target: ReportTarget): Promise<Date | null> {
  const column = target.kind === "listing" ? "listing_id" : "thread_id";
  const rows = await sequelize.query<{ created_at: Date }>(
    `SELECT created_at FROM desk_flags WHERE kind = 'report' AND reporter_id = :reporterId AND ${column} = :id
       AND resolved_at IS NULL ORDER BY created_at DESC LIMIT 1`,
    { replacements: { reporterId, id: target.id }, type: QueryTypes.SELECT },
  );
  return rows[0]?.created_at ?? null;
}

export async function listingReportPage(reporterId: string, rawId: unknown): Promise<ReportPage> {
  const listing = await reportableListing(reporterId, rawId);
  const target: ReportTarget = { kind: "listing", id: listing.id };
  const at = await openReportAt(reporterId, target);
  return {
    target,
    title: listingTitle(listing.maker, listing.model),
    backHref: `/listings/${listing.id}`,
    reasons: Object.entries(LISTING_REPORT_REASONS).map(([value, label]) => ({ value, label })),
    reportedAt: at?.toISOString() ?? null,
  };
}

export async function threadReportPage(reporterId: string, rawId: unknown): Promise<ReportPage> {
  const { thread } = await threadFor(reporterId, rawId);
  const target: ReportTarget = { kind: "thread", id: thread.id };
  const listing = await Listing.findByPk(thread.listingId, { attributes: ["maker", "model"] });
  const at = await openReportAt(reporterId, target);
  return {
    target,
    title: `Conversation about ${listingTitle(listing?.maker ?? null, listing?.model ?? null)}`,
    backHref: `/messages/${thread.id}`,
    reasons: Object.entries(THREAD_REPORT_REASONS).map(([value, label]) => ({ value, label })),
    reportedAt: at?.toISOString() ?? null,
  };
}

const ALREADY = "You have reported this already; the review desk has your report.";

/** Checks the form and raises the flag; a second open report of the same item by the same person is refused. */
export async function submitReport(
  reporterId: string,
  kind: ReportTarget["kind"],
  rawId: unknown,
  fields: Record<string, unknown>,
): Promise<ReportResult> {
  const target: ReportTarget =
    kind === "listing"
      ? { kind, id: (await reportableListing(reporterId, rawId)).id }
      : { kind, id: (await threadFor(reporterId, rawId)).thread.id };
  const text = (v: unknown) => (typeof v === "string" ? v : "");
  const values = { reason: text(fields.reason).slice(0, 40), note: text(fields.note).slice(0, 2 * REPORT_NOTE_MAX) };
  const parsed = (kind === "listing" ? ListingReportForm : ThreadReportForm).safeParse({ reason: text(fields.reason), note: values.note });
  if (!parsed.success) {
    const errors: ReportErrors = {};
    for (const i of parsed.error.issues) errors[i.path[0] === "reason" ? "reason" : i.path[0] === "note" ? "note" : "_form"] ??= i.message;
    return { ok: false, status: 400, errors, values };
  }
  if (await openReportAt(reporterId, target)) return { ok: false, status: 409, errors: { _form: ALREADY }, values };
  try {
    await sequelize.transaction(async (transaction) => {
      const thread = target.kind === "thread" ? await MessageThread.findByPk(target.id, { attributes: ["listingId"], transaction }) : null;
      await raiseFlag(
        {
          kind: "report",
          ...(target.kind === "listing" ? { listingId: target.id } : { threadId: target.id }),
          reporterId,
          reason: parsed.data.reason,
          note: parsed.data.note,
          // A conversation's report names its listing for the desk without making it the listing's report.
          details: thread ? { listingId: thread.listingId } : {},
        },
        transaction,
      );
    });
  } catch (e) {
    if (e instanceof UniqueConstraintError) return { ok: false, status: 409, errors: { _form: ALREADY }, values };
    throw e;
  }
  return { ok: true };
}
