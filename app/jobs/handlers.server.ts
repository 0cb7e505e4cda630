import { QUEUES, type QueueName } from "~/services/jobs.server";
import { processPhoto } from "~/photos/process.server";
import { analyseCaptureJob } from "~/bench/capture-job.server";
import { deliverAccountMail } from "~/auth/account-mail-delivery.server";

// Every queue's handler, registered by the worker. A handler receives one job's data and throws to
// let pg-boss retry it.
export type JobHandler = (data: any, jobId: string) => Promise<unknown>;

export const handlers: Partial<Record<QueueName, JobHandler>> = {
  [QUEUES.photoProcess]: processPhoto,
  [QUEUES.captureAnalyze]: analyseCaptureJob,
  [QUEUES.accountMail]: deliverAccountMail,
};
