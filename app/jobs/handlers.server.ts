import { QUEUES, type QueueName } from "~/services/jobs.server";
import { processPhoto } from "~/photos/process.server";
import { rehashPhotos } from "~/photos/rehash.server";
import { analyseCaptureJob } from "~/bench/capture-job.server";
import { deliverAccountMail } from "~/auth/account-mail-delivery.server";
import { deliverWatchNotice } from "~/alerts/watch-notices.server";
import { matchSpecAlerts } from "~/alerts/matching.server";
import { digestJob } from "~/alerts/digest.server";
import { orderRefundJob, orderReleaseJob, paymentEventJob } from "~/payments/jobs.server";
import { orderDeadlineJob } from "~/orders/deadlines.server";
import { deliverOrderMail } from "~/orders/mail.server";
import { cleanContestPhotos } from "~/orders/contest-photos.server";
import { contestCaptureFinished } from "~/orders/contest-captures.server";
import { deliverMessageMail } from "~/messages/message-mail.server";
import { deliverOfferMail } from "~/offers/offer-mail.server";
import { expireOffer } from "~/offers/offers.server";
import { deliverWorkshopMail } from "~/workshops/mail.server";
import { deliverDeskMail } from "~/desk/mail.server";
import { cleanDraftStorage } from "~/listings/delete-draft.server";
import { listingImportJob } from "~/imports/imports.server";

// Every queue's handler, registered by the worker. A handler receives one job's data as stored (it
// parses it) and throws to let pg-boss retry it.
export type JobHandler = (data: unknown, jobId: string) => Promise<unknown>;

export const handlers: Partial<Record<QueueName, JobHandler>> = {
  [QUEUES.photoProcess]: processPhoto,
  [QUEUES.photoRehash]: rehashPhotos,
  // A contest's capture joins the buyer's figures once analysed (app/orders/contest-captures.server.ts).
  [QUEUES.captureAnalyze]: async (data) => {
    const done = await analyseCaptureJob(data);
    const captureId = (data as { captureId?: unknown } | null)?.captureId;
    if (done.status === "done" && typeof captureId === "string") await contestCaptureFinished(captureId);
    return done;
  },
  [QUEUES.accountMail]: deliverAccountMail,
  // Keeping track: watch notices, spec-alert matching on publish, the daily digest (scheduled by the worker).
  [QUEUES.watchNotice]: deliverWatchNotice,
  [QUEUES.alertMatch]: matchSpecAlerts,
  [QUEUES.alertDigest]: digestJob,
  // Buying, the provider's side (app/payments): recorded webhook events, the seller's payout, refunds.
  [QUEUES.paymentEvent]: paymentEventJob,
  [QUEUES.orderRelease]: orderReleaseJob,
  [QUEUES.orderRefund]: orderRefundJob,
  // Buying (app/orders): order deadlines (deferred, one per deadline) and order mails.
  [QUEUES.orderDeadline]: orderDeadlineJob,
  [QUEUES.orderMail]: deliverOrderMail,
  [QUEUES.contestPhoto]: cleanContestPhotos,
  // Talking before buying: one mail per burst of messages, offer mails, offer expiry at its deadline.
  [QUEUES.messageMail]: deliverMessageMail,
  [QUEUES.offerMail]: deliverOfferMail,
  [QUEUES.offerExpiry]: (data) => expireOffer(data),
  // The review desk: the workshop applicant's mail about the decision.
  [QUEUES.workshopMail]: deliverWorkshopMail,
  // The review desk: the mail about a moderator's action to the person it affects.
  [QUEUES.deskMail]: deliverDeskMail,
  // The seller's editor: a deleted draft's photos and captures removed from storage.
  [QUEUES.draftStorageClean]: cleanDraftStorage,
  // Working in bulk: a workshop's CSV import, written as drafts in one transaction.
  [QUEUES.listingImport]: (data) => listingImportJob(data),
};
