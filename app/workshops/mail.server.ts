import { z } from "zod";
import { sequelize } from "~/db.server";
import { User, Workshop, WorkshopApplication } from "~/models/index.server";
import { appLink, sendNotice } from "~/alerts/mail.server";
import { idSchema } from "@shared/ids";

// The 'workshop-mail' worker: tells the applicant what the desk decided, with the moderator's note.
// Queued with the decision, in its transaction. The application's decision_mailed_at mark is set
// only after the mail went, under the row's lock, so a retried job does not mail twice.

const WorkshopMailSchema = z.object({ applicationId: idSchema("application") });

export async function deliverWorkshopMail(data: unknown): Promise<"sent" | "already" | "gone"> {
  const { applicationId } = WorkshopMailSchema.parse(data);
  return sequelize.transaction(async (transaction) => {
    const application = await WorkshopApplication.findByPk(applicationId, { lock: transaction.LOCK.UPDATE, transaction });
    if (!application || application.status === "waiting") return "gone";
    if (application.decisionMailedAt) return "already";
    const [applicant, workshop] = await Promise.all([
      User.findByPk(application.applicantId, { transaction }),
      Workshop.findByPk(application.workshopId, { transaction }),
    ]);
    if (!applicant || !workshop) return "gone";
    const verified = application.status === "verified";
    await sendNotice({
      to: applicant.email,
      subject: verified ? `Verified: ${workshop.name} is a Loadline workshop` : `Your workshop application for ${workshop.name}`,
      greeting: `Hello ${applicant.displayName},`,
      paragraphs: verified
        ? [
            `The review desk has checked ${application.businessName} and verified it as a workshop. Your listings now carry its name as a verified workshop.`,
            `The moderator's note: ${application.decisionNote ?? ""}`,
          ]
        : [
            `The review desk could not verify ${application.businessName} as a workshop this time.`,
            `The moderator's note: ${application.decisionNote ?? ""}`,
            "You may apply again from your account with what the note asks for.",
          ],
      groups: [],
      links: [{ label: verified ? "Your listings" : "Apply again", href: appLink(verified ? "/sell" : "/account/workshop") }],
    });
    await application.update({ decisionMailedAt: new Date() }, { transaction });
    return "sent";
  });
}
