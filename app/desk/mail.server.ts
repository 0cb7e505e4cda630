import { z } from "zod";
import type { Transaction } from "sequelize";
import { AuditRecord, DeskFlag, Listing, User } from "~/models/index.server";
import { appLink, sendNotice, type Notice } from "~/alerts/mail.server";
import { enqueue, QUEUES } from "~/services/jobs.server";
import { idSchema } from "@shared/ids";
import { listingTitle } from "@shared/catalogue";

// The 'desk-mail' worker: one mail about one audit record to the one person it affects (the seller
// of a listing, the account suspended or reinstated, the person whose report was looked at). Queued
// in the action's transaction, so a rolled-back action mails nobody; worded from the record, so the
// moderator's note reaches the person exactly as the trail keeps it. About the reader's own listing
// or account: no unsubscribe.

const DeskMailSchema = z.object({ auditId: idSchema("audit record"), to: idSchema("user") });

export async function queueDeskMail(auditId: string, to: string, transaction: Transaction): Promise<void> {
  await enqueue(QUEUES.deskMail, { auditId, to }, { transaction });
}

const DESK_ADDRESS = "Write to the review desk by answering this mail if you think we got it wrong.";

function wording(record: AuditRecord, title: string, listingHref: string | null): Pick<Notice, "subject" | "paragraphs" | "links"> | null {
  const note = `The moderator's note: “${record.note}”`;
  const listingLinks = listingHref ? [{ label: "Open the listing", href: listingHref }] : [];
  switch (record.action) {
    case "clear_hold":
      return {
        subject: `Live: ${title}`,
        paragraphs: [`A moderator has cleared ${title}; it is in the market now.`, note],
        links: listingLinks,
      };
    case "ask_changes":
      return {
        subject: `Changes asked: ${title}`,
        paragraphs: [
          `A moderator looked at ${title} and asks for changes before it goes to the market. It is back among your drafts; the note is shown in the editor too.`,
          note,
          "Once you have made them, publish it again: it returns to the review desk.",
        ],
        links: [{ label: "Edit the listing", href: appLink(`/sell/${record.subjectId}`) }],
      };
    case "remove_listing":
      return {
        subject: `Removed: ${title}`,
        paragraphs: [`A moderator has removed ${title} from Loadline.`, note, DESK_ADDRESS],
        links: [],
      };
    case "suspend_account":
      return {
        subject: "Your Loadline account is suspended",
        paragraphs: [
          "A moderator has suspended your account: you cannot sign in, and your live listings have left the market. Orders already under way continue, watched by the review desk.",
          note,
          DESK_ADDRESS,
        ],
        links: [],
      };
    case "reinstate_account":
      return {
        subject: "Your Loadline account is open again",
        paragraphs: [
          "A moderator has reinstated your account; you can sign in again. Listings withdrawn during the suspension stay withdrawn until you publish them again.",
          note,
        ],
        links: [{ label: "Your listings", href: appLink("/sell") }],
      };
    case "dismiss_flag":
      return {
        subject: `Your report: ${title}`,
        paragraphs: [`Thank you for your report about ${title}. A moderator looked at it and did not find a reason to act.`, note],
        links: listingLinks,
      };
    default:
      return null;
  }
}

export async function deliverDeskMail(data: unknown): Promise<void> {
  const { auditId, to } = DeskMailSchema.parse(data);
  const [record, person] = await Promise.all([AuditRecord.findByPk(auditId), User.findByPk(to)]);
  if (!record || !person) return;
  let listing: Listing | null = null;
  if (record.subjectType === "listing") listing = await Listing.findByPk(record.subjectId);
  if (record.subjectType === "flag") {
    const flag = await DeskFlag.findByPk(record.subjectId);
    if (flag?.listingId) listing = await Listing.findByPk(flag.listingId);
  }
  const title = listing ? listingTitle(listing.maker, listing.model) : "your listing";
  const publicHref = listing && (listing.status === "live" || listing.status === "sold") ? appLink(`/listings/${listing.id}`) : null;
  const words = wording(record, title, publicHref);
  if (!words) return;
  await sendNotice({ to: person.email, greeting: `Hello ${person.displayName},`, groups: [], ...words });
}
