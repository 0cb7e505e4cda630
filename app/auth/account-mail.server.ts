import type { Transaction } from "sequelize";
import { z } from "zod";
import { idSchema } from "@shared/ids";
import { enqueue, QUEUES } from "~/services/jobs.server";

// Account e-mail goes out from the worker, never from the request. A request only queues what was
// asked for; whether anything is sent, and what, is decided in account-mail-delivery.server.ts.
// That keeps an address with an account and one without equally fast to answer, and the links'
// tokens are made in the worker, so the job table never holds one.

export const AccountMailJob = z.discriminatedUnion("kind", [
  // "Forgot password" for an address, whether or not an account uses it.
  z.object({ kind: z.literal("password-reset"), email: z.string().max(254) }),
  // Sign-up: `created` says whether this request made the account or found the address taken.
  z.object({ kind: z.literal("sign-up"), email: z.string().max(254), created: z.boolean() }),
  // Repeated failed sign-ins to an account, for its owner.
  z.object({ kind: z.literal("sign-in-warning"), userId: idSchema("account") }),
]);
export type AccountMailJob = z.infer<typeof AccountMailJob>;

export function queueAccountMail(job: AccountMailJob, transaction?: Transaction): Promise<string> {
  return enqueue(QUEUES.accountMail, job, { transaction });
}
