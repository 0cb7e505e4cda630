import { User } from "~/models/user.server";
import { AccountMailJob } from "~/auth/account-mail.server";
import { mailSignUp } from "~/auth/accounts.server";
import { mailPasswordReset } from "~/auth/recovery.server";
import { recentFailures } from "~/auth/rate-limit.server";
import { sendSignInWarningEmail } from "~/auth/emails.server";

// The worker's side of account e-mail (queued by account-mail.server.ts). Whether an address has
// an account is looked at here, away from the request. A handler that throws is retried by pg-boss.
export async function deliverAccountMail(data: unknown): Promise<void> {
  const job = AccountMailJob.parse(data);
  switch (job.kind) {
    case "password-reset":
      return mailPasswordReset(job.email);
    case "sign-up":
      return mailSignUp(job.email, job.created);
    case "sign-in-warning": {
      const user = await User.findByPk(job.userId);
      if (!user || user.status !== "active") return;
      return sendSignInWarningEmail(user, await recentFailures(user.email));
    }
  }
}
