import { z } from "zod";
import { sequelize } from "~/db.server";
import { User, Workshop, WorkshopApplication } from "~/models/index.server";
import type { ApplicationStatus } from "~/models/workshop-application.server";
import type { WorkshopStatus } from "@shared/catalogue";
import { refusal } from "~/http/errors.server";
import { enqueue, QUEUES } from "~/services/jobs.server";
import { normaliseRoles } from "~/auth/roles";
import { recordAudit, type DeskSubject } from "~/desk/audit.server";
import { releaseClaim, requireClaim } from "~/desk/claims.server";
import { systemClock, type Clock } from "~/orders/clock.server";
import { countryName } from "@shared/countries";
import { freeText } from "@shared/text";
import { signDocumentLink } from "./document-link.server";

// The review desk's side of workshop applications: the queue's rows, the item page's view and the two
// decisions (verify, refuse), each with a required note, an audit record and a mail to the applicant.

/** A row of the desk's one queue (the shape app/desk/queue.server.ts's DeskItem has). */
export interface WorkshopDeskItem {
  kind: "workshop_application";
  subject: DeskSubject;
  title: string;
  summary: string;
  since: Date;
  href: string;
  takenBy: string | null;
}

export const workshopSubject = (workshopId: string): DeskSubject => ({ type: "workshop", id: workshopId });

/** Workshops waiting for the desk, oldest application first (a workshop without an application on file waits since it was made). */
export async function workshopApplicationItems(limit: number): Promise<WorkshopDeskItem[]> {
  const rows = await Workshop.findAll({
    where: { verificationStatus: "applied" },
    include: [{ model: User, as: "owner", attributes: ["displayName"] }],
    order: [["createdAt", "ASC"]],
    limit,
  });
  const waiting = await WorkshopApplication.findAll({
    where: { workshopId: rows.map((w) => w.id), status: "waiting" },
    attributes: ["workshopId", "createdAt", "registrationNumber"],
  });
  const byWorkshop = new Map(waiting.map((a) => [a.workshopId, a]));
  return rows
    .map((w): WorkshopDeskItem => {
      const application = byWorkshop.get(w.id);
      const place = [w.town, w.region, countryName(w.country)].filter(Boolean).join(", ");
      return {
        kind: "workshop_application",
        subject: workshopSubject(w.id),
        title: w.name,
        summary: `${w.owner?.displayName ?? "unknown"} · ${place}${application ? ` · registration ${application.registrationNumber}` : " · no document on file"}`,
        since: application?.createdAt ?? w.createdAt,
        href: `/desk/workshops/${w.id}`,
        takenBy: null,
      };
    })
    .sort((a, b) => a.since.getTime() - b.since.getTime());
}

export interface ApplicationView {
  id: string;
  status: ApplicationStatus;
  businessName: string;
  address: string;
  registrationNumber: string;
  document: { name: string; type: string; bytes: number; href: string; expires: string };
  sentAt: string;
  decidedAt: string | null;
  decidedBy: string | null;
  note: string | null;
}

/** A workshop and its applications (newest first) for the desk, each document behind a fresh link signed for this viewer. */
export async function workshopForDesk(workshopId: string, viewerId: string, clock: Clock = systemClock) {
  const workshop = await Workshop.findByPk(workshopId, {
    include: [{ model: User, as: "owner", attributes: ["id", "displayName", "email"] }],
  });
  if (!workshop) throw refusal("not_found", "There is no such workshop.");
  const applications = await WorkshopApplication.findAll({ where: { workshopId }, order: [["createdAt", "DESC"]] });
  const deciders = await User.findAll({
    where: { id: applications.flatMap((a) => (a.decidedBy ? [a.decidedBy] : [])) },
    attributes: ["id", "displayName"],
  });
  const name = new Map(deciders.map((u) => [u.id, u.displayName]));
  const status: WorkshopStatus = workshop.verificationStatus;
  return {
    workshop: {
      id: workshop.id,
      name: workshop.name,
      slug: workshop.slug,
      status,
      place: [workshop.town, workshop.region, countryName(workshop.country)].filter(Boolean).join(", "),
      owner: workshop.owner ? { id: workshop.owner.id, name: workshop.owner.displayName, email: workshop.owner.email } : null,
      createdAt: workshop.createdAt.toISOString(),
    },
    applications: applications.map((a): ApplicationView => {
      const link = signDocumentLink(a.id, viewerId, clock);
      return {
        id: a.id,
        status: a.status,
        businessName: a.businessName,
        address: a.address,
        registrationNumber: a.registrationNumber,
        document: {
          name: a.documentName,
          type: a.documentType,
          bytes: a.documentBytes,
          href: link.href,
          expires: link.expires.toISOString(),
        },
        sentAt: a.createdAt.toISOString(),
        decidedAt: a.decidedAt?.toISOString() ?? null,
        decidedBy: a.decidedBy ? (name.get(a.decidedBy) ?? "a moderator") : null,
        note: a.decisionNote,
      };
    }),
  };
}

export const DECISION_NOTE_MAX = 2000;

export const DecisionForm = z.object({
  decision: z.enum(["verify", "refuse"], { message: "Choose verify or refuse." }),
  note: freeText("The note")
    .transform((s) => s.trim())
    .pipe(
      z
        .string()
        .min(5, { message: "Write a note for the trail and the applicant (at least 5 characters)." })
        .max(DECISION_NOTE_MAX, { message: `At most ${DECISION_NOTE_MAX} characters.` }),
    ),
});
export type Decision = z.infer<typeof DecisionForm>;

/**
 * Verifies or refuses the workshop's waiting application: under the moderator's claim and the
 * workshop's row lock, the application and the workshop change together (verifying also grants the
 * applicant the workshop role), the audit record and the applicant's mail are written in the same
 * transaction, and the claim is let go.
 */
export async function decideApplication(workshopId: string, moderatorId: string, input: Decision, clock: Clock = systemClock) {
  return sequelize.transaction(async (transaction) => {
    const subject = workshopSubject(workshopId);
    await requireClaim(subject, moderatorId, transaction, clock);
    const workshop = await Workshop.findByPk(workshopId, { lock: transaction.LOCK.UPDATE, transaction });
    if (!workshop) throw refusal("not_found", "There is no such workshop.");
    const application = await WorkshopApplication.findOne({ where: { workshopId, status: "waiting" }, transaction });
    if (!application || workshop.verificationStatus !== "applied")
      throw refusal("conflict", "This workshop has no application waiting: it was decided meanwhile.");
    const now = clock.now();
    const verified = input.decision === "verify";
    const before = { workshop: workshop.verificationStatus, application: application.status };
    await application.update(
      { status: verified ? "verified" : "refused", decidedAt: now, decidedBy: moderatorId, decisionNote: input.note },
      { transaction },
    );
    await workshop.update({ verificationStatus: verified ? "verified" : "rejected", verifiedAt: verified ? now : null }, { transaction });
    if (verified) {
      const applicant = await User.findByPk(application.applicantId, { lock: transaction.LOCK.UPDATE, transaction });
      if (applicant) await applicant.update({ roles: normaliseRoles([...applicant.roles, "workshop"]) }, { transaction });
    }
    await recordAudit(
      {
        actorId: moderatorId,
        action: verified ? "verify_workshop" : "refuse_workshop",
        subject,
        note: input.note,
        before,
        after: { workshop: workshop.verificationStatus, application: application.status, applicationId: application.id },
      },
      transaction,
    );
    await enqueue(QUEUES.workshopMail, { applicationId: application.id }, { transaction });
    await releaseClaim(subject, transaction);
    return application;
  });
}
